import { betaQuantile } from './special-functions.js';
import type { Interval } from './wilson.js';

/**
 * Clopper & Pearson (1934) "exact" interval for x/n: the Beta quantiles that
 * invert the binomial tails. Conservative (covers at least 1 − alpha), which is
 * what a marker ratio wants; Wilson stays the default for taxon shares.
 */
export function clopperPearsonInterval(x: number, n: number, alpha = 0.05): Interval {
  if (n <= 0) return { low: 0, high: 1 };
  const low = x <= 0 ? 0 : betaQuantile(alpha / 2, x, n - x + 1);
  const high = x >= n ? 1 : betaQuantile(1 - alpha / 2, x + 1, n - x);
  return { low, high };
}
