import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS } from '../../src/audit/level-audit.js';
import { plainReport } from '../../src/audit/plain-report.js';
import { readForAudit } from '../../src/audit/read-audit.js';
import { LONG_COLUMNS, longRows } from '../../src/export/level-export.js';
import { levelSummary } from '../../src/export/level-summary.js';
import { splitRaw } from '../../src/input/key-press.js';
import type { EventPayload, SessionEvent } from '../../src/model/events.js';
import { applyEvents } from '../../src/model/fold.js';
import type { LevelState } from '../../src/model/level-state.js';
import { planBurst } from '../../src/session/plan-burst.js';
import { readLevel } from '../../src/session/session-files.js';
import { grain, openPayload, sessionText, stateOf } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

const OPTIONS = { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS };

/** Keys typed at the eyepiece, through the planner and the fold, as the counting session does. */
function typed(state: LevelState, keys: string): { state: LevelState; payloads: EventPayload[]; message: string | null; misses: number } {
  const plan = planBurst(state, null, splitRaw(keys));
  const events = plan.payloads.map((p, i) => ({ ...p, seq: state.lastSeq + 1 + i, at: state.lastAt }) as SessionEvent);
  return { state: applyEvents(state, events), payloads: [...plan.payloads], message: plan.message?.text ?? null, misses: plan.misses };
}

const start = () => stateOf(openPayload(), [{ type: 'sitting', sitting: 1 }]);

