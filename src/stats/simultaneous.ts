import { chisquareQuantile, gammaln, poissonCdf } from './special-functions.js';
import type { Interval } from './wilson.js';

const clamp = (v: number) => Math.min(1, Math.max(0, v));

/**
 * Goodman (1965) simultaneous intervals for all k shares at once: Wilson-type
 * limits with A the χ²₁ quantile at 1 − α/k (a Bonferroni split of α).
 */
export function goodmanIntervals(counts: readonly number[], alpha = 0.05): Interval[] {
  const n = counts.reduce((a, c) => a + c, 0);
  const k = counts.length;
  if (n === 0 || k === 0) return counts.map(() => ({ low: 0, high: 1 }));
  const a = chisquareQuantile(1 - alpha / k, 1);
  return counts.map((x) => {
    const root = Math.sqrt(a * (a + (4 * x * (n - x)) / n));
    return { low: clamp((a + 2 * x - root) / (2 * (n + a))), high: clamp((a + 2 * x + root) / (2 * (n + a))) };
  });
}

/** P(lo ≤ Y ≤ hi) for Y ~ Poisson(λ). */
function poissonRange(lo: number, hi: number, lambda: number): number {
  if (hi < lo || hi < 0) return 0;
  return poissonCdf(hi, lambda) - (lo > 0 ? poissonCdf(lo - 1, lambda) : 0);
}

/** P(Y = k) for Y ~ Poisson(λ). */
function poissonPmf(k: number, lambda: number): number {
  if (k < 0) return 0;
  if (lambda === 0) return k === 0 ? 1 : 0;
  return Math.exp(k * Math.log(lambda) - lambda - gammaln(k + 1));
}

/** P(top − r + 1 ≤ Y ≤ top) for r = 1..4, from P(Y = top) by the pmf's own recurrence (no CDF calls). */
function tailsBelow(top: number, lambda: number): [number, number, number, number] {
  const sums: [number, number, number, number] = [0, 0, 0, 0];
  let p = poissonPmf(top, lambda);
  let sum = 0;
  for (let r = 0; r < 4; r++) {
    const k = top - r;
    if (k >= 0) sum += p;
    sums[r] = sum;
    // P(Y = k − 1) = P(Y = k) · k / λ
    p = k > 0 && lambda > 0 ? (p * k) / lambda : 0;
  }
  return sums;
}

/**
 * Mean, variance, third central moment and fourth cumulant of Y ~ Poisson(λ)
 * truncated to [b, a], from its factorial moments, and P(b ≤ Y ≤ a).
 * The moments need P(a − r + 1 ≤ Y ≤ a) and P(b − r ≤ Y ≤ b − 1) for r = 1..4:
 * sums of a few pmf terms, so each cell costs two CDF calls, not eighteen.
 */
function truncatedPoisson(lambda: number, b: number, a: number) {
  const inside = poissonRange(b, a, lambda);
  const upper = tailsBelow(a, lambda);
  const lower = tailsBelow(b - 1, lambda);
  const mu = [0, 1, 2, 3].map((i) => lambda ** (i + 1) * (1 - ((upper[i] as number) - (lower[i] as number)) / inside));
  const [m1, m2, m3, m4] = mu as [number, number, number, number];
  const variance = m2 + m1 - m1 ** 2;
  const third = m3 + m2 * (3 - 3 * m1) + (m1 - 3 * m1 ** 2 + 2 * m1 ** 3);
  const fourth = m4 + m3 * (6 - 4 * m1) + m2 * (7 - 12 * m1 + 6 * m1 ** 2) + m1 - 4 * m1 ** 2 + 6 * m1 ** 3 - 3 * m1 ** 4;
  return { inside, mean: m1, variance, third, cumulant4: fourth - 3 * variance ** 2 };
}

/**
 * ν(c) = P(x_i − c ≤ X_i ≤ x_i + c for every cell), X multinomial(n, x/n):
 * Levin's (1981) representation through independent Poisson cells, with the sum's
 * density from an Edgeworth expansion, as Sison & Glaz (1995) do.
 */
function coverageProbability(counts: readonly number[], n: number, c: number): number {
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let s4 = 0;
  let logInside = 0;
  for (const x of counts) {
    const t = truncatedPoisson(x, Math.max(0, x - c), x + c);
    s1 += t.mean;
    s2 += t.variance;
    s3 += t.third;
    s4 += t.cumulant4;
    logInside += Math.log(t.inside);
  }
  const z = (n - s1) / Math.sqrt(s2);
  const g1 = s3 / s2 ** 1.5;
  const g2 = s4 / s2 ** 2;
  const poly = 1 + (g1 * (z ** 3 - 3 * z)) / 6 + (g2 * (z ** 4 - 6 * z ** 2 + 3)) / 24 + (g1 ** 2 * (z ** 6 - 15 * z ** 4 + 45 * z ** 2 - 15)) / 72;
  const density = (poly * Math.exp(-(z ** 2) / 2)) / Math.sqrt(2 * Math.PI) / Math.sqrt(s2);
  // n! / (n^n e^-n) = 1 / P(Poisson(n) = n), in logs.
  const logInverseMode = gammaln(n + 1) - n * Math.log(n) + n;
  return Math.exp(logInverseMode + logInside) * density;
}

/**
 * Sison & Glaz (1995, JASA 90:366-369) simultaneous intervals: [p_i − c/n, p_i + (c + 2γ)/n],
 * with c the widest integer whose coverage ν(c) stays below 1 − α and γ interpolating to 1 − α.
 * Tighter than Goodman's when there are many types.
 */
export function sisonGlazIntervals(counts: readonly number[], alpha = 0.05): Interval[] {
  const n = counts.reduce((a, x) => a + x, 0);
  if (n === 0) return counts.map(() => ({ low: 0, high: 1 }));
  let previous = 0;
  let c = 0;
  let reached = 0;
  for (let cc = 1; cc <= n; cc++) {
    const nu = coverageProbability(counts, n, cc);
    if (nu > 1 - alpha && previous < 1 - alpha) {
      c = cc - 1;
      reached = nu;
      break;
    }
    previous = nu;
  }
  const gamma = reached > previous ? (1 - alpha - previous) / (reached - previous) : 0;
  return counts.map((x) => ({ low: clamp(x / n - c / n), high: clamp(x / n + (c + 2 * gamma) / n) }));
}
