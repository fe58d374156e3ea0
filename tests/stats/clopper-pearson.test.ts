import fc from 'fast-check';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { clopperPearsonInterval } from '../../src/stats/clopper-pearson.js';

describe('Clopper–Pearson exact interval', () => {
  // Newcombe R.G. (1998) Statistics in Medicine 17:857-872, table of illustrative
  // intervals, method 5 (exact, Clopper–Pearson). [pub]
  it.each([
    [81, 263, 0.2527, 0.3676],
    [15, 148, 0.0578, 0.1617],
    [0, 20, 0.0, 0.1684],
    [1, 29, 0.0009, 0.1776],
  ])('%i/%i matches Newcombe (1998): %f–%f', (x, n, low, high) => {
    const ci = clopperPearsonInterval(x, n);
    expect(ci.low).toBeCloseTo(low, 4);
    expect(ci.high).toBeCloseTo(high, 4);
  });

  it('x = n gives an upper limit of 1 and x = 0 a lower limit of 0', () => {
    expect(clopperPearsonInterval(20, 20).high).toBe(1);
    expect(clopperPearsonInterval(0, 20).low).toBe(0);
  });

  it('property: agrees with jStat’s Beta quantile (an independent implementation) to 1e-8', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 3000 }), fc.double({ min: 0, max: 1, noNaN: true }), (n, f) => {
        const x = Math.round(f * n);
        const ci = clopperPearsonInterval(x, n);
        const low = x === 0 ? 0 : jStat.beta.inv(0.025, x, n - x + 1);
        const high = x === n ? 1 : jStat.beta.inv(0.975, x + 1, n - x);
        expect(Math.abs(ci.low - low)).toBeLessThan(1e-8);
        expect(Math.abs(ci.high - high)).toBeLessThan(1e-8);
      }),
      { numRuns: 300 },
    );
  });
});
