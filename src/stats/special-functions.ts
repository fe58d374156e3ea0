import { createRequire } from 'node:module';
import { gammaP, gammaQ } from './incomplete-gamma.js';

// The @stdlib special functions are many small CommonJS modules: loading them costs
// tens of milliseconds. They are loaded on first use, so commands and the first
// frame of the counting screen do not wait for functions they may never call.
// In the bundle, scripts/bundle.mjs turns each load('…') into a read of stdlib.cjs beside the
// chunks (through code-cache.cjs and V8's code cache), still only on first use.
const load = createRequire(import.meta.url);

type BetaQuantile = typeof import('@stdlib/stats-base-dists-beta-quantile');
type ChisquareQuantile = typeof import('@stdlib/stats-base-dists-chisquare-quantile');
type Gammaln = typeof import('@stdlib/math-base-special-gammaln');

function lazy<F>(get: () => F): () => F {
  let f: F | undefined;
  return () => (f ??= get());
}

const beta = lazy(() => load('@stdlib/stats-base-dists-beta-quantile') as BetaQuantile);
const chiQ = lazy(() => load('@stdlib/stats-base-dists-chisquare-quantile') as ChisquareQuantile);
const lgam = lazy(() => load('@stdlib/math-base-special-gammaln') as Gammaln);

/** Quantile of the Beta(a, b) distribution. */
export const betaQuantile = (p: number, a: number, b: number): number => beta()(p, a, b);
/** Quantile of the χ² distribution with k degrees of freedom. */
export const chisquareQuantile = (p: number, k: number): number => chiQ()(p, k);

// The χ² and Poisson CDFs are @stdlib's (same edge cases), on the corrected
// incomplete gamma of incomplete-gamma.ts.

/** CDF of the χ² distribution with k degrees of freedom. */
export function chisquareCdf(x: number, k: number): number {
  if (Number.isNaN(x) || Number.isNaN(k) || k < 0) return Number.NaN;
  if (k === 0) return x < 0 ? 0 : 1;
  if (x <= 0) return 0;
  if (x === Number.POSITIVE_INFINITY) return 1;
  return gammaP(k / 2, x / 2);
}

/** Upper tail of the χ² distribution, P(χ²_k > x): taken as Q directly, not 1 − CDF, so small p-values keep their digits. */
export function chisquareUpperTail(x: number, k: number): number {
  if (Number.isNaN(x) || Number.isNaN(k) || k < 0) return Number.NaN;
  if (k === 0) return x < 0 ? 1 : 0;
  if (x <= 0) return 1;
  if (x === Number.POSITIVE_INFINITY) return 0;
  return gammaQ(k / 2, x / 2);
}

/** CDF of the Poisson distribution with mean λ: P(X ≤ x) = Q(⌊x⌋ + 1, λ). */
export function poissonCdf(x: number, lambda: number): number {
  if (Number.isNaN(x) || Number.isNaN(lambda) || lambda < 0) return Number.NaN;
  if (x < 0) return 0;
  if (lambda === 0 || x === Number.POSITIVE_INFINITY) return 1;
  return gammaQ(Math.floor(x) + 1, lambda);
}

/** ln Γ(x). */
export const gammaln = (x: number): number => lgam()(x);
