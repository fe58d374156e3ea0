import { createRequire } from 'node:module';

// Loaded on first use, as in special-functions.ts.
const load = createRequire(import.meta.url);

type Gammainc = (x: number, a: number, regularized?: boolean, upper?: boolean) => number;
type Prefix = (a: number, x: number) => number;

let gammainc: Gammainc | undefined;
let prefix: Prefix | undefined;
const stdlibGammainc = () => (gammainc ??= load('@stdlib/math-base-special-gammainc') as Gammainc);
// Private to the package (no "exports" map); the version is pinned exactly and the
// tests in tests/stats/special-functions.test.ts would catch a change.
const stdlibPrefix = () => (prefix ??= load('@stdlib/math-base-special-gammainc/lib/regularised_gamma_prefix.js') as Prefix);

/**
 * The branch of @stdlib's igammaFinal (a port of Boost's) that sums the asymptotic
 * series of Q for large x. There @stdlib 0.3.1 starts the terms from a where Boost
 * starts from a − 1, and so returns (a/x)·Q(a + 1, x) for Q(a, x): a Poisson CDF
 * near its mean is off by about one count's probability (P(X ≤ 1312 | λ = 1312)
 * comes out 0.51874 for 0.50734). Only that branch is replaced here; the fix for
 * upstream (not yet sent) is stdlib-gammainc-large-x.patch beside this file.
 */
const takesLargeXBranch = (a: number, x: number) => x > 1000 && (a < x || Math.abs(a - 50) / x < 1);

function largeXQ(a: number, x: number): number {
  const lead = stdlibPrefix()(a, x) / x;
  if (lead === 0) return 0;
  // Γ(a, x) ~ x^(a−1) e^(−x) Σ (a−1)(a−2)…(a−k) / x^k (DLMF 8.11.2); stop as Boost's sum_series does.
  let sum = 0;
  let term = 1;
  let k = a - 1;
  for (let i = 0; i < 1_000_000; i++) {
    sum += term;
    if (Math.abs(term) <= Math.abs(Number.EPSILON * sum)) break;
    term *= k / x;
    k -= 1;
  }
  return Math.min(1, lead * sum);
}

/** Regularised upper incomplete gamma Q(a, x) = Γ(a, x)/Γ(a). */
export function gammaQ(a: number, x: number): number {
  if (takesLargeXBranch(a, x) && a > 0) return largeXQ(a, x);
  return stdlibGammainc()(x, a, true, true);
}

/** Regularised lower incomplete gamma P(a, x) = γ(a, x)/Γ(a) = 1 − Q(a, x). */
export function gammaP(a: number, x: number): number {
  if (takesLargeXBranch(a, x) && a > 0) return 1 - largeXQ(a, x);
  return stdlibGammainc()(x, a, true, false);
}
