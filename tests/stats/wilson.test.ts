import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { wilsonInterval, Z95 } from '../../src/stats/wilson.js';

describe('Wilson score interval', () => {
  // Newcombe R.G. (1998) Two-sided confidence intervals for the single proportion:
  // comparison of seven methods. Statistics in Medicine 17:857-872, table of
  // illustrative intervals (method 3, score without continuity correction). [pub]
  it.each([
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0.0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ])('%i/%i matches Newcombe (1998): %f–%f', (x, n, low, high) => {
    const ci = wilsonInterval(x, n);
    expect(ci.low).toBeCloseTo(low, 4);
    expect(ci.high).toBeCloseTo(high, 4);
  });

  it('uses z = Φ⁻¹(0.975) exactly, not 1.96', () => {
    expect(Z95).toBe(1.959963984540054);
  });

  it('at x = 0 the upper limit is (z²/n)/(1 + z²/n)', () => {
    const n = 37;
    const z2 = Z95 * Z95;
    expect(wilsonInterval(0, n).high).toBeCloseTo(z2 / n / (1 + z2 / n), 14);
    expect(wilsonInterval(0, n).low).toBe(0);
  });

  it('property: Wilson(x, n) mirrors Wilson(n − x, n) about ½ and contains x/n', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5000 }), fc.double({ min: 0, max: 1, noNaN: true }), (n, f) => {
        const x = Math.round(f * n);
        const a = wilsonInterval(x, n);
        const b = wilsonInterval(n - x, n);
        expect(a.low).toBeCloseTo(1 - b.high, 12);
        expect(a.high).toBeCloseTo(1 - b.low, 12);
        expect(a.low).toBeLessThanOrEqual(x / n + 1e-12);
        expect(a.high).toBeGreaterThanOrEqual(x / n - 1e-12);
      }),
    );
  });
});
