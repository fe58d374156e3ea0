import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { goodmanIntervals, sisonGlazIntervals } from '../../src/stats/simultaneous.js';
import { wilsonInterval } from '../../src/stats/wilson.js';
import chisquareQuantile from '@stdlib/stats-base-dists-chisquare-quantile';

const EXAMPLE_1 = [56, 72, 73, 59, 62, 87, 58];
const EXAMPLE_3 = [...Array(10).fill(1), ...Array(10).fill(12), ...Array(10).fill(5), ...Array(10).fill(3), ...Array(10).fill(4)] as number[];

describe('Goodman (1965) simultaneous intervals', () => {
  // Sison C.P. & Glaz J. (1995) JASA 90:366-369, example 1, Goodman limits as printed to 3 decimals. [pub]
  it('reproduces the Goodman limits printed by Sison & Glaz (1995), example 1', () => {
    const printed = [[0.085, 0.166], [0.115, 0.204], [0.116, 0.207], [0.091, 0.173], [0.096, 0.181], [0.143, 0.239], [0.089, 0.171]];
    goodmanIntervals(EXAMPLE_1).forEach((ci, i) => {
      expect(ci.low).toBeCloseTo(printed[i]![0]!, 3);
      expect(ci.high).toBeCloseTo(printed[i]![1]!, 3);
    });
  });

  // Same paper, example 3 (50 cells), Goodman limits, as carried in statsmodels' test data. [pub]
  it('reproduces Sison & Glaz (1995) example 3 with 50 cells', () => {
    const printed = [[0, 0.049], [0.019, 0.114], [0.005, 0.075], [0.002, 0.062], [0.004, 0.069]];
    const cis = goodmanIntervals(EXAMPLE_3);
    printed.forEach(([low, high], block) => {
      expect(cis[block * 10]!.low).toBeCloseTo(low!, 3);
      expect(cis[block * 10]!.high).toBeCloseTo(high!, 3);
    });
  });

  it('is the Wilson interval at the Bonferroni z when there are two cells', () => {
    const z = Math.sqrt(chisquareQuantile(1 - 0.05 / 2, 1));
    const [g] = goodmanIntervals([10, 30]);
    const w = wilsonInterval(10, 40, z);
    expect(g!.low).toBeCloseTo(w.low, 12);
    expect(g!.high).toBeCloseTo(w.high, 12);
  });

  it('its χ² quantile agrees with jStat (an independent implementation)', () => {
    for (const k of [2, 7, 30, 150]) expect(chisquareQuantile(1 - 0.05 / k, 1)).toBeCloseTo(jStat.chisquare.inv(1 - 0.05 / k, 1), 8);
  });
});

