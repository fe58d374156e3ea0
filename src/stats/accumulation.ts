import { inPollenSum } from '../keymap/keymap.js';
import type { LevelCounts } from './level-counts.js';
import { rarefy } from './rarefaction.js';

export interface SaturationCurve {
  /** Grains of the pollen sum counted. */
  readonly grains: number;
  /** Types of the sum found after n grains, for n = 0 … grains (observed[0] = 0): a step line. */
  readonly observed: readonly number[];
  /** E(S_n) of the present counts (Hurlbert 1971) at the grain numbers in `at`. */
  readonly expected: readonly number[];
  readonly at: readonly number[];
  readonly sinceNewType: number;
}

/**
 * Types found against grains counted, in the order they were counted, beside the
 * rarefaction expectation of the counts as they stand (Birks & Line 1992 for
 * pollen). `points` sample the expectation, enough for the width of a plot.
 */
export function saturationCurve(state: LevelCounts, points = 60): SaturationCurve {
  const sumGrains: { seq: number; taxon: string }[] = [];
  for (let s = state.stack; s; s = s.below) if (inPollenSum(state.keymap, s.taxon)) sumGrains.push({ seq: s.seq, taxon: s.taxon });
  sumGrains.reverse();
  const observed = [0];
  let types = 0;
  for (const g of sumGrains) {
    if (state.firstSeen[g.taxon] === g.seq) types++;
    observed.push(types);
  }
  const counts = Object.entries(state.counts)
    .filter(([taxon]) => inPollenSum(state.keymap, taxon))
    .map(([, c]) => c);
  const n = sumGrains.length;
  const at = n === 0 ? [] : [...new Set(Array.from({ length: Math.min(points, n) }, (_, i) => Math.max(1, Math.round(((i + 1) * n) / Math.min(points, n)))))];
  const expected = at.map((k) => rarefy(counts, k, false)?.expected ?? 0);
  return { grains: n, observed, expected, at, sinceNewType: state.sinceNewType };
}
