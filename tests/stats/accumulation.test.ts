import { describe, expect, it } from 'vitest';
import { saturationCurve } from '../../src/stats/accumulation.js';
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
