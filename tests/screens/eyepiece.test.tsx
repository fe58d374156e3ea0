import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { render } from 'ink-testing-library';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { CountScreen } from '../../src/screens/count-screen.js';
import { CountingSession } from '../../src/session/counting-session.js';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { TINY_KEYMAP, grain, newLevelFile, openPayload, timedSessionText } from '../helpers/levels.js';
import { runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';
import { bells, countScreen, until } from '../helpers/count-screen.js';
import { driveScreen } from '../helpers/ink-screen.js';

function screen({ columns = 80, rows = 24, bell = false, path = null as string | null, breakMinutes = null as number | null } = {}) {
  const level = path ? { path, ...resumeLevel(path) } : newLevelFile(tempDir(), 'level.jsonl', TINY_KEYMAP);
  return countScreen(level, { columns, rows, bell, breakMinutes });
}

const events = (path: string) => scanLog(readFileSync(path)).events;

describe('notes', () => {
  it('Enter opens a note on the last grain; while it is open taxon keys type text and count nothing', async () => {
    const s = await screen();
    s.type('ab');
    s.type('\r');
    await s.shows(/Note on #4 Betula \(Enter saves, Esc cancels, "@x,y" = stage position\): █/);
    s.type('abc cf. Betula nana @12.4,88.1');
    expect(s.session.getSnapshot().state.counts).toEqual({ Alnus: 1, Betula: 1 });
    await until(() => expect(s.frame().replace(/\s+/g, ' ')).toMatch(/abc cf\. Betula nana @12\.4,88\.1█/));
    s.type('\r');
    await s.shows(/note recorded on #4 Betula/);
    expect(events(s.path).at(-1)).toMatchObject({ type: 'note', grain: 4, text: 'abc cf. Betula nana', stage: { x: 12.4, y: 88.1 } });
    // Counting goes on after the note.
    s.type('a');
    expect(s.session.getSnapshot().state.counts).toEqual({ Alnus: 2, Betula: 1 });
    s.session.shutdown();
  });

  it('Escape cancels a note and records nothing', async () => {
    const s = await screen();
    s.type('a\rnot this one');
    // A lone Escape reaches the screen once Ink is sure no sequence follows it.
    s.type('\x1b');
    await s.shows(/note cancelled: nothing recorded/);
    expect(events(s.path).some((e) => e.type === 'note')).toBe(false);
    s.session.shutdown();
  });

  it('notes show in the rare-types panel, survive resume, and export as CSV', async () => {
    const s = await screen({ columns: 140, rows: 45 });
    s.type('aaaaccccb\r@3.5,70 grain folded\r');
    expect(await s.shows(/1 Betula\s*\n.*  t1 @3\.5,70 grain folded/)).toMatch(/Rare types \(≤2\)/);
    s.session.shutdown();
    const again = await screen({ columns: 140, rows: 45, path: s.path });
    await again.shows(/  t1 @3\.5,70 grain folded/);
    again.session.shutdown();
    const rows = parse((await runExine(['export', s.path, '--format', 'notes'])).stdout, { columns: true }) as Record<string, string>[];
    expect(rows).toEqual([expect.objectContaining({ taxon: 'Betula', traverse: '1', stage_x: '3.5', stage_y: '70', text: 'grain folded', level: 'T-1' })]);
  });
});

describe('a type that is not in the keymap', () => {
  it('= asks for name and group, gives it the next free key, records it and counts the grain', async () => {
    const s = await screen();
    s.type('=');
    await s.shows(/New type as "name, group" \(Enter counts one grain, Esc cancels\): █/);
    s.type('Ilex aquifolium, shrubs\r');
    expect(await s.shows(/new type Ilex aquifolium \(shrubs\) on key A: one grain counted/)).toMatch(/A\s+Ilex aquifolium\s+shrub\s+1/);
    s.type('AA');
    expect(s.session.getSnapshot().state.counts).toEqual({ 'Ilex aquifolium': 3 });
    s.session.shutdown();
    const state = readLevel(s.path).state;
    expect(state.keymap.keys.A).toEqual({ taxon: 'Ilex aquifolium', group: 'shrubs' });
    expect(state.addedTypes).toEqual(['Ilex aquifolium']);
    // Resume knows its key, and export its group.
    const again = await screen({ path: s.path });
    again.type('A');
    expect(again.session.getSnapshot().state.counts).toEqual({ 'Ilex aquifolium': 4 });
    again.session.shutdown();
    const rows = parse((await runExine(['export', s.path])).stdout, { columns: true }) as Record<string, string>[];
    expect(rows.find((r) => r.taxon === 'Ilex aquifolium')).toMatchObject({ group: 'shrubs', count: '4', in_sum: 'yes' });
  });

  it('without a group it asks again and counts nothing', async () => {
    const s = await screen();
    s.type('=Ilex\r');
    await until(() => expect(s.frame().replace(/\s+/g, ' ')).toMatch(/add its group after a comma: trees, shrubs, herbs/));
    expect(s.session.getSnapshot().state.grains).toBe(0);
    s.type(', h\r');
    expect(s.session.getSnapshot().state.counts).toEqual({ Ilex: 1 });
    s.session.shutdown();
  });
});

describe('help', () => {
  it('? shows the keymap and the actions; the next key closes it and counts nothing', async () => {
    const s = await screen();
    s.type('?');
    const help = await s.shows(/Help: tiny · any key closes this and counts nothing/);
    expect(help).toMatch(/a Alnus/);
    expect(help).toMatch(/Enter note on the last grain/);
    s.type('a');
    expect(s.session.getSnapshot().state.grains).toBe(0);
    expect(await s.shows(/help closed: that key counted nothing/)).not.toMatch(/Help: tiny/);
    s.session.shutdown();
  });
});

describe('sound and breaks', () => {

  it('a bell when a new type is counted (once per burst) with the bell on, none with it off', async () => {
    // Each bell is waited for; the bursts that ring none are shown so by the count when the next one rings
    // (a burst's effects run before the next burst is drawn).
    const on = await screen({ bell: true });
    const rung = async (n: number) => {
      await until(() => expect(bells(on.frames)).toBeGreaterThanOrEqual(n));
      expect(bells(on.frames)).toBe(n);
    };
    on.type('aab');
    await rung(1);
    on.type('ab');
    on.type('c');
    await rung(2);
    // The first marker grain is no new type.
    on.type('l');
    on.type('s');
    await rung(3);
    on.session.shutdown();
    const off = await screen({ bell: false });
    off.type('aab');
    await off.shows(/Pollen sum 3/);
    off.type('c');
    await off.shows(/Pollen sum 4/);
    expect(bells(off.frames)).toBe(0);
    off.session.shutdown();
  });

  it('the new type is marked in the recent events', async () => {
    const s = await screen();
    s.type('aab');
    const frame = await s.shows(/#5★Betula \(t1\) new/);
    expect(frame).toMatch(/#3★Alnus \(t1\) new/);
    expect(frame).toMatch(/#4 Alnus \(t1\)/);
    s.session.shutdown();
  });

  it('after the break time the screen suggests resting the eyes, and rings once when the time comes', async () => {
    const made = newLevelFile(tempDir(), 'l.jsonl', TINY_KEYMAP);
    made.writer.close();
    // A sitting whose clock started 70 minutes ago.
    const opened = resumeLevel(made.path, { clock: () => new Date(Date.now() - 70 * 60_000) });
    const session = new CountingSession(opened.writer, opened.state);
    const quiet = await driveScreen(render(<CountScreen session={session} columns={100} rows={30} bell breakMinutes={50} />));
    await quiet.shows(/sitting 2 since \d\d:\d\d \S+ · 01:10:0\d · time to rest your eyes \(50 min\)/);
    // Already due when the screen opened: no bell for that, nor for the new type after it (a later frame: its effects ran).
    quiet.type('a');
    await quiet.shows(/Pollen sum 1/);
    expect(bells(quiet.frames)).toBe(1);
    quiet.unmount();
    const off = await driveScreen(render(<CountScreen session={session} columns={100} rows={30} breakMinutes={null} />));
    expect(await off.shows(/sitting 2/)).not.toMatch(/rest your eyes/);
    off.unmount();
    session.shutdown();
  });
});

describe('layouts', () => {
  const demo = () => {
    const path = join(tempDir(), 'km1-084cm.jsonl');
    writeFileSync(path, readFileSync(new URL('../../demo-sessions/km1-084cm.jsonl', import.meta.url)));
    return path;
  };

  it('80x24: the essentials and a compact curve, nothing wider or taller than the terminal', async () => {
    const s = await screen({ path: demo() });
    const lines = s.frame().split('\n');
    expect(lines.length).toBeLessThan(24);
    for (const line of lines) expect([...line].length).toBeLessThanOrEqual(80);
    for (const part of [/traverse 6/, /Pollen sum 236/, /Types found: 15/, /│[⠀-⣿]/, /Last recorded/, /Stop if all/]) expect(s.frame()).toMatch(part);
    expect(s.frame()).not.toMatch(/Rare types/);
    s.session.shutdown();
  });

  it('140x45: every panel, the curve with its legend, rare types with their notes', async () => {
    const s = await screen({ path: demo(), columns: 140, rows: 45 });
    const lines = s.frame().split('\n');
    expect(lines.length).toBeLessThan(45);
    for (const line of lines) expect([...line].length).toBeLessThanOrEqual(140);
    for (const part of [/Rare types \(≤2\)/, /1 Ilex aquifolium\s*\n.*  t4 @21\.7,93\.2 not in the key/, /⣀ types found · E\(Sₙ\) rarefied/, /Stop if all · sum≥300/, /Last recorded/, /Indeterminable\s+3  1% \*/]) {
      expect(s.frame()).toMatch(part);
    }
    s.session.shutdown();
  });

  it('NO_COLOR still shows every panel in words', async () => {
    const before = process.env.NO_COLOR;
    process.env.NO_COLOR = '1';
    try {
      const s = await screen({ path: demo(), columns: 140, rows: 45 });
      expect(s.frame()).not.toMatch(/\x1b\[3\dm/);
      expect(s.frame()).toMatch(/Rare types/);
      s.session.shutdown();
    } finally {
      if (before === undefined) delete process.env.NO_COLOR;
      else process.env.NO_COLOR = before;
    }
  });
});
