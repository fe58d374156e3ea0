import { describe, expect, it } from 'vitest';
import { chao1, chaoJostCoverage, goodTuringCoverage, grainsToCoverage } from '../../src/stats/coverage.js';
import { frequencies } from '../../src/stats/frequencies.js';
import { GIRDLED } from '../helpers/reference-data.js';

describe('coverage and richness', () => {
  const freq = frequencies(GIRDLED);

  it('counts the frequencies of the Girdled stand: n 168, S 26, f1 12, f2 4', () => {
    expect(freq).toMatchObject({ n: 168, s: 26, f1: 12, f2: 4 });
    expect(freq.counts).toEqual(GIRDLED);
  });

  // R iNEXT DataInfo on the spider data, stand Girdled: SC 0.9289. [ref]
  it('Chao & Jost (2012) coverage of Girdled is 0.9289 (iNEXT DataInfo)', () => {
    expect(chaoJostCoverage(freq)).toBeCloseTo(0.9289, 4);
  });

  // Good (1953) 1 − f1/n = 1 − 12/168. [mem: Good 1953; value is arithmetic]
  it('Good–Turing coverage of Girdled is 0.928571', () => {
    expect(goodTuringCoverage(freq)).toBeCloseTo(0.928571, 6);
  });

  // R iNEXT ChaoRichness on Girdled: estimator 43.893, s.e. 14.306. [ref]
  it('Chao1 (iNEXT form) of Girdled is 43.893 with s.e. 14.306 (iNEXT ChaoRichness)', () => {
    const c = chao1(freq);
    expect(c?.estimate).toBeCloseTo(43.893, 3);
    expect(c?.se).toBeCloseTo(14.306, 3);
    expect(c?.variant).toMatch(/iNEXT/);
    expect(c!.low).toBeGreaterThanOrEqual(26);
    expect(c!.low).toBeLessThan(c!.estimate);
    expect(c!.high).toBeGreaterThan(c!.estimate);
  });

  it('with no doubletons uses the f2 = 0 forms', () => {
    const f = frequencies([10, 5, 1, 1, 1]); // n 18, S 5, f1 3, f2 0
    expect(chaoJostCoverage(f)).toBeCloseTo(1 - (3 / 18) * ((17 * 2) / (17 * 2 + 2)), 12);
    expect(chao1(f)?.estimate).toBeCloseTo(5 + (17 / 18) * 3, 12);
  });

  it('a count with no singletons has coverage 1 and Chao1 = S, with an interval above S', () => {
    const f = frequencies([10, 5, 2]);
    expect(chaoJostCoverage(f)).toBe(1);
    const c = chao1(f)!;
    expect(c).toMatchObject({ estimate: 3, low: 3 });
    expect(c.se).toBeGreaterThan(0);
    expect(c.high).toBeGreaterThan(3);
  });

  // When no type is estimated unseen (f1 = 0, or f1 = 1 and f2 = 0), iNEXT's ChaoRichness
  // (R/EstIndex.R of the iNEXT package, read in its source; R iNEXT could not be installed
  // here, so it was not run) takes var = Σ e^−Xi (1 − e^−Xi) − (Σ Xi e^−Xi)²/n and the
  // interval S/(1−P) ± z·se/(1−P), P = Σ e^−Xi / S, the lower limit not below S. Its help
  // page cites Chao (1984, 1987) for the estimator; the variance for this case is only in
  // the code. Values: that formula evaluated independently in Python (the first two are
  // issue 9's check values). [computed: iNEXT ChaoRichness formula]
  it.each([
    [[7, 4, 3, 2, 2, 12], 6, 0.529585, 7.460336],
    [[1], 1, 0.311783, 2.548698],
    [[1, 3, 4], 3, 0.504228, 4.666429],
    [[10, 5, 2], 3, 0.343936, 3.856811],
  ])('nothing estimated unseen, %j: Chao1 = S, s.e. and interval as iNEXT ChaoRichness', (counts, s, se, high) => {
    const c = chao1(frequencies(counts))!;
    expect(c.estimate).toBe(s);
    expect(c.se).toBeCloseTo(se, 6);
    expect(c.low).toBe(s);
    expect(c.high).toBeCloseTo(high, 6);
  });

  it('f1 = 0 with doubletons is also “nothing unseen” (iNEXT’s branch), not the f2 > 0 formula', () => {
    const c = chao1(frequencies([2, 2, 5]))!;
    expect(c.estimate).toBe(3);
    expect(c.se).toBeGreaterThan(0);
    expect(c.high).toBeGreaterThan(3);
  });

  it('nothing counted: no coverage, no estimate', () => {
    const f = frequencies([]);
    expect(chaoJostCoverage(f)).toBeNull();
    expect(goodTuringCoverage(f)).toBeNull();
    expect(chao1(f)).toBeNull();
  });

  // The coverage of n + m grains, Chao & Jost (2012) eq. 9: extending Girdled by the
  // predicted m reaches the goal, and m − 1 does not.
  it('grains to reach a coverage goal follow the Chao & Jost extrapolation', () => {
    const m = grainsToCoverage(freq, 0.95) as number;
    const r = (167 * 12) / (167 * 12 + 8);
    const extended = (k: number) => 1 - (12 / 168) * r ** (k + 1);
    expect(extended(m)).toBeGreaterThanOrEqual(0.95);
    expect(extended(m - 1)).toBeLessThan(0.95);
    expect(grainsToCoverage(freq, 0.9)).toBe(0);
  });
});