describe('undo at the eyepiece', () => {
  it('names the taxon and the traverse of the grain it takes back', () => {
    const after = typed(start(), 'ab\x7f');
    expect(after.message).toBe('undid #4 Betula, traverse 1');
    expect(after.state.counts).toEqual({ Alnus: 1 });
  });

  it('right after a Tab takes back the traverse change, not the last grain of the traverse before; the history stays', () => {
    const tabbed = typed(start(), 'aa\t');
    expect(tabbed.state.traverse).toBe(2);
    const back = typed(tabbed.state, '\x7f');
    expect(back.payloads).toEqual([{ type: 'traverse-undo', of: 5, traverse: 1 }]);
    expect(back.message).toBe('undid the change to traverse 2 (#5): counting goes on in traverse 1');
    expect(back.state.counts).toEqual({ Alnus: 2 });
    expect(back.state.traverse).toBe(1);
    // Two mistaken Tabs are two undos; then the grains again.
    const twice = typed(back.state, '\t\t\x7f\x7f\x7f');
    expect(twice.state.traverse).toBe(1);
    expect(twice.state.counts).toEqual({ Alnus: 1 });
    // A grain after a Tab is undone first, then the Tab.
    const mixed = typed(start(), 'a\tb\x7f\x7f');
    expect([mixed.state.traverse, mixed.state.counts]).toEqual([1, { Alnus: 1 }]);
  });

  it('a take-back that is not of the latest standing change is kept in the file and ignored by the fold', () => {
    const s = stateOf(openPayload(), [{ type: 'sitting', sitting: 1 }, { type: 'traverse', traverse: 2 }, { type: 'traverse', traverse: 3 }, { type: 'traverse-undo', of: 3, traverse: 1 }]);
    expect(s.traverse).toBe(3);
    expect(s.ignored).toEqual([5]);
  });

  it('the audit says an empty traverse as such, and which undo took the change to it back', () => {
    const dir = tempDir();
    const path = join(dir, 'level.jsonl');
    const payloads: EventPayload[] = [{ type: 'sitting', sitting: 1 }, grain('Alnus'), { type: 'traverse', traverse: 2 }, { type: 'traverse-undo', of: 4, traverse: 1 }, grain('Betula'), { type: 'traverse', traverse: 2 }, { type: 'traverse', traverse: 3 }, grain('Corylus', 3), { type: 'close' }];
    writeFileSync(path, sessionText([openPayload(), ...payloads]));
    const read = readForAudit(path, OPTIONS);
    expect(read.scan.corruption).toBeNull();
    const rows = read.audit.traverses.map((t) => [t.traverse, t.grains, t.empty, t.takenBack]);
    expect(rows).toEqual([
      [1, 2, false, null],
      [2, 0, true, null],
      [3, 1, false, null],
    ]);
    const report = plainReport('level.jsonl', read.state, read.audit, read.verdict);
    expect(report).toMatch(/\n\s+2 .*empty: no grain recorded/);
    // Taken back and never started again: said so.
    const back: EventPayload[] = [{ type: 'sitting', sitting: 1 }, grain('Alnus'), { type: 'traverse', traverse: 2 }, { type: 'traverse-undo', of: 4, traverse: 1 }, { type: 'close' }];
    writeFileSync(path, sessionText([openPayload(), ...back]));
    const again = readForAudit(path, OPTIONS);
    expect(again.audit.traverses.map((t) => [t.traverse, t.empty, t.takenBack])).toEqual([
      [1, false, null],
      [2, true, 5],
    ]);
    expect(plainReport('level.jsonl', again.state, again.audit, again.verdict)).toMatch(/empty: the change to it was taken back \(#5\)/);
  });
});

describe('cf. grains', () => {
  it("the cf. key then a taxon key counts a cf. grain with its taxon; undo and void take it out of both tallies", () => {
    const s = typed(start(), "a'a'b");
    expect(s.payloads.filter((p) => p.type === 'grain')).toEqual([
      { type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a' },
      { type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a', cf: true },
      { type: 'grain', taxon: 'Betula', traverse: 1, key: 'b', cf: true },
    ]);
    expect(s.state.counts).toEqual({ Alnus: 2, Betula: 1 });
    expect(s.state.cf).toEqual({ Alnus: 1, Betula: 1 });
    expect(s.message).toBe('cf. Betula counted (Betula: 1, of them cf. 1)');
    const undone = typed(s.state, '\x7f');
    expect(undone.message).toBe('undid #5 cf. Betula, traverse 1');
    expect(undone.state.cf).toEqual({ Alnus: 1 });
    const voided = applyEvents(undone.state, [{ type: 'void', grain: 4, traverse: null, reason: 'x', seq: 8, at: undone.state.lastAt } as SessionEvent]);
    expect([voided.counts, voided.cf]).toEqual([{ Alnus: 1 }, {}]);
  });

  it("the cf. key twice cancels; a key that is no taxon key cancels, counts nothing and is a miss", () => {
    expect(typed(start(), "''").state.grains).toBe(0);
    expect(typed(start(), "''").message).toBe('cf. cancelled: nothing counted');
    const miss = typed(start(), "'%a");
    expect(miss.misses).toBe(1);
    expect(miss.state.counts).toEqual({ Alnus: 1 });
    expect(miss.state.cf).toEqual({});
  });

  it('summary, the long export (cf_count) and the audit report them; a format-2 file without cf. reads as before', () => {
    const dir = tempDir();
    const path = join(dir, 'level.jsonl');
    const payloads: EventPayload[] = [{ type: 'sitting', sitting: 1 }, grain('Alnus'), { ...grain('Alnus'), cf: true } as EventPayload, { ...grain('Betula', 2), cf: true } as EventPayload, { type: 'close' }];
    writeFileSync(path, sessionText([openPayload(), ...payloads]));
    const { state } = readLevel(path);
    const summary = levelSummary(state);
    expect(summary.taxa.filter((t) => t.count > 0).map((t) => [t.taxon, t.count, t.cf])).toEqual([
      ['Alnus', 2, 1],
      ['Betula', 1, 1],
    ]);
    const rows = longRows([{ state, source: 'level.jsonl' }]);
    const at = LONG_COLUMNS.indexOf('cf_count');
    expect(at).toBe(LONG_COLUMNS.indexOf('count') + 1);
    expect(rows.filter((r) => (r[LONG_COLUMNS.indexOf('count')] as number) > 0).map((r) => [r[5], r[at]])).toEqual([
      ['Alnus', 1],
      ['Betula', 1],
    ]);
    const read = readForAudit(path, OPTIONS);
    const report = plainReport('level.jsonl', read.state, read.audit, read.verdict);
    expect(report).toMatch(/cf\. grains \(2; each counts with its taxon\)\n  Alnus: 1 cf\. \(traverse 1\)\n  Betula: 1 cf\. \(traverse 2\)/);

    const old = join(dir, 'format-2.jsonl');
    writeFileSync(old, sessionText([{ ...openPayload(), format: 2 }, { type: 'sitting', sitting: 1 }, grain('Alnus'), { type: 'undo', of: 3 }, grain('Betula')]));
    const read2 = readLevel(old);
    expect(read2.scan.corruption).toBeNull();
    expect([read2.state.counts, read2.state.cf, read2.state.traverseChanges]).toEqual([{ Betula: 1 }, {}, []]);
  });

  it('a cf field other than true is refused as a bad event', () => {
    const dir = tempDir();
    const path = join(dir, 'level.jsonl');
    writeFileSync(path, sessionText([openPayload(), { type: 'sitting', sitting: 1 }, { ...grain('Alnus'), cf: 'yes' } as unknown as EventPayload, grain('Betula')]));
    expect(() => readLevel(path)).toThrow(/line 3/);
  });
});
