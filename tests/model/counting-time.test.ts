import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { auditLevel, DEFAULT_DOUBLE_PRESS_MS, DEFAULT_GAP_MS } from '../../src/audit/level-audit.js';
import type { EventPayload, OpenEvent, SessionEvent } from '../../src/model/events.js';
import { applyEvent, COUNTING_GAP_MS, foldEvents } from '../../src/model/fold.js';
import { readForAudit } from '../../src/audit/read-audit.js';
import { TINY_KEYMAP, grain, openPayload } from '../helpers/levels.js';

const OPTIONS = { doublePressMs: DEFAULT_DOUBLE_PRESS_MS, gapMs: DEFAULT_GAP_MS };
const T0 = Date.parse('2026-11-02T09:00:00.000Z');

// The core view reads counting time from the fold (no second pass over the events); it must be the audit's.
describe('counting time in the fold', () => {
  it('uses the audit pause', () => {
    expect(COUNTING_GAP_MS).toBe(DEFAULT_GAP_MS);
  });

  it('is the audit counting time for every demo level', () => {
    const dir = join(import.meta.dirname, '../../demo-sessions');
    const files = readdirSync(dir).filter((f) => f.endsWith('.jsonl'));
    expect(files.length).toBeGreaterThan(0);
    for (const f of files) {
      const { state, audit } = readForAudit(join(dir, f), OPTIONS);
      expect(state.countingMs, f).toBe(audit.countingMs);
      expect(state.countingMs, f).toBeGreaterThan(0);
    }
  });

  const payload = fc.oneof(
    fc.constant<EventPayload>(grain('Alnus')),
    fc.constant<EventPayload>(grain('Betula', 2)),
    fc.integer({ min: 1, max: 4 }).map((n): EventPayload => ({ type: 'sitting', sitting: n })),
    fc.constant<EventPayload>({ type: 'close' }),
    fc.integer({ min: 2, max: 9 }).map((g): EventPayload => ({ type: 'void', grain: g, traverse: null, reason: 'x' })),
    fc.integer({ min: 2, max: 9 }).map((of): EventPayload => ({ type: 'restore', of, reason: 'x' })),
    fc.constant<EventPayload>({ type: 'rules-met', sum: 1, grains: 1, met: ['target'] }),
  );
  // Gaps around the pause, and a clock set back now and then.
  const gap = fc.oneof(fc.integer({ min: 0, max: 20_000 }), fc.integer({ min: 290_000, max: 310_000 }), fc.integer({ min: -60_000, max: 0 }));

  it('is the audit counting time for any order of sittings, grains, pauses, corrections and verdicts', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(payload, gap), { maxLength: 40 }), (entries) => {
        let t = T0;
        const events = [[openPayload(), 0] as const, ...entries].map(([p, dt], i) => {
          t += dt;
          return { ...p, seq: i + 1, at: new Date(t).toISOString() } as SessionEvent;
        });
        const state = foldEvents(events[0] as OpenEvent, TINY_KEYMAP, events);
        expect(state.countingMs).toBe(auditLevel(events, state, OPTIONS).countingMs);
      }),
    );
  });

  it('leaves the state it folds from as it was', () => {
    const open = { ...openPayload(), seq: 1, at: '2026-11-02T09:00:00.000Z' } as OpenEvent;
    const s1 = foldEvents(open, TINY_KEYMAP, [open, { type: 'sitting', sitting: 1, seq: 2, at: '2026-11-02T09:00:01.000Z' } as SessionEvent]);
    const s2 = applyEvent(s1, { ...grain('Alnus'), seq: 3, at: '2026-11-02T09:00:04.000Z' } as SessionEvent);
    expect(s1.countingClock.at).toBe('2026-11-02T09:00:01.000Z');
    expect([s1.countingMs, s2.countingMs]).toEqual([0, 3000]);
  });
});
