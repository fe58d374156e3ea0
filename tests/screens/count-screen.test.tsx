import { appendFileSync, copyFileSync } from 'node:fs';
import { join } from 'node:path';
import { render } from 'ink-testing-library';
import { describe, expect, it } from 'vitest';
import { CountScreen } from '../../src/screens/count-screen.js';
import { CountingSession } from '../../src/session/counting-session.js';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { TINY_KEYMAP, lowland, newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

const tick = () => new Promise((r) => setTimeout(r, 30));

async function screenFor(path?: string, size: { columns: number; rows: number } | null = { columns: 80, rows: 24 }, keymap = TINY_KEYMAP) {
  const level = path ? { path, ...resumeLevel(path) } : newLevelFile(tempDir(), 'level.jsonl', keymap);
  const session = new CountingSession(level.writer, level.state, level.notices);
  // Bells are written beside the frames; these tests read frames, the bell tests ring them.
  const ui = render(<CountScreen session={session} {...(size ?? {})} bell={false} />);
  await tick();
  const type = async (keys: string) => {
    ui.stdin.write(keys);
    await tick();
  };
  return { ...ui, session, path: level.path, type };
}

const row = (frame: string, taxon: string) => frame.split('\n').find((l) => l.includes(taxon)) ?? '';

describe('the counting screen', () => {
  it('counts every key of a burst: "aaab" is four grains', async () => {
    const s = await screenFor();
    await s.type('aaab');
    expect(s.session.getSnapshot().state.counts).toEqual({ Alnus: 3, Betula: 1 });
    expect(row(s.lastFrame() ?? '', 'Alnus')).toMatch(/a\s+Alnus\s+tree\s+3\s+75\.0\s+30\.1–95\.4/);
    expect(s.lastFrame()).toMatch(/Pollen sum 4 \/ 500/);
    expect(row(s.lastFrame() ?? '', 'Betula')).toMatch(/◀/);
    expect(row(s.lastFrame() ?? '', 'Alnus')).not.toMatch(/◀/);
    s.session.shutdown();
    expect(readLevel(s.path).state.counts).toEqual({ Alnus: 3, Betula: 1 });
  });

  it('reads control keys inside a burst in order: a, b, undo, next traverse', async () => {
    const s = await screenFor();
    await s.type('ab\x7f\t');
    const state = s.session.getSnapshot().state;
    expect(state.counts).toEqual({ Alnus: 1 });
    expect(state.traverse).toBe(2);
    expect(s.lastFrame()).toMatch(/traverse 2/);
    expect(s.lastFrame()).toMatch(/undo of #4/);
    s.session.shutdown();
  });

  it('undo on its own key and traverse on its own key work too', async () => {
    const s = await screenFor();
    await s.type('c');
    await s.type('c');
    await s.type('\x7f');
    await s.type('\t');
    await s.type('o');
    const state = s.session.getSnapshot().state;
    expect(state.counts).toEqual({ Corylus: 1, Poaceae: 1 });
    expect(state.stack).toMatchObject({ taxon: 'Poaceae', traverse: 2 });
    s.session.shutdown();
  });

  it('says so when a key is not mapped, or there is nothing to undo, and counts nothing', async () => {
    const s = await screenFor();
    await s.type('\x7f');
    expect(s.lastFrame()).toMatch(/nothing to undo/);
    await s.type('Z');
    expect(s.lastFrame()).toMatch(/key "Z" is not in the keymap: nothing counted/);
    expect(s.session.getSnapshot().state.grains).toBe(0);
    s.session.shutdown();
  });

  it('puts groups outside the pollen sum apart: spores are percent of sum + spores', async () => {
    const s = await screenFor();
    await s.type('aaas');
    const frame = s.lastFrame() ?? '';
    expect(row(frame, 'Sphagnum')).toMatch(/s\s+Sphagnum\s+spore\s+1\s+25\.0.*\*/);
    expect(frame).toMatch(/Pollen sum 3 \/ 500/);
    s.session.shutdown();
  });

  it('Ctrl-C in a burst stops there, writes a close event and releases the file', async () => {
    const s = await screenFor();
    await s.type('ab\x03aaaa');
    expect(s.session.getSnapshot().closed).toBe(true);
    const state = readLevel(s.path).state;
    expect(state.counts).toEqual({ Alnus: 1, Betula: 1 });
    expect(state.closed).toBe(true);
  });

  it('resume shows the same totals, traverse and recent events', async () => {
    const first = await screenFor();
    await first.type('aabco\too');
    const before = first.lastFrame() ?? '';
    first.session.shutdown();
    first.unmount();
    const again = await screenFor(first.path);
    const after = again.lastFrame() ?? '';
    // The ◀ marks the grain recorded last; after a resume the last event is the new sitting.
    const unmarked = (line: string) => line.replace('◀', ' ');
    for (const taxon of ['Alnus', 'Betula', 'Corylus', 'Poaceae']) expect(row(after, taxon)).toBe(unmarked(row(before, taxon)));
    expect(after).toMatch(/traverse 2/);
    expect(after).toMatch(/sitting 2/);
    expect(after).toMatch(/Pollen sum 7 \/ 500/);
    again.session.shutdown();
  });

  it('at 80x24 a busy level still shows every panel: demo level with six groups', async () => {
    const dir = tempDir();
    const path = join(dir, 'demo.jsonl');
    copyFileSync(join(import.meta.dirname, '../../demo-sessions/km1-084cm.jsonl'), path);
    const s = await screenFor(path);
    const frame = s.lastFrame() ?? '';
    for (const part of [/Kestrel Mere KM-1 · level KM1-84 · depth 84/, /traverse 6 · sitting 2/, /Key Taxon/, /Pollen sum 236\n/, /Mark   17\*Indet   3\*/, /Stop if all · sum≥300/, /±4 ≥10% 5\.7\/4\s+\+244/, /cover \.983\/\.98\s+met/, /markers 17\/40\s+\+320/, /conc 174k\/cm³ ±25%/, /Types found: 15/, /16 since new/, /A   Ilex aquifolium    shrub      1/, /Last recorded/, /#289 sitting 2 started/, /Bksp undo · Tab trav · Enter note · = new · \? help · \^F finish · \^C quit/]) {
      expect(frame).toMatch(part);
    }
    expect(frame.split('\n').length).toBeLessThan(24);
    s.session.shutdown();
  });

  it('Ctrl-F asks before finishing: another key cancels and counts nothing; y finishes and quits', async () => {
    const s = await screenFor();
    await s.type('aa\x06');
    expect(s.lastFrame()).toMatch(/Finish this level\? y = finish and quit/);
    await s.type('b');
    expect(s.lastFrame()).toMatch(/not finished: counting goes on/);
    expect(s.session.getSnapshot().state.counts).toEqual({ Alnus: 2 });
    await s.type('\x06y');
    expect(s.session.getSnapshot().closed).toBe(true);
    const state = readLevel(s.path).state;
    expect(state.finishedAt).not.toBeNull();
    expect(state.recent.at(-1)?.type).toBe('finish');
    const again = resumeLevel(s.path);
    again.writer.close();
    expect(again.notices.join()).toMatch(/this level was marked finished on \d{4}-\d\d-\d\d/);
  });

  it('keeps what opening found (a repaired tail) on screen while counting goes on', async () => {
    const first = await screenFor();
    await first.type('aab');
    first.session.shutdown();
    first.unmount();
    appendFileSync(first.path, '{"seq":9,"at":"2026-1');
    const s = await screenFor(first.path);
    await s.type('aa');
    expect(s.lastFrame()).toMatch(/On opening: line 7 is incomplete[\s\S]*21\s+bytes cut off and\s+kept in\s+level\.jsonl\.cut-[\s\S]*\.bak/);
    expect(s.session.getSnapshot().state.counts).toEqual({ Alnus: 4, Betula: 1 });
    expect((s.lastFrame() ?? '').split('\n').length).toBeLessThan(24);
    s.session.shutdown();
  });

  it('re-lays out when the terminal is resized', async () => {
    const s = await screenFor(undefined, null, lowland());
    const stdout = s.stdout as unknown as NodeJS.EventEmitter;
    const size = { columns: 80, rows: 12 };
    Object.defineProperty(stdout, 'columns', { get: () => size.columns });
    Object.defineProperty(stdout, 'rows', { get: () => size.rows });
    stdout.emit('resize');
    await tick();
    expect(s.lastFrame()).toMatch(/more taxa not shown/);
    size.rows = 40;
    stdout.emit('resize');
    await tick();
    expect(s.lastFrame()).not.toMatch(/more taxa not shown/);
    expect(s.lastFrame()).toMatch(/Lycopodium/);
    // A terminal that reports 0 x 0 (some pseudo-terminals do) is drawn at 80 x 24.
    size.columns = 0;
    size.rows = 0;
    stdout.emit('resize');
    await tick();
    const lines = (s.lastFrame() ?? '').split('\n');
    expect(lines.length).toBeLessThan(24);
    expect(lines[0]).toMatch(/^Test Mere TM-1 · level T-1/);
    s.session.shutdown();
  });

  it('fits 80x24: no line wider than 80 and fewer than 24 lines', async () => {
    const s = await screenFor();
    await s.type('abcosl');
    const lines = (s.lastFrame() ?? '').split('\n');
    expect(lines.length).toBeLessThan(24);
    for (const line of lines) expect([...line].length).toBeLessThanOrEqual(80);
    s.session.shutdown();
  });
});
