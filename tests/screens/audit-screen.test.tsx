import { readFileSync } from 'node:fs';
import { render } from 'ink-testing-library';
import { describe, expect, it } from 'vitest';
import { DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS } from '../../src/audit/level-audit.js';
import { fileAuditSource } from '../../src/audit/read-audit.js';
import type { KeyPress } from '../../src/input/key-press.js';
import { scanLog } from '../../src/log/scan-log.js';
import { AuditScreen } from '../../src/screens/audit-screen.js';
import { CountingSession } from '../../src/session/counting-session.js';
import { readLevel } from '../../src/session/session-files.js';
import { TALLY_CHILD, startChild } from '../helpers/child.js';
import { TINY_KEYMAP, newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

const tick = (ms = 40) => new Promise((r) => setTimeout(r, ms));
const DOWN = '\x1b[B';
const keys = (text: string): KeyPress[] => [...text].map((c) => (c === '\t' ? { kind: 'tab' } : { kind: 'char', char: c }) as KeyPress);

/** A closed level: traverse 1 "aab" (seq 3–5), traverse 2 "cco" (seq 7–9). */
function level() {
  const made = newLevelFile(tempDir(), 'l.jsonl', TINY_KEYMAP);
  const session = new CountingSession(made.writer, made.state);
  session.pressAll(keys('aab\tcco'));
  session.shutdown();
  return made.path;
}

async function auditOf(path: string) {
  const ui = render(<AuditScreen source={fileAuditSource(path, { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS })} columns={80} rows={24} pollMs={50} />);
  await tick();
  const type = async (text: string) => {
    ui.stdin.write(text);
    await tick();
  };
  return { ...ui, type };
}

const lastEvent = (path: string) => scanLog(readFileSync(path)).events.at(-1)!;

describe('the audit screen', () => {
  it('shows the traverse table and the selected traverse’s grains', async () => {
    const a = await auditOf(level());
    const frame = a.lastFrame() ?? '';
    expect(frame).toMatch(/Audit · Test Mere TM-1 · level T-1 · depth 10 · slide A/);
    expect(frame).toMatch(/file intact · 6 grains · 2 traverses · 1 sitting/);
    expect(frame).toMatch(/▶\s+1 \d\d:\d\d:\d\d\s+[\d:]+\s+3\s+2 /);
    expect(frame).toMatch(/Traverse 1 · Alnus 2, Betula 1/);
    expect(frame).toMatch(/#3 \d\d:\d\d:\d\d Alnus \(t1\)/);
    await a.type(DOWN);
    expect(a.lastFrame()).toMatch(/Traverse 2 · Corylus 2, Poaceae 1/);
    a.unmount();
  });

  it('voids a grain with a reason typed in one burst; the file gets a void event; Esc cancels another', async () => {
    const path = level();
    const a = await auditOf(path);
    await a.type('\t');
    await a.type(DOWN);
    await a.type('vdouble press\r');
    expect(lastEvent(path)).toMatchObject({ type: 'void', grain: 4, traverse: null, reason: 'double press' });
    expect(a.lastFrame()).toMatch(/#4 \d\d:\d\d:\d\d Alnus \(t1\) · VOIDED by #\d+/);
    expect(a.lastFrame()).toMatch(/recorded: void of grain #4, "double press"/);
    expect(a.lastFrame()).toMatch(/Traverse 1 · Alnus 1, Betula 1/);
    const size = readFileSync(path).length;
    await a.type(DOWN);
    await a.type('vnot sure');
    expect(a.lastFrame()).toMatch(/Void grain #5 \(Betula\)\. Reason: not sure/);
    await a.type('\x1b');
    await tick(100);
    expect(a.lastFrame()).toMatch(/cancelled: nothing recorded/);
    expect(readFileSync(path).length).toBe(size);
    // A reason is required.
    await a.type('v\r');
    expect(a.lastFrame()).toMatch(/a correction needs a reason/);
    a.unmount();
  });

  it('voids a whole traverse and restores it, each as a new event', async () => {
    const path = level();
    const a = await auditOf(path);
    await a.type(DOWN);
    await a.type('vslide slipped\r');
    expect(readLevel(path).state.counts).toEqual({ Alnus: 2, Betula: 1 });
    expect(a.lastFrame()).toMatch(/▶\s+2 .* VOID/);
    expect(a.lastFrame()).toMatch(/Traverse 2 VOIDED \(#\d+: slide slipped\)/);
    await a.type('rchecked, it was fine\r');
    expect(lastEvent(path)).toMatchObject({ type: 'restore', reason: 'checked, it was fine' });
    expect(readLevel(path).state.counts).toEqual({ Alnus: 2, Betula: 1, Corylus: 2, Poaceae: 1 });
    await a.type('f');
    expect(a.lastFrame()).toMatch(/void of traverse 2: "slide slipped" \(restored by #\d+\)/);
    a.unmount();
  });

  it('follows a level that another exine is counting, and says why a correction must wait', async () => {
    const path = level();
    const a = await auditOf(path);
    const child = startChild([TALLY_CHILD, path]);
    await child.waitFor(/ready/);
    try {
      child.proc.stdin.write('aaaa');
      await child.waitFor(/ack/);
      await tick(200);
      expect(a.lastFrame()).toMatch(/10 grains/);
      await a.type('\t');
      await a.type('vwrong key\r');
      expect((a.lastFrame() ?? '').replace(/\n/g, ' ')).toMatch(new RegExp(`not recorded: .*already open in exine process ${child.proc.pid}`));
    } finally {
      child.proc.stdin.end();
      await child.exited();
      a.unmount();
    }
  });

  it('fits 80x24 and uses a larger terminal', async () => {
    const dir = tempDir();
    const path = `${dir}/km1-036cm.jsonl`;
    (await import('node:fs')).copyFileSync(new URL('../../demo-sessions/km1-036cm.jsonl', import.meta.url), path);
    const source = fileAuditSource(path, { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS });
    for (const [columns, rows] of [[80, 24], [140, 45]] as const) {
      const ui = render(<AuditScreen source={source} columns={columns} rows={rows} />);
      await tick();
      const lines = (ui.lastFrame() ?? '').split('\n');
      expect(lines.length).toBeLessThan(rows);
      for (const line of lines) expect([...line].length).toBeLessThanOrEqual(columns);
      expect(ui.lastFrame()).toMatch(/2 flags to review · 3 corrections/);
      ui.unmount();
    }
    const big = render(<AuditScreen source={source} columns={140} rows={45} />);
    await tick();
    expect((big.lastFrame() ?? '').match(/^.\s+\d+ \d\d:\d\d:\d\d/gm)?.length).toBe(12);
    big.unmount();
  });

  it('a last line still being written is said so, not called damage', async () => {
    const path = level();
    (await import('node:fs')).appendFileSync(path, '{"seq":11,"at":"2026-');
    const a = await auditOf(path);
    expect(a.lastFrame()).toMatch(/last line incomplete \(being written\?\) · 6 grains/);
    a.unmount();
  });

  it('q quits', async () => {
    const a = await auditOf(level());
    await a.type('q');
    expect(a.lastFrame()).toBeDefined();
    a.unmount();
  });
});
