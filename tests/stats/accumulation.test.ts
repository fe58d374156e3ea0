import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { EventPayload, OpenEvent, SessionEvent } from '../../src/model/events.js';
import { applyEvent, foldEvents } from '../../src/model/fold.js';
import type { LevelState } from '../../src/model/level-state.js';
import { LiveSaturationCurve, saturationCurve } from '../../src/stats/accumulation.js';
import { rarefy } from '../../src/stats/rarefaction.js';
import { GIRDLED } from '../helpers/reference-data.js';
import { grain, grainsFor, keymapOf, openPayload, stateOf } from '../helpers/levels.js';

describe('the saturation curve', () => {
  it('observed: types found after each grain of the sum, in counting order (a step line)', () => {
    const keymap = keymapOf(3);
    const state = stateOf(openPayload(keymap), [grain('T01'), grain('T01'), grain('Marker', 1, '.'), grain('T02'), grain('T01'), grain('T03')]);
    const curve = saturationCurve(state);
    // The marker is outside the sum: it neither adds a grain nor a type.
    expect(curve.observed).toEqual([0, 1, 1, 2, 2, 3]);
    expect(curve.grains).toBe(5);
  });

  it('an undone first grain moves the type’s arrival to its next grain', () => {
    const keymap = keymapOf(2);
    const state = stateOf(openPayload(keymap), [grain('T01'), grain('T02'), grain('T02'), { type: 'undo', of: 3 }]);
    expect(saturationCurve(state).observed).toEqual([0, 1, 2]);
  });

  // Hurlbert (1971) E(S_n); on the Girdled stand of iNEXT's spider data vegan's rarefy gives
  // 6.478617, 15.030098 and 20.459426 at n = 10, 50, 100. [ref: vegan 2.6-4]
  it('expected: E(S_n) of the counts as they stand, as vegan gives it on the spider data', () => {
    const state = stateOf(openPayload(keymapOf(26)), grainsFor(GIRDLED));
    const curve = saturationCurve(state, 168);
    const at = (n: number) => curve.expected[curve.at.indexOf(n)] as number;
    expect(at(10)).toBeCloseTo(6.478617, 6);
    expect(at(50)).toBeCloseTo(15.030098, 6);
    expect(at(100)).toBeCloseTo(20.459426, 6);
    // At the full count the expectation is the types observed.
    expect(at(168)).toBeCloseTo(26, 9);
    expect(curve.at.at(-1)).toBe(168);
  });

  it('samples the expectation at most `points` times, ending at the count', () => {
    const state = stateOf(openPayload(keymapOf(26)), grainsFor(GIRDLED));
    const curve = saturationCurve(state, 20);
    expect(curve.at.length).toBeLessThanOrEqual(20);
    expect(curve.at.at(-1)).toBe(168);
    curve.at.forEach((n, i) => expect(curve.expected[i]).toBeCloseTo(rarefy(GIRDLED, n, false)!.expected, 12));
  });
});

describe('the live saturation curve (the screen redraws it after every key)', () => {
  type Act = { kind: 'grain'; taxon: number; traverse: boolean } | { kind: 'undo' | 'void' | 'restore' | 'void-traverse' | 'revisit'; pick: number };
  const act: fc.Arbitrary<Act> = fc.oneof(
    { weight: 6, arbitrary: fc.record({ kind: fc.constant('grain' as const), taxon: fc.integer({ min: 0, max: 4 }), traverse: fc.boolean() }) },
    { weight: 2, arbitrary: fc.record({ kind: fc.constantFrom('undo' as const, 'void' as const, 'restore' as const, 'void-traverse' as const, 'revisit' as const), pick: fc.nat() }) },
  );

  it('property: equals the full recomputation after any sequence of grains, undos, voids and restores (fast-check)', () => {
    const keymap = keymapOf(4);
    const taxa = ['T01', 'T02', 'T03', 'T04', 'Marker'];
    fc.assert(
      fc.property(fc.array(act, { maxLength: 80 }), (acts) => {
        const live = new LiveSaturationCurve();
        const open = { ...openPayload(keymap), seq: 1, at: '2026-11-02T09:00:00.000Z' } as OpenEvent;
        let state = foldEvents(open, keymap, []);
        const history = [state];
        const grains: number[] = [];
        const voids: number[] = [];
        let seq = 1;
        let traverse = 1;
        const apply = (payload: EventPayload) => {
          seq++;
          state = applyEvent(state, { ...payload, seq, at: new Date(Date.UTC(2026, 10, 2, 9, 0, seq)).toISOString() } as SessionEvent);
          history.push(state);
        };
        for (const a of acts) {
          if (a.kind === 'grain') {
            if (a.traverse) apply({ type: 'traverse', traverse: ++traverse });
            apply(grain(taxa[a.taxon] as string, traverse, a.taxon === 4 ? '.' : undefined));
            grains.push(seq);
          } else if (a.kind === 'revisit') {
            // The cache must also follow a jump back to an older state (a fresh screen on the same process).
            const old = history[a.pick % history.length] as LevelState;
            expect(live.curve(old)).toEqual(saturationCurve(old));
            continue;
          } else if (grains.length > 0 && a.kind === 'undo') apply({ type: 'undo', of: grains.at(-1 - (a.pick % Math.min(3, grains.length))) as number });
          else if (grains.length > 0 && a.kind === 'void') {
            apply({ type: 'void', grain: grains[a.pick % grains.length] as number, traverse: null, reason: 'test' });
            voids.push(seq);
          } else if (a.kind === 'void-traverse') {
            apply({ type: 'void', grain: null, traverse: 1 + (a.pick % traverse), reason: 'test' });
            voids.push(seq);
          } else if (voids.length > 0 && a.kind === 'restore') apply({ type: 'restore', of: voids[a.pick % voids.length] as number, reason: 'test' });
          expect(live.curve(state)).toEqual(saturationCurve(state));
        }
        // A fresh curve reads the whole stack at once, as the first frame of a resumed level does.
        expect(new LiveSaturationCurve().curve(state)).toEqual(saturationCurve(state));
      }),
      { numRuns: 300 },
    );
  });
});
