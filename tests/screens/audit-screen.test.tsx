import { copyFileSync, readFileSync, appendFileSync } from 'node:fs';
import { render } from 'ink-testing-library';
import { useEffect, type ReactNode } from 'react';
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
import { driveScreen, until } from '../helpers/ink-screen.js';
import { tempDir } from '../helpers/temp-dir.js';

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

const OPTIONS = { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS };

/** Tells when the screen inside it is taken down (Ink unmounts the whole tree when the app exits). */
function Unmounts({ onUnmount, children }: { onUnmount: () => void; children: ReactNode }) {
  useEffect(() => onUnmount, [onUnmount]);
  return children;
}

async function auditOf(path: string, onUnmount = () => {}) {
  return driveScreen(
    render(
      <Unmounts onUnmount={onUnmount}>
        <AuditScreen source={fileAuditSource(path, OPTIONS)} columns={80} rows={24} pollMs={50} />
      </Unmounts>,
    ),
  );
}

const lastEvent = (path: string) => scanLog(readFileSync(path)).events.at(-1)!;

describe('the audit screen', () => {
  it('shows the traverse table and the selected traverse’s grains', async () => {
    const a = await auditOf(level());
    const frame = await a.shows(/Audit · Test Mere TM-1 · level T-1 · depth 10 · slide A/);
    expect(frame).toMatch(/file intact · 6 grains · 2 traverses · 1 sitting/);
    expect(frame).toMatch(/▶\s+1 \d\d:\d\d:\d\d\s+[\d:]+\s+3\s+2 /);
    expect(frame).toMatch(/Traverse 1 · Alnus 2, Betula 1/);
    expect(frame).toMatch(/#3 \d\d:\d\d:\d\d Alnus \(t1\)/);
    a.type(DOWN);
    await a.shows(/Traverse 2 · Corylus 2, Poaceae 1/);
    a.unmount();
  });

  it('voids a grain with a reason typed in one burst; the file gets a void event; Esc cancels another', async () => {
    const path = level();
    const a = await auditOf(path);
    a.type('\t');
    a.type(DOWN);
    a.type('vdouble press\r');
    expect(lastEvent(path)).toMatchObject({ type: 'void', grain: 4, traverse: null, reason: 'double press' });
    const voided = await a.shows(/recorded: void of grain #4, "double press"/);
    expect(voided).toMatch(/#4 \d\d:\d\d:\d\d Alnus \(t1\) · VOIDED by #\d+/);
    expect(voided).toMatch(/Traverse 1 · Alnus 1, Betula 1/);
    const size = readFileSync(path).length;
    a.type(DOWN);
    a.type('vnot sure');
    await a.shows(/Void grain #5 \(Betula\)\. Reason: not sure/);
    // A lone Escape reaches the screen once Ink is sure no sequence follows it.
    a.type('\x1b');
    await a.shows(/cancelled: nothing recorded/);
    expect(readFileSync(path).length).toBe(size);
    // A reason is required.
    a.type('v\r');
    await a.shows(/a correction needs a reason/);
    a.unmount();
  });

  it('voids a whole traverse and restores it, each as a new event', async () => {
    const path = level();
    const a = await auditOf(path);
    a.type(DOWN);
    a.type('vslide slipped\r');
    expect(readLevel(path).state.counts).toEqual({ Alnus: 2, Betula: 1 });
    expect(await a.shows(/Traverse 2 VOIDED \(#\d+: slide slipped\)/)).toMatch(/▶\s+2 .* VOID/);
    a.type('rchecked, it was fine\r');
    expect(lastEvent(path)).toMatchObject({ type: 'restore', reason: 'checked, it was fine' });
    expect(readLevel(path).state.counts).toEqual({ Alnus: 2, Betula: 1, Corylus: 2, Poaceae: 1 });
    a.type('f');
    await a.shows(/void of traverse 2: "slide slipped" \(restored by #\d+\)/);
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
      // The screen re-reads the file as it grows.
      await a.shows(/10 grains/);
      a.type('\t');
      a.type('vwrong key\r');
      await until(() => expect(a.frame().replace(/\s+/g, ' ')).toMatch(new RegExp(`not recorded: .*already open in exine process ${child.proc.pid}`)));
    } finally {
      child.proc.stdin.end();
      await child.exited();
      a.unmount();
    }
  });

  it('fits 80x24 and uses a larger terminal', async () => {
    const dir = tempDir();
    const path = `${dir}/km1-036cm.jsonl`;
    copyFileSync(new URL('../../demo-sessions/km1-036cm.jsonl', import.meta.url), path);
    const source = fileAuditSource(path, OPTIONS);
    for (const [columns, rows] of [[80, 24], [140, 45]] as const) {
      const ui = await driveScreen(render(<AuditScreen source={source} columns={columns} rows={rows} />));
      const lines = (await ui.shows(/2 flags to review · 3 corrections/)).split('\n');
      expect(lines.length).toBeLessThan(rows);
      for (const line of lines) expect([...line].length).toBeLessThanOrEqual(columns);
      if (rows === 45) expect(ui.frame().match(/^.\s+\d+\s+\d\d:\d\d:\d\d/gm)?.length).toBe(12);
      ui.unmount();
    }
  });

  it('a last line still being written is said so, not called damage', async () => {
    const path = level();
    appendFileSync(path, '{"seq":11,"at":"2026-');
    const a = await auditOf(path);
    await a.shows(/last line incomplete \(being written\?\) · 6 grains/);
    a.unmount();
  });

  it('q quits: the screen is taken down and reads no more keys', async () => {
    let unmounted = false;
    const a = await auditOf(level(), () => (unmounted = true));
    a.type(DOWN);
    await a.shows(/Traverse 2 · Corylus 2, Poaceae 1/);
    expect(unmounted).toBe(false);
    a.type('q');
    await until(() => expect(unmounted).toBe(true));
    expect(a.stdin.listenerCount('readable')).toBe(0);
  });
});
