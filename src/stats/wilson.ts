/** Φ⁻¹(0.975) to full precision: some published 4-decimal limits only reproduce with it, not with 1.96. */
export const Z95 = 1.959963984540054;

export interface Interval {
  readonly low: number;
  readonly high: number;
}

/**
 * Wilson (1927) score interval for a binomial share x/n, limits clamped to [0, 1].
 * Chosen as the default because it behaves at zero and small counts, where the
 * textbook normal interval collapses to a point.
 */
export function wilsonInterval(x: number, n: number, z: number = Z95): Interval {
  if (n <= 0) return { low: 0, high: 1 };
  const p = x / n;
  const z2 = z * z;
  const denom = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denom;
  const half = (z / denom) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  return { low: Math.max(0, centre - half), high: Math.min(1, centre + half) };
}
