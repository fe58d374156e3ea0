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

const snapshotOf = (state: LevelState, over: Partial<Snapshot> = {}): Snapshot => ({ state, message: null, notice: null, readOnly: null, closed: false, mode: null, ...over });

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
