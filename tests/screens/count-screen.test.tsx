import { appendFileSync, copyFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { countScreen, until } from '../helpers/count-screen.js';
import { TINY_KEYMAP, lowland, newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

// Bells are written beside the frames; these tests read frames, the bell tests ring them.
async function screenFor(path?: string, size: { columns: number | null; rows: number | null } = { columns: 80, rows: 24 }, keymap = TINY_KEYMAP) {
  const level = path ? { path, ...resumeLevel(path) } : newLevelFile(tempDir(), 'level.jsonl', keymap);
  return countScreen(level, { ...size, bell: false });
}

const row = (frame: string, taxon: string) => frame.split('\n').find((l) => l.includes(taxon)) ?? '';

describe('the counting screen', () => {
  it('counts every key of a burst: "aaab" is four grains', async () => {
    const s = await screenFor();
    s.type('aaab');
    expect(s.session.getSnapshot().state.counts).toEqual({ Alnus: 3, Betula: 1 });
    const frame = await s.shows(/Pollen sum 4 \/ 500/);
    expect(row(frame, 'Alnus')).toMatch(/a\s+Alnus\s+tree\s+3\s+75\.0\s+30\.1–95\.4/);
    expect(row(frame, 'Betula')).toMatch(/◀/);
    expect(row(frame, 'Alnus')).not.toMatch(/◀/);
    s.session.shutdown();
    expect(readLevel(s.path).state.counts).toEqual({ Alnus: 3, Betula: 1 });
  });

  it('reads control keys inside a burst in order: a, b, undo, next traverse', async () => {
    const s = await screenFor();
    s.type('ab\x7f\t');
    const state = s.session.getSnapshot().state;
    expect(state.counts).toEqual({ Alnus: 1 });
    expect(state.traverse).toBe(2);
    expect(await s.shows(/traverse 2/)).toMatch(/undo of #4/);
    s.session.shutdown();
  });

  it('undo on its own key and traverse on its own key work too', async () => {
    const s = await screenFor();
    for (const key of ['c', 'c', '\x7f', '\t', 'o']) s.type(key);
    const state = s.session.getSnapshot().state;
    expect(state.counts).toEqual({ Corylus: 1, Poaceae: 1 });
    expect(state.stack).toMatchObject({ taxon: 'Poaceae', traverse: 2 });
    s.session.shutdown();
  });

  it('says so when a key is not mapped, or there is nothing to undo, and counts nothing', async () => {
    const s = await screenFor();
    s.type('\x7f');
    await s.shows(/nothing to undo/);
    s.type('Z');
    await s.shows(/key "Z" is not in the keymap: nothing counted/);
    expect(s.session.getSnapshot().state.grains).toBe(0);
    s.session.shutdown();
  });

  it('puts groups outside the pollen sum apart: spores are percent of sum + spores', async () => {
    const s = await screenFor();
    s.type('aaas');
    const frame = await s.shows(/Pollen sum 3 \/ 500/);
    expect(row(frame, 'Sphagnum')).toMatch(/s\s+Sphagnum\s+spore\s+1\s+25\.0.*\*/);
    s.session.shutdown();
  });

  it('Ctrl-C in a burst stops there, writes a close event and releases the file', async () => {
    const s = await screenFor();
    s.type('ab\x03aaaa');
    expect(s.session.getSnapshot().closed).toBe(true);
    const state = readLevel(s.path).state;
    expect(state.counts).toEqual({ Alnus: 1, Betula: 1 });
    expect(state.closed).toBe(true);
  });

  it('resume shows the same totals, traverse and recent events', async () => {
    const first = await screenFor();
    first.type('aabco\too');
    const before = await first.shows(/Pollen sum 7 \/ 500/);
    first.session.shutdown();
    first.unmount();
    const again = await screenFor(first.path);
    const after = await again.shows(/sitting 2/);
    // The ◀ marks the grain recorded last; after a resume the last event is the new sitting.
    const unmarked = (line: string) => line.replace('◀', ' ');
    for (const taxon of ['Alnus', 'Betula', 'Corylus', 'Poaceae']) expect(row(after, taxon)).toBe(unmarked(row(before, taxon)));
    expect(after).toMatch(/traverse 2/);
    expect(after).toMatch(/Pollen sum 7 \/ 500/);
    again.session.shutdown();
  });

  it('at 80x24 a busy level still shows every panel: demo level with six groups', async () => {
    const dir = tempDir();
    const path = join(dir, 'demo.jsonl');
    copyFileSync(join(import.meta.dirname, '../../demo-sessions/km1-084cm.jsonl'), path);
    const s = await screenFor(path);
    const frame = await s.shows(/Kestrel Mere KM-1 · level KM1-84 · depth 84/);
    for (const part of [/traverse 6 · sitting 2/, /Key Taxon/, /Pollen sum 236\n/, /Marks  17\*Indet   3\*/, /Stop if all · sum≥300/, /half-width ≤ 4 points\n/, /  ≥10% now 5\.7\s+\+244/, /cover \.983\/\.98\s+met/, /markers 17\/40\s+\+320/, /conc 174k\/cm³ ±25%/, /Types found: 15/, /16 since new/, /A   Ilex aquifolium    shrub      1/, /Last recorded/, /#289 sitting 2 started/, /Bksp undo · Tab trav · Enter note · = new · ' cf · \? help · \^F fin · \^C quit/]) {
      expect(frame).toMatch(part);
    }
    expect(frame.split('\n').length).toBeLessThan(24);
    s.session.shutdown();
  });

  it('Ctrl-F asks before finishing: another key cancels and counts nothing; y finishes and quits', async () => {
    const s = await screenFor();
    s.type('aa\x06');
    await s.shows(/Finish this level\? y = finish and quit/);
    s.type('b');
    await s.shows(/not finished: counting goes on/);
    expect(s.session.getSnapshot().state.counts).toEqual({ Alnus: 2 });
    s.type('\x06y');
    expect(s.session.getSnapshot().closed).toBe(true);
    const state = readLevel(s.path).state;
    expect(state.finishedAt).not.toBeNull();
    expect(state.recent.at(-1)?.type).toBe('finish');
    const again = resumeLevel(s.path);
    again.writer.close();
    expect(again.notices.join()).toMatch(/this level is finished \d{4}-\d\d-\d\d: open read-only/);
  });

  it('keeps what opening found (a repaired tail) on screen while counting goes on', async () => {
    const first = await screenFor();
    first.type('aab');
    first.session.shutdown();
    first.unmount();
    appendFileSync(first.path, '{"seq":9,"at":"2026-1');
    const s = await screenFor(first.path);
    s.type('aa');
    const frame = await s.shows(/Pollen sum 5 \/ 500/);
    expect(frame).toMatch(/On opening: line 7 is incomplete[\s\S]*21\s+bytes cut off and\s+kept in\s+level\.jsonl\.cut-[\s\S]*\.bak/);
    expect(s.session.getSnapshot().state.counts).toEqual({ Alnus: 4, Betula: 1 });
    expect(frame.split('\n').length).toBeLessThan(24);
    s.session.shutdown();
  });

  it('re-lays out when the terminal is resized', async () => {
    const s = await screenFor(undefined, { columns: null, rows: null }, lowland());
    const stdout = s.stdout as unknown as NodeJS.EventEmitter;
    const size = { columns: 80, rows: 12 };
    Object.defineProperty(stdout, 'columns', { get: () => size.columns });
    Object.defineProperty(stdout, 'rows', { get: () => size.rows });
    stdout.emit('resize');
    await until(() => {
      // The screen's smallest height, 12 lines, where 24 rows drew 23.
      expect(s.frame().split('\n').length).toBeLessThanOrEqual(12);
      expect(s.frame()).toMatch(/taxa hidden/);
    });
    size.rows = 40;
    stdout.emit('resize');
    await until(() => {
      expect(s.frame()).not.toMatch(/taxa hidden/);
      expect(s.frame()).toMatch(/Lycopodium/);
    });
    // A terminal that reports 0 x 0 (some pseudo-terminals do) is drawn at 80 x 24.
    size.columns = 0;
    size.rows = 0;
    stdout.emit('resize');
    await until(() => {
      const lines = s.frame().split('\n');
      expect(lines.length).toBeLessThan(24);
      expect(lines[0]).toMatch(/^Test Mere TM-1 · level T-1/);
    });
    s.session.shutdown();
  });

  it('fits 80x24: no line wider than 80 and fewer than 24 lines', async () => {
    const s = await screenFor();
    s.type('abcosl');
    const lines = (await s.shows(/Pollen sum 4 \/ 500/)).split('\n');
    expect(lines.length).toBeLessThan(24);
    for (const line of lines) expect([...line].length).toBeLessThanOrEqual(80);
    s.session.shutdown();
  });
});
