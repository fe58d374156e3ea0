import { gammaln } from './special-functions.js';

export interface Rarefied {
  readonly n: number;
  /** E(S_n): expected number of types among n grains drawn without replacement. */
  readonly expected: number;
  readonly variance: number;
  readonly se: number;
}

/**
 * C(a, n) / C(N, n) in logs: the binomial coefficients overflow long before a
 * count of 20,000 grains, their log-gamma differences do not.
 */
function ratioFor(total: number, n: number): (a: number) => number {
  const base = gammaln(total - n + 1) - gammaln(total + 1);
  const cache = new Map<number, number>();
  return (a) => {
    if (a < n) return 0;
    let r = cache.get(a);
    if (r === undefined) {
      r = Math.exp(gammaln(a + 1) - gammaln(a - n + 1) + base);
      cache.set(a, r);
    }
    return r;
  };
}

/**
 * Rarefaction (Hurlbert 1971): E(S_n) = Σ 1 − C(N−N_i, n)/C(N, n), with the
 * variance of Heck, van Belle & Simberloff (1975). null when n is outside 1…N.
 * `withVariance: false` skips the O(S²) variance for drawing curves.
 */
export function rarefy(counts: readonly number[], n: number, withVariance = true): Rarefied | null {
  const present = counts.filter((c) => c > 0);
  const total = present.reduce((a, c) => a + c, 0);
  if (!Number.isInteger(n) || n < 1 || n > total) return null;
  // One grain is always one type, and all N grains are always all S: no spread there,
  // whatever the rounding of the log-gamma ratios (which leaves an s.e. near 1e-5 at n = 1).
  if (n === 1) return { n, expected: 1, variance: 0, se: 0 };
  if (n === total) return { n, expected: present.length, variance: 0, se: 0 };
  const ratio = ratioFor(total, n);
  const p = present.map((c) => ratio(total - c));
  let expected = 0;
  for (const pi of p) expected += 1 - pi;
  if (!withVariance) return { n, expected, variance: Number.NaN, se: Number.NaN };
  let variance = 0;
  for (let i = 0; i < p.length; i++) {
    const pi = p[i] as number;
    variance += pi * (1 - pi);
    for (let j = i + 1; j < p.length; j++) {
      variance += 2 * (ratio(total - (present[i] as number) - (present[j] as number)) - pi * (p[j] as number));
    }
  }
  variance = Math.max(0, variance);
  return { n, expected, variance, se: Math.sqrt(variance) };
}
