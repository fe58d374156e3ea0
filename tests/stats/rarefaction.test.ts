import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { rarefy } from '../../src/stats/rarefaction.js';
import { GIRDLED } from '../helpers/reference-data.js';


describe('rarefaction E(S_n) and its variance', () => {
  // Reference values: R vegan 2.6-4 rarefy(Girdled, c(10, 50, 100), se = TRUE); iNEXT agrees. [ref]
  it.each([
    [10, 6.478617, 1.218025],
    [50, 15.030098, 1.842237],
    [100, 20.459426, 1.771384],
  ])('Girdled at n = %i: E = %f, SE = %f (vegan rarefy)', (n, expected, se) => {
    const r = rarefy(GIRDLED, n);
    expect(r?.expected).toBeCloseTo(expected, 6);
    expect(r?.se).toBeCloseTo(se, 6);
  });

  it('is null outside 1…N', () => {
    expect(rarefy(GIRDLED, 0)).toBeNull();
    expect(rarefy(GIRDLED, 169)).toBeNull();
    expect(rarefy([], 1)).toBeNull();
  });

  // Heck et al. (1975): a draw of one grain holds exactly one type and a draw of all N
  // holds all S, so the variance there is exactly 0 (not rounding noise).
  it('s.e. is exactly 0 at n = 1 and at n = N', () => {
    expect(rarefy(GIRDLED, 1)).toEqual({ n: 1, expected: 1, variance: 0, se: 0 });
    expect(rarefy(GIRDLED, 168)).toEqual({ n: 168, expected: 26, variance: 0, se: 0 });
    expect(rarefy([3, 400, 17], 1)?.se).toBe(0);
    expect(rarefy([5], 5)?.se).toBe(0);
  });

  const assemblage = fc.array(fc.integer({ min: 1, max: 400 }), { minLength: 1, maxLength: 60 });

  // Invariants of Hurlbert's (1971) formula.
  it('property: E(S_N) = S, E(S_1) = 1, S − E(S_{N−1}) = f1/N', () => {
    fc.assert(
      fc.property(assemblage, (counts) => {
        const total = counts.reduce((a, c) => a + c, 0);
        const s = counts.length;
        const f1 = counts.filter((c) => c === 1).length;
        expect(rarefy(counts, total)?.expected).toBeCloseTo(s, 9);
        expect(rarefy(counts, total)?.se).toBe(0);
        expect(rarefy(counts, 1)?.expected).toBe(1);
        expect(rarefy(counts, 1)?.se).toBe(0);
        if (total > 1) expect(s - (rarefy(counts, total - 1)?.expected as number)).toBeCloseTo(f1 / total, 9);
      }),
      { numRuns: 200 },
    );
  });

  it('stays finite and exact at 20,000 grains of 300 types', () => {
    const counts = Array.from({ length: 300 }, (_, i) => Math.max(1, Math.round(3000 / (i + 1))));
    let total = counts.reduce((a, c) => a + c, 0);
    counts[0]! += 20000 - total;
    total = 20000;
    const full = rarefy(counts, total);
    expect(full?.expected).toBeCloseTo(300, 8);
    const f1 = counts.filter((c) => c === 1).length;
    expect(300 - (rarefy(counts, total - 1)?.expected as number)).toBeCloseTo(f1 / total, 9);
    const mid = rarefy(counts, 500);
    expect(Number.isFinite(mid?.expected)).toBe(true);
    expect(Number.isFinite(mid?.se)).toBe(true);
    expect(mid!.se).toBeGreaterThan(0);
  });
});
