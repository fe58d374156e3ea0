import jStat from 'jstat';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { chiSquareTest, expectedCountsOk } from '../../src/stats/homogeneity.js';

describe('χ² test of homogeneity', () => {
  // scipy.stats.chi2_contingency documentation example. [pub]
  it('reproduces the scipy chi2_contingency example', () => {
    const r = chiSquareTest([
      [10, 10, 20],
      [20, 20, 20],
    ]);
    expect(r.statistic).toBeCloseTo(2.7777777777777777, 12);
    expect(r.df).toBe(2);
    expect(r.p).toBeCloseTo(0.24935220877729619, 12);
    expect(r.expected).toEqual([
      [12, 12, 16],
      [18, 18, 24],
    ]);
  });

  // Agresti, Categorical Data Analysis (2nd ed. 2002), table 3.2: party identification by
  // gender, X² = 30.1 on 2 df, adjusted residuals 4.50, 0.70, −5.32 for the first row.
  // [mem: the values are from memory of the book; the statistic follows from the table]
  it('gives Haberman’s adjusted residuals of Agresti’s party-identification example', () => {
    const r = chiSquareTest([
      [762, 327, 468],
      [484, 239, 477],
    ]);
    expect(r.statistic).toBeCloseTo(30.07, 2);
    expect((r.residuals[0] as number[]).map((v) => Number(v.toFixed(2)))).toEqual([4.5, 0.7, -5.32]);
    expect((r.residuals[1] as number[]).map((v) => Number(v.toFixed(2)))).toEqual([-4.5, -0.7, 5.32]);
  });

  // scipy 1.10.1 chi2_contingency(table, correction=False) on this 50 × 50 table, run here:
  // X² above 2,000 is where @stdlib gammainc 0.3.1 let the p-value drift. [ref]
  it('matches scipy chi2_contingency on a 50 × 50 table with X² = 2547 on 2401 df', () => {
    const table = Array.from({ length: 50 }, (_, i) => Array.from({ length: 50 }, (_, j) => 13 + ((i * i * 7 + j * 13 + i * j) % 17)));
    const r = chiSquareTest(table);
    expect(r.df).toBe(2401);
    expect(r.statistic).toBeCloseTo(2546.9449167526595, 9);
    expect(Math.abs(r.p - 0.01901893100407112) / 0.01901893100407112).toBeLessThan(1e-10);
  });

  it('property: its p-value agrees with jStat’s χ² CDF (an independent implementation)', () => {
    const table = fc.array(fc.array(fc.integer({ min: 1, max: 80 }), { minLength: 3, maxLength: 3 }), { minLength: 2, maxLength: 6 });
    fc.assert(
      fc.property(table, (t) => {
        const r = chiSquareTest(t);
        expect(Math.abs(r.p - (1 - jStat.chisquare.cdf(r.statistic, r.df)))).toBeLessThan(1e-9);
      }),
      { numRuns: 200 },
    );
  });

  it('Cochran’s rule: at most 20% of expected counts below 5, none below 1', () => {
    expect(expectedCountsOk([[5, 5, 5, 5, 4.9]])).toBe(true);
    expect(expectedCountsOk([[5, 5, 5, 4.9, 4.9]])).toBe(false);
    expect(expectedCountsOk([[9, 9, 9, 9, 9, 9, 9, 9, 9, 0.9]])).toBe(false);
  });
});
