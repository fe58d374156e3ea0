import { createRequire } from 'node:module';

// The @stdlib special functions are many small CommonJS modules: loading them costs
// tens of milliseconds. They are loaded on first use, so commands and the first
// frame of the counting screen do not wait for functions they may never call.
const require = createRequire(import.meta.url);

type BetaQuantile = typeof import('@stdlib/stats-base-dists-beta-quantile');
type ChisquareQuantile = typeof import('@stdlib/stats-base-dists-chisquare-quantile');
type ChisquareCdf = typeof import('@stdlib/stats-base-dists-chisquare-cdf');
type PoissonCdf = typeof import('@stdlib/stats-base-dists-poisson-cdf');
type Gammaln = typeof import('@stdlib/math-base-special-gammaln');

function lazy<F>(id: string): () => F {
  let f: F | undefined;
  return () => (f ??= require(id) as F);
}

const beta = lazy<BetaQuantile>('@stdlib/stats-base-dists-beta-quantile');
const chiQ = lazy<ChisquareQuantile>('@stdlib/stats-base-dists-chisquare-quantile');
const chiP = lazy<ChisquareCdf>('@stdlib/stats-base-dists-chisquare-cdf');
const pois = lazy<PoissonCdf>('@stdlib/stats-base-dists-poisson-cdf');
const lgam = lazy<Gammaln>('@stdlib/math-base-special-gammaln');

/** Quantile of the Beta(a, b) distribution. */
export const betaQuantile = (p: number, a: number, b: number): number => beta()(p, a, b);
/** Quantile of the χ² distribution with k degrees of freedom. */
export const chisquareQuantile = (p: number, k: number): number => chiQ()(p, k);
/** CDF of the χ² distribution with k degrees of freedom. */
export const chisquareCdf = (x: number, k: number): number => chiP()(x, k);
/** CDF of the Poisson distribution with mean λ. */
export const poissonCdf = (x: number, lambda: number): number => pois()(x, lambda);
/** ln Γ(x). */
export const gammaln = (x: number): number => lgam()(x);
