import { describe, expect, it } from 'vitest';
import { concentration, grainsToRelativeError, relativeError, type Spike } from '../../src/stats/concentration.js';

const SPIKE: Spike = { tablets: 2, perTablet: 20000, perTabletSd: 800, volume: 1, mass: null, accumulationRate: 0.1 };

describe('exotic-marker concentration', () => {
  // Worked example of FIELD section 5 [computed from the published formulas: Stockmarr 1971
  // for C, Maher 1981 for the error, Regal & Cushing 1979 for the exact interval].
  it('p 400, m 80, two tablets of 20,000 ± 800, 1 cm³ → 200,000 grains/cm³', () => {
    const c = concentration(400, 80, SPIKE);
    expect(c.value).toBe(200000);
    expect(c.unit).toBe('grains/cm3');
    expect(c.relativeError).toBeCloseTo(0.1257, 4);
    expect(c.low).toBeCloseTo(156968, -1);
    expect(c.high).toBeCloseTo(257564, -1);
    expect(c.influx).toBe(20000);
  });

  it('per gram when a mass is given, and no influx from a mass', () => {
    const c = concentration(400, 80, { ...SPIKE, volume: null, mass: 0.5 });
    expect(c.value).toBe(400000);
    expect(c.unit).toBe('grains/g');
    expect(c.influx).toBeNull();
  });

  it('no marker counted yet: no value, no interval', () => {
    expect(concentration(120, 0, SPIKE)).toMatchObject({ value: null, relativeError: null, low: null, high: null });
  });

  it('without the batch SD the error is the counting error alone', () => {
    expect(relativeError(400, 100, { ...SPIKE, perTabletSd: null })).toBeCloseTo(Math.sqrt(1 / 400 + 1 / 100), 12);
  });

  it('grains needed for a relative error goal, at the present ratio', () => {
    // 1/p' + 1/(p'/5) + 0.0008 ≤ 0.1²  →  p' ≥ 6 / 0.0092 = 652.2 → 653, i.e. 253 more.
    expect(grainsToRelativeError(400, 80, SPIKE, 0.1)).toBe(253);
    expect(relativeError(653, 653 / 5, SPIKE)!).toBeLessThanOrEqual(0.1);
    // The batch spread alone (0.028) is above a 2% goal: no count gets there.
    expect(grainsToRelativeError(400, 80, SPIKE, 0.02)).toBe(Number.POSITIVE_INFINITY);
  });
});