describe('Sison & Glaz (1995) simultaneous intervals', () => {
  // Sison & Glaz (1995) example 1; limits computed by R MultinomialCI, as carried in
  // statsmodels' test data (results_multinomial_proportions.py). [ref]
  it('reproduces example 1 to 1e-4', () => {
    const reference = [
      [0.07922912, 0.1643361], [0.11349036, 0.1985973], [0.11563169, 0.2007386], [0.0856531, 0.1707601],
      [0.09207709, 0.177184], [0.14561028, 0.2307172], [0.08351178, 0.1686187],
    ];
    sisonGlazIntervals(EXAMPLE_1).forEach((ci, i) => {
      expect(Math.abs(ci.low - reference[i]![0]!)).toBeLessThan(1e-4);
      expect(Math.abs(ci.high - reference[i]![1]!)).toBeLessThan(1e-4);
    });
  });

  // Examples 2 and 3 of the paper, same reference; statsmodels itself matches R only to
  // its decimal=4 tolerance (1.5e-4) there, the Edgeworth step amplifying rounding. [ref]
  it('reproduces examples 2 (fifty cells of 5) and 3 (50 cells) to 1.5e-4', () => {
    for (const ci of sisonGlazIntervals(Array(50).fill(5))) {
      expect(ci.low).toBe(0);
      expect(Math.abs(ci.high - 0.05304026)).toBeLessThan(1.5e-4);
    }
    const reference = [[0, 0.04120118], [0.012, 0.08520118], [0, 0.05720118], [0, 0.04920118], [0, 0.05320118]];
    const cis = sisonGlazIntervals(EXAMPLE_3);
    reference.forEach(([low, high], block) => {
      expect(Math.abs(cis[block * 10]!.low - low!)).toBeLessThan(1.5e-4);
      expect(Math.abs(cis[block * 10]!.high - high!)).toBeLessThan(1.5e-4);
    });
  });

  // R MultinomialCI with an empty cell, as carried in statsmodels' test data
  // (test_confint_multinomial_proportions_zeros, counts 56, 0.1, 73, …). [ref]
  it('matches R MultinomialCI when one cell is nearly empty, to 1e-5', () => {
    const reference = [0.09364718, 0.1898413, 0, 0.0483581, 0.13667426, 0.2328684, 0.10124019, 0.1974343];
    const cis = sisonGlazIntervals([56, 0.1, 73, 59, 62, 87, 58]);
    for (let i = 0; i < 4; i++) {
      expect(Math.abs(cis[i]!.low - reference[2 * i]!)).toBeLessThan(1e-5);
      expect(Math.abs(cis[i]!.high - reference[2 * i + 1]!)).toBeLessThan(1e-5);
    }
  });

  // Issue 9 quotes statsmodels 0.15 multinomial_proportions_confint(method='sison-glaz') as
  // percentages to 4 decimals; the full limits are from statsmodels 0.13.5 on this machine,
  // which agrees with those. A type of over 1,000 grains puts the Poisson CDFs of the
  // coverage probability where @stdlib gammainc 0.3.1 is wrong. [ref]
  it.each([
    [[1001, 100, 90, 80, 70, 60, 50], [[0.6678152998, 0.7130823535], [0.04686423156, 0.09213128525], [0.0399724328, 0.08523948649], [0.03308063405, 0.07834768773], [0.02618883529, 0.07145588897], [0.01929703653, 0.06456409021], [0.01240523777, 0.05767229145]]],
    [[1500, 300, 200, 120, 90, 60, 40, 30], [[0.6222222222, 0.6601673753], [0.1094017094, 0.1473468625], [0.06666666667, 0.1046118197], [0.03247863248, 0.07042378555], [0.01965811966, 0.05760327273], [0.006837606838, 0.04478275991], [0, 0.03623575136], [0, 0.03196224709]]],
  ])('matches statsmodels with a type of more than 1,000 grains: %j', (counts, reference) => {
    sisonGlazIntervals(counts).forEach((ci, i) => {
      expect(Math.abs(ci.low - reference[i]![0]!)).toBeLessThan(1e-8);
      expect(Math.abs(ci.high - reference[i]![1]!)).toBeLessThan(1e-8);
    });
  });

  it('gives the limits quoted in issue 9 (statsmodels 0.15, in percent)', () => {
    const pct = (ci: { low: number; high: number }) => [Number((100 * ci.low).toFixed(4)), Number((100 * ci.high).toFixed(4))];
    expect(pct(sisonGlazIntervals([1001, 100, 90, 80, 70, 60, 50])[6]!)).toEqual([1.2405, 5.7672]);
    const big = sisonGlazIntervals([1500, 300, 200, 120, 90, 60, 40, 30]);
    expect(pct(big[0]!)).toEqual([62.2222, 66.0167]);
    expect(pct(big[7]!)).toEqual([0, 3.1962]);
  });

  it('is narrower than Goodman’s when there are many types', () => {
    const sg = sisonGlazIntervals(EXAMPLE_3);
    const g = goodmanIntervals(EXAMPLE_3);
    expect(sg[15]!.high - sg[15]!.low).toBeLessThan(g[15]!.high - g[15]!.low);
  });
});
