import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readForAudit } from '../../src/audit/read-audit.js';
import { correctLevel } from '../../src/session/session-files.js';
import { DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS } from '../../src/audit/level-audit.js';
import { TALLY_CHILD, startChild } from '../helpers/child.js';
import { grain, openPayload, timedSessionText } from '../helpers/levels.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';
import type { EventPayload } from '../../src/model/events.js';

const s = (n: number) => n * 1000;
const OPTIONS = { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS };

/** Three traverses of known counts; traverse 3 is rich in Betula; one double press; a pause. */
function crafted(): string {
  const entries: [EventPayload, number][] = [[openPayload(undefined, { analyst: 'A. Counter' }), 0], [{ type: 'sitting', sitting: 1 }, s(1)]];
  let t = s(2);
  const add = (p: EventPayload, dt = 3000) => entries.push([p, (t += dt)]);
  for (let tr = 1; tr <= 3; tr++) {
    if (tr > 1) add({ type: 'traverse', traverse: tr });
    const [a, b, c] = tr === 3 ? [5, 30, 10] : [20, 10, 10];
    for (let i = 0; i < a; i++) add(grain('Alnus', tr));
    for (let i = 0; i < b; i++) add(grain('Betula', tr));
    for (let i = 0; i < c; i++) add(grain('Corylus', tr));
  }
  add(grain('Corylus', 3), 60);
  add(grain('Poaceae', 3), 9 * 60_000);
  add({ type: 'close' });
  const dir = tempDir();
  writeFileSync(join(dir, 'level.jsonl'), timedSessionText(entries));
  return dir;
}

