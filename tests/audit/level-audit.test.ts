import { describe, expect, it } from 'vitest';
import { auditLevel, DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS, timelineBar } from '../../src/audit/level-audit.js';
import type { EventPayload, OpenEvent, SessionEvent } from '../../src/model/events.js';
import { foldEvents } from '../../src/model/fold.js';
import { TINY_KEYMAP, grain, openPayload } from '../helpers/levels.js';

const OPTIONS = { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS };
const T0 = Date.parse('2026-11-02T09:00:00.000Z');
const s = (n: number) => n * 1000;

/** Events with their own times, folded as exine would. */
function level(entries: readonly (readonly [EventPayload, number])[]) {
  const events = [[openPayload(), 0] as const, ...entries].map(([p, ms], i) => ({ ...p, seq: i + 1, at: new Date(T0 + ms).toISOString() }) as SessionEvent);
  const state = foldEvents(events[0] as OpenEvent, TINY_KEYMAP, events);
  return { events, state, audit: auditLevel(events, state, OPTIONS) };
}

const sitting = (n: number): EventPayload => ({ type: 'sitting', sitting: n });
const traverse = (n: number): EventPayload => ({ type: 'traverse', traverse: n });

describe('the audit of a level, traverse by traverse', () => {
  // Traverse 1: 3 Alnus, 2 Betula and a Sphagnum undone (seq 7); traverse 2: 2 Corylus, 1 Alnus, 1 Poaceae.
  const crafted = () =>
    level([
      [sitting(1), s(1)],
      [grain('Alnus', 1), s(10)],
      [grain('Alnus', 1), s(20)],
      [grain('Betula', 1), s(30)],
      [grain('Alnus', 1), s(40)],
      [grain('Sphagnum', 1), s(50)],
      [{ type: 'undo', of: 7 }, s(52)],
      [grain('Betula', 1), s(60)],
      [traverse(2), s(90)],
      [grain('Corylus', 2), s(100)],
      [grain('Corylus', 2), s(110)],
      [grain('Alnus', 2), s(120)],
      [grain('Poaceae', 2), s(130)],
      [{ type: 'close' }, s(140)],
    ]);

  it('counts each traverse: grains, types, new types, undos, time and rate', () => {
    const { audit } = crafted();
    expect(audit.traverses.map((t) => t.traverse)).toEqual([1, 2]);
    const [t1, t2] = audit.traverses;
    expect(t1).toMatchObject({ grains: 5, recorded: 6, types: 2, undos: 1, voided: 0, notes: 0 });
    expect(t1!.byTaxon).toEqual([['Alnus', 3], ['Betula', 2]]);
    expect([...t1!.newTypes].sort()).toEqual(['Alnus', 'Betula']);
    // From the sitting start (1 s) to the traverse event (90 s): 89 s in traverse 1.
    expect(t1!.activeMs).toBe(s(89));
    expect(t1!.perMinute).toBeCloseTo(5 / (89 / 60), 10);
    expect(t2).toMatchObject({ grains: 4, types: 3, undos: 0, activeMs: s(50) });
    expect([...t2!.newTypes].sort()).toEqual(['Corylus', 'Poaceae']);
    expect(t1!.start).toBe(new Date(T0 + s(10)).toISOString());
    expect([...audit.undone]).toEqual([7]);
    expect(audit.counting.size).toBe(9);
    expect(audit.counting.has(7)).toBe(false);
  });

  it('sittings, pauses and counting time; a pause inside a traverse is flagged as an interruption', () => {
    const { audit } = level([
      [sitting(1), s(0)],
      [grain('Alnus', 1), s(10)],
      [grain('Betula', 1), s(20)],
      [grain('Alnus', 1), s(20) + 11 * 60_000],
      [{ type: 'close' }, s(30) + 11 * 60_000],
      [sitting(2), 20 * 3600_000],
      [grain('Corylus', 1), 20 * 3600_000 + s(5)],
      [{ type: 'close' }, 20 * 3600_000 + s(6)],
    ]);
    expect(audit.sittings).toHaveLength(2);
    expect(audit.sittings[0]).toMatchObject({ sitting: 1, countingMs: s(30), closedCleanly: true });
    expect(audit.sittings[0]!.pauses).toEqual([expect.objectContaining({ ms: 11 * 60_000, afterSeq: 4, traverse: 1 })]);
    expect(audit.sittings[1]).toMatchObject({ sitting: 2, countingMs: s(6), grains: 1 });
    // The night between sittings is not counting time, nor a pause.
    expect(audit.countingMs).toBe(s(36));
    expect(audit.flags).toEqual([expect.objectContaining({ kind: 'interruption', seq: 5, traverse: 1 })]);
    expect(audit.flags[0]!.text).toMatch(/11 min without a grain inside traverse 1, before #5/);
    // Sitting 1 runs 11.5 minutes, 11 of them a pause: the bar is almost all "·".
    expect(timelineBar(audit.sittings[0]!, 23)).toMatch(/^█·{21}█$/);
    expect(timelineBar(audit.sittings[1]!, 5)).toBe('█████');
  });

  it('flags the same key twice within 120 ms as a possible double press, unless it was undone', () => {
    const { audit } = level([
      [sitting(1), 0],
      [grain('Alnus'), 1000],
      [grain('Alnus'), 1080],
      [grain('Betula'), 2000],
      [grain('Betula'), 2050],
      [{ type: 'undo', of: 6 }, 2500],
      [grain('Corylus'), 3000],
      [grain('Corylus'), 3200],
    ]);
    expect(audit.flags.map((f) => [f.kind, f.seq])).toEqual([['double-press', 4]]);
    expect(audit.flags[0]!.text).toMatch(/#3 and #4: key "a" \(Alnus\) twice within 80 ms, a double press\?/);
    const wider = auditLevel(level([[grain('Corylus'), 3000], [grain('Corylus'), 3200]]).events, level([[grain('Corylus'), 3000], [grain('Corylus'), 3200]]).state, { ...OPTIONS, doublePressMs: 250 });
    expect(wider.flags.map((f) => f.kind)).toEqual(['double-press']);
  });

  it('a clock that ran backwards is flagged, not an error', () => {
    const { audit } = level([
      [sitting(1), s(100)],
      [grain('Alnus'), s(50)],
    ]);
    expect(audit.flags).toEqual([expect.objectContaining({ kind: 'clock', seq: 3 })]);
  });

  it('shows corrections and what they voided; they add nothing to counting time', () => {
    const { audit, state } = level([
      [sitting(1), 0],
      [grain('Alnus', 1), s(10)],
      [grain('Betula', 1), s(20)],
      [traverse(2), s(30)],
      [grain('Corylus', 2), s(40)],
      [grain('Corylus', 2), s(50)],
      [{ type: 'close' }, s(60)],
      [{ type: 'void', grain: null, traverse: 2, reason: 'slide slipped' }, 48 * 3600_000],
      [{ type: 'void', grain: 4, traverse: null, reason: 'pressed a for b' }, 48 * 3600_000 + s(5)],
      [{ type: 'restore', of: 10, reason: 'it was a Betula after all' }, 48 * 3600_000 + s(9)],
    ]);
    expect(state.counts).toEqual({ Alnus: 1, Betula: 1 });
    expect(audit.traverses[1]).toMatchObject({ grains: 0, voided: 2, voidedWhole: { seq: 9, reason: 'slide slipped' } });
    expect(audit.traverses[0]).toMatchObject({ grains: 2, voided: 0 });
    expect(audit.corrections.map((c) => [c.seq, c.standing, c.restoredBy])).toEqual([
      [9, true, null],
      [10, false, 11],
      [11, true, null],
    ]);
    expect(audit.corrections[1]!.what).toBe('void of grain #4 (Betula, traverse 1)');
    // The restore is listed under the traverse of the void it takes back.
    expect(audit.traverses[0]!.events.map((e) => e.type)).toContain('restore');
    expect(audit.countingMs).toBe(s(60));
    expect(audit.sittings[0]!.end).toBe(new Date(T0 + s(60)).toISOString());
  });
});
