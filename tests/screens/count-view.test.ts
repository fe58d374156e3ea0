import { copyFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { LevelState } from '../../src/model/level-state.js';
import { levelReport } from '../../src/rules/level-report.js';
import { NO_RULES } from '../../src/rules/rule-set.js';
import { countScreenView, type CountScreenView, type CountViewInput } from '../../src/screens/count-view.js';
import { textOf, type Line } from '../../src/screens/styled-line.js';
import type { Snapshot } from '../../src/session/counting-session.js';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { TINY_KEYMAP, grain, openPayload, sessionText } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

const snapshotOf = (state: LevelState, over: Partial<Snapshot> = {}): Snapshot => ({ state, message: null, notice: null, readOnly: null, closed: false, mode: null, misses: 0, ...over });

function viewOf(state: LevelState, over: Partial<CountViewInput> = {}, snap: Partial<Snapshot> = {}): CountScreenView {
  return countScreenView({ snapshot: snapshotOf(state, snap), columns: 80, rows: 24, now: Date.parse(state.sittingStartedAt), rareThreshold: 2, breakMinutes: null, ...over });
}

/** Every line of the view, top to bottom; the side columns after the table. */
function linesOf(v: CountScreenView): Line[] {
  const main = v.main.kind === 'help' ? v.main.panel.lines : [...v.main.table.lines, ...v.main.columns.flatMap((c) => c.panels.flatMap((p) => p.lines))];
  return [...v.heading, ...(v.banner ? [v.banner] : []), ...main, v.status.line, v.keys];
}
const textsOf = (v: CountScreenView) => linesOf(v).map(textOf);
const mainHeight = (v: CountScreenView) => (v.main.kind === 'panels' ? v.main.height : v.main.panel.height);

function levelFile(text: string): string {
  const path = join(tempDir(), 'level.jsonl');
  writeFileSync(path, text);
  return path;
}

function resumed(path: string): LevelState {
  const opened = resumeLevel(path);
  opened.writer.close();
  return opened.state;
}

describe('the stop banner comes from what the file records', () => {
  it('a format-1 file at its target (no verdict recorded then): no banner until resuming records rules-met', () => {
    const open = { ...openPayload(TINY_KEYMAP), format: 1, rules: { targetSum: 5 } } as Record<string, unknown>;
    delete open.spike;
    const path = levelFile(sessionText([open as never, { type: 'sitting', sitting: 1 }, ...'aaabbb'.split('').map((k) => grain(k === 'a' ? 'Alnus' : 'Betula', 1, k)), { type: 'close' }]));
    const read = readLevel(path).state;
    // The numbers meet the rule set; the file does not say so.
    expect(levelReport(read).rules.met).toBe(true);
    expect(read.rulesMet).toBe(false);
    const before = viewOf(read);
    expect(before.banner).toBeNull();
    expect(textsOf(before).join('\n')).not.toMatch(/STOP RULES MET/);
    expect(mainHeight(before)).toBe(23 - 3 - before.status.height);

    // Resuming judges the rules and records the verdict; now the banner stands, at the sum recorded.
    const after = viewOf(resumed(path));
    expect(after.banner && textOf(after.banner)).toBe('STOP RULES MET at pollen sum 6 · you may stop: Ctrl-F finishes, or count on'.padEnd(80));
    expect(after.banner?.spans[0]).toMatchObject({ bold: true, inverse: true });
    expect(mainHeight(after)).toBe(mainHeight(before) - 1);
    expect(after.rings.stop).toBe(readLevel(path).state.lastRulesMet?.seq);
    expect(after.rings.stop).toBeGreaterThan(0);
  });

  it('a file that recorded rules-met under an older evaluation (coverage before its floor of 100, issue 13) keeps its banner until the file says otherwise', () => {
    const rules = { ...NO_RULES, coverage: 0.9, mode: 'any' as const };
    const path = levelFile(
      sessionText([
        openPayload(TINY_KEYMAP, { rules }),
        { type: 'sitting', sitting: 1 },
        grain('Alnus', 1, 'a'),
        { type: 'rules-met', sum: 1, grains: 1, met: ['coverage'] },
        grain('Alnus', 1, 'a'),
        grain('Alnus', 1, 'a'),
        { type: 'close' },
      ]),
    );
    const read = readLevel(path).state;
    // Today's evaluation does not judge coverage below a sum of 100; the file says met.
    expect(levelReport(read).rules.met).toBe(false);
    expect(read.rulesMet).toBe(true);
    const before = viewOf(read);
    expect(before.banner && textOf(before.banner)).toMatch(/^STOP RULES MET at pollen sum 1 · /);
    expect(mainHeight(before)).toBe(23 - 4 - before.status.height);
    expect(before.rings.stop).toBe(4);

    // Resuming records rules-unmet; the banner goes and its line returns to the panels.
    const after = viewOf(resumed(path));
    expect(after.banner).toBeNull();
    expect(mainHeight(after)).toBe(mainHeight(before) + 1);
  });
});

/** Lines a side column takes: its panels and the gaps between them. */
const columnHeight = (panels: readonly { lines: readonly unknown[] }[], gap: number) => panels.reduce((n, p) => n + p.lines.length, 0) + gap * (panels.length - 1);

function demoState(): LevelState {
  const path = join(tempDir(), 'km1-084cm.jsonl');
  copyFileSync(new URL('../../demo-sessions/km1-084cm.jsonl', import.meta.url), path);
  return readLevel(path).state;
}

/** A tiny level: Alnus, Alnus, a marker, Betula in traverse 1. */
function tinyState(): LevelState {
  const path = levelFile(sessionText([openPayload(TINY_KEYMAP), { type: 'sitting', sitting: 1 }, grain('Alnus', 1, 'a'), grain('Alnus', 1, 'a'), grain('Lycopodium', 1, 'l'), grain('Betula', 1, 'b')]));
  return readLevel(path).state;
}

describe('the counting screen view', () => {
  it('at 80x24 the demo level gets one side column of sum, rules, curve and recent events, each within the panels’ height', () => {
    const v = viewOf(demoState());
    expect(v.height).toBe(23);
    expect(textOf(v.heading[0]!)).toBe('Kestrel Mere KM-1 · level KM1-84 · depth 84 · slide KM1-084-A');
    if (v.main.kind !== 'panels') throw new Error('expected the panels');
    expect(v.main.columns).toHaveLength(1);
    const [column] = v.main.columns;
    expect(column!.panels.map((p) => textOf(p.lines[0]!))).toEqual([
      'Pollen sum 236',
      expect.stringMatching(/^Stop if all · sum≥300 *$/),
      expect.stringMatching(/^Types found: 15 *$/),
      'Last recorded',
    ]);
    expect(columnHeight(column!.panels, v.main.gap)).toBeLessThanOrEqual(v.main.height);
    expect(v.main.table.lines.length).toBeLessThanOrEqual(v.main.height);
    expect(textOf(v.main.table.lines.at(-1)!)).toMatch(/^… \d+ taxa hidden, \d+ counted/);
    expect(v.heading.length + v.main.height + v.status.height + 1).toBe(v.height);
    expect(textOf(v.keys)).toBe("Bksp undo · Tab trav · Enter note · = new · ' cf · ? help · ^F fin · ^C quit");
  });

  it('at 140x45 a second column holds the rare types and recent events, with blank lines between panels', () => {
    const v = viewOf(demoState(), { columns: 140, rows: 45 });
    if (v.main.kind !== 'panels') throw new Error('expected the panels');
    expect(v.main.gap).toBe(1);
    expect(v.main.columns.map((c) => c.panels.map((p) => textOf(p.lines[0]!).trim()))).toEqual([
      ['Pollen sum 236', 'Stop if all · sum≥300', 'Types found: 15'],
      ['Rare types (≤2)', 'Last recorded'],
    ]);
    expect(v.main.columns[1]?.marginLeft).toBe(2);
    for (const c of v.main.columns) expect(columnHeight(c.panels, v.main.gap)).toBeLessThanOrEqual(v.main.height);
    // A tall terminal shows every taxon.
    expect(v.main.table.lines.map(textOf).join('\n')).not.toMatch(/taxa hidden/);
    expect(textOf(v.keys)).toMatch(/^Backspace undo · Tab traverse · /);
  });

  it('takes the sitting’s length from the time given, and reminds of a break from the first span on', () => {
    const state = demoState();
    const start = Date.parse(state.sittingStartedAt);
    const early = viewOf(state, { now: start + 19 * 60_000, breakMinutes: 20 });
    expect(textOf(early.heading[1]!)).toBe('traverse 6 · sitting 1 since 13:10 UTC · 00:19:00');
    expect(early.rings.breaks).toBe(0);
    const late = viewOf(state, { now: start + 25 * 60_000, breakMinutes: 20 });
    expect(textOf(late.heading[1]!)).toBe('traverse 6 · sitting 1 since 13:10 UTC · 00:25:00 · time to rest your eyes (20 min)');
    expect(late.heading[1]?.spans.at(-1)).toMatchObject({ bold: true, tone: 'warning' });
    expect(late.rings.breaks).toBe(1);
    expect(viewOf(state, { now: start + 45 * 60_000, breakMinutes: 20 }).rings.breaks).toBe(2);
    expect(viewOf(state, { now: start + 45 * 60_000 }).rings.breaks).toBe(0);
  });

  it('marks the grain recorded last in the table, greys the uncounted, and counts markers as no new type', () => {
    const v = viewOf(tinyState());
    if (v.main.kind !== 'panels') throw new Error('expected the panels');
    const table = v.main.table.lines;
    const row = (taxon: string) => table.find((l) => textOf(l).includes(taxon)) as Line;
    expect(textOf(row('Betula'))).toMatch(/^b {3}Betula .*◀$/);
    expect(row('Betula').spans[0]).toMatchObject({ bold: true });
    expect(textOf(row('Alnus'))).not.toMatch(/◀/);
    expect(row('Alnus').spans[0]).toMatchObject({ bold: false, tone: undefined });
    expect(row('Corylus').spans[0]?.tone).toBe('zero');
    expect(v.rings).toEqual({ stop: 0, types: 2, breaks: 0, misses: 0 });
  });

  it('the status says, in order of weight: read-only, a line being typed, the last message, what opening found', () => {
    const state = tinyState();
    const status = (snap: Partial<Snapshot>) => viewOf(state, {}, snap).status;
    expect(status({}).line.spans[0]).toMatchObject({ text: ' ', tone: 'warning' });
    expect(textOf(status({ notice: 'took over a stale lock' }).line)).toBe('On opening: took over a stale lock');
    expect(status({ message: { text: 'not recorded: disk full', tone: 'error' } }).line.spans[0]).toMatchObject({ text: 'not recorded: disk full', tone: 'error' });
    const typing = status({ mode: { kind: 'note', grain: 6, taxon: 'Betula', text: 'cf.' }, message: { text: 'note cancelled', tone: 'info' } });
    expect(textOf(typing.line)).toBe('note cancelled · Note on #6 Betula (Enter saves, Esc cancels, "@x,y" = stage position): cf.█');
    expect(typing.line.spans[0]).toMatchObject({ bold: true, tone: undefined });
    expect(typing.height).toBe(2);
    const readOnly = status({ readOnly: 'syncing l.jsonl to disk failed (EIO)', mode: { kind: 'new-type', text: 'Vio' } });
    expect(readOnly.line.spans[0]).toMatchObject({ text: 'READ-ONLY: syncing l.jsonl to disk failed (EIO)', tone: 'error', bold: true });
    // A long status takes up to four lines, from the panels.
    const long = viewOf(state, {}, { message: { text: 'x'.repeat(400), tone: 'info' } });
    expect(long.status.height).toBe(4);
    expect(mainHeight(long)).toBe(mainHeight(viewOf(state)) - 3);
  });

  it('the help takes the panels’ place, its title inverse', () => {
    const v = viewOf(tinyState(), {}, { mode: { kind: 'help' } });
    if (v.main.kind !== 'help') throw new Error('expected the help');
    expect(v.main.panel.height).toBe(23 - 3 - 1);
    expect(textOf(v.main.panel.lines[0]!)).toMatch(/^Help: tiny · any key closes this and counts nothing/);
    expect(v.main.panel.lines[0]?.spans[0]).toMatchObject({ bold: true, inverse: true });
    expect(v.main.panel.lines.length).toBeLessThanOrEqual(v.main.panel.height);
  });
});