describe('exine audit --plain', () => {
  it('prints the traverse-by-traverse story, the evenness test, flags, corrections and integrity', async () => {
    const dir = crafted();
    const run = await runExine(['audit', 'level.jsonl', '--plain'], dir);
    expect(run.code).toBe(0);
    const out = run.stdout;
    expect(out).toMatch(/^Audit of level\.jsonl\n/);
    expect(out).toMatch(/level T-1 · depth 10 · slide TM1-010-A · analyst A\. Counter/);
    expect(out).toMatch(/keymap "tiny" · counted 2026-11-02 09:00 UTC to 2026-11-02 09:\d\d UTC · not finished/);
    expect(out).toMatch(/integrity: level\.jsonl: intact, 1\d\d lines, chain verified/);
    expect(out).toMatch(/\n\s+1  2026-11-02 09:00 UTC\s+00:02:0\d\s+40\s+3 /);
    expect(out).toMatch(/\n\s+3  2026-11-02 09:0\d UTC\s+[\d:]+\s+47\s+4 /);
    expect(out).toMatch(/Evenness across traverses \(χ² test of homogeneity, \d types × 3 traverses\): X² = [\d.]+, df = \d+, p = [\de.-]+: the types are NOT spread alike across traverses\./);
    expect(out).toMatch(/Traverse 3 has more Betula than the rest \(30 counted/);
    expect(out).toMatch(/\[double-press\] #\d+ and #\d+: key "c" \(Corylus\) twice within 60 ms/);
    expect(out).toMatch(/\[interruption\] 9 min without a grain inside traverse 3/);
    expect(out).toMatch(/Notes: none/);
    expect(out).toMatch(/Corrections: none/);
  });

  it('lists the notes with their grains and stage positions, and the types added', async () => {
    const out = (await runExine(['audit', 'demo-sessions/km1-084cm.jsonl', '--plain'], join(import.meta.dirname, '../..'))).stdout;
    expect(out).toMatch(/Notes \(4\)\n/);
    expect(out).toMatch(/  #\d+ on grain #\d+ Ilex aquifolium, traverse 4, stage 21\.7, 93\.2: not in the keymap/);
    expect(out).toMatch(/Types added while counting: Ilex aquifolium \(key A\)/);
  });

  it('shows a correction made on the audit screen', async () => {
    const dir = crafted();
    // seq 3 is the first Alnus of traverse 1.
    correctLevel(join(dir, 'level.jsonl'), { type: 'void', grain: 3, traverse: null, reason: 'pressed a for b' });
    const out = (await runExine(['audit', 'level.jsonl', '--plain'], dir)).stdout;
    expect(out).toMatch(/Corrections \(1\)\n  #\d+ \d{4}-\d\d-\d\d \d\d:\d\d UTC  void of grain #3 \(Alnus, traverse 1\): "pressed a for b"/);
    expect(out).toMatch(/\n\s+1  2026-11-02 09:00 UTC\s+[\d:]+\s+39\s+3\s+[\d.]+\s+3\s+0\s+1/);
  });

  it('--double-press and --gap change the thresholds; bad values are usage errors', async () => {
    const dir = crafted();
    const out = (await runExine(['audit', 'level.jsonl', '--plain', '--double-press', '30', '--gap', '10'], dir)).stdout;
    expect(out).toMatch(/Flags for review: none/);
    const bad = await runExine(['audit', 'level.jsonl', '--plain', '--gap', 'soon'], dir);
    expect(bad.code).toBe(2);
    expect(oneLine(bad)).toMatch(/--gap must be a whole number above 0, not "soon"/);
  });

  it('audits a level while another process appends to it, without a lock and without changing it', async () => {
    const dir = crafted();
    const path = join(dir, 'level.jsonl');
    const before = readForAudit(path, OPTIONS).state.grains;
    const child = startChild([TALLY_CHILD, path]);
    await child.waitFor(/ready/);
    // The last seq the counting process has on disk.
    const acked = (out = child.stdout()) => Math.max(0, ...[...out.matchAll(/^ack (\d+)$/gm)].map((m) => Number(m[1])));
    const typing = setInterval(() => child.proc.stdin.write('abcabc'), 3);
    try {
      let last = readForAudit(path, OPTIONS).state;
      for (let read = 0; read < 5; read++) {
        // Wait for grains the last read cannot have seen, then read again.
        await child.waitFor((out) => acked(out) > last.lastSeq);
        const onDisk = acked();
        const audit = readForAudit(path, OPTIONS);
        // Every grain on disk when the read began is in it.
        expect(audit.state.lastSeq).toBeGreaterThanOrEqual(onDisk);
        expect(audit.state.grains).toBeGreaterThan(last.grains);
        last = audit.state;
      }
      expect(last.grains).toBeGreaterThan(before);
      const run = await runExine(['audit', path, '--plain']);
      expect(run.code).toBe(0);
    } finally {
      clearInterval(typing);
      child.proc.stdin.end();
      await child.exited();
    }
    // The counting process never saw the audit: its file is whole.
    expect((await runExine(['verify', path])).code).toBe(0);
  });
});

describe('exine verify', () => {
  const lines = (dir: string) => readFileSync(join(dir, 'level.jsonl'), 'utf8').split('\n');
  const write = (dir: string, text: string[]) => writeFileSync(join(dir, 'level.jsonl'), text.join('\n'));

  it('an intact file: exit 0 and one line with the last hash', async () => {
    const run = await runExine(['verify', 'level.jsonl'], crafted());
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/^level\.jsonl: intact, \d+ lines, chain verified, last hash [0-9a-f]{64}\n$/);
  });

  it.each([
    ['an edited taxon', (t: string[]) => { t[5] = t[5]!.replace('"Alnus"', '"Betula"'); }, /line 6 does not match its hash/],
    ['a deleted line', (t: string[]) => { t.splice(5, 1); }, /line 6 has seq 7 where 6 was expected/],
    ['two swapped lines', (t: string[]) => { [t[5], t[6]] = [t[6]!, t[5]!]; }, /line 6 has seq 7 where 6 was expected/],
    ['a truncated file', (t: string[]) => { t.splice(40); t[39] = t[39]!.slice(0, 30); }, /line 40 is incomplete/],
  ])('%s: exit 1, naming the first bad line', async (_what, edit, message) => {
    const dir = crafted();
    const text = lines(dir);
    edit(text);
    write(dir, text);
    const run = await runExine(['verify', 'level.jsonl'], dir);
    expect(run.code).toBe(1);
    expect(oneLine(run)).toMatch(message);
  });

  it('a clock that ran backwards is a warning, not a failure', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'level.jsonl'), timedSessionText([[openPayload(), 0], [{ type: 'sitting', sitting: 1 }, s(100)], [grain('Alnus'), s(50)]]));
    const run = await runExine(['verify', 'level.jsonl'], dir);
    expect(run.code).toBe(0);
    expect(run.stderr).toMatch(/warning: line 3: time .* is earlier than the line before/);
    expect(run.stdout).toMatch(/intact/);
  });
});
