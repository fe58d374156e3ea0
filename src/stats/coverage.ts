import type { Frequencies } from './frequencies.js';
import { Z95 } from './wilson.js';

/** Good (1953) / Turing: the share of grains belonging to types already seen, 1 − f1/n. */
export function goodTuringCoverage({ n, f1 }: Frequencies): number | null {
  return n > 0 ? 1 - f1 / n : null;
}

/**
 * The factor that Chao & Jost (2012, Ecology 93:2533-2547) put on f1/n; it is
 * also the ratio by which the uncovered share shrinks per extra grain.
 */
function shrink({ n, f1, f2 }: Frequencies): number {
  if (f1 === 0) return 0;
  if (f2 > 0) return ((n - 1) * f1) / ((n - 1) * f1 + 2 * f2);
  return ((n - 1) * (f1 - 1)) / ((n - 1) * (f1 - 1) + 2);
}

/** Sample coverage, Chao & Jost (2012): the estimated share of the slide's grains that belong to types already counted. */
export function chaoJostCoverage(freq: Frequencies): number | null {
  if (freq.n === 0) return null;
  return 1 - (freq.f1 / freq.n) * shrink(freq);
}

/**
 * Grains still to count before the estimated coverage reaches `goal`, from the
 * coverage of an extended sample (Chao & Jost 2012, eq. 9 for n + m grains):
 * 1 − (f1/n)·r^(m+1). It assumes the assemblage seen so far is representative;
 * null when it cannot say (nothing counted yet).
 */
export function grainsToCoverage(freq: Frequencies, goal: number): number | null {
  const now = chaoJostCoverage(freq);
  if (now === null) return null;
  if (now >= goal) return 0;
  const r = shrink(freq);
  if (r <= 0) return 0;
  const m = Math.log(((1 - goal) * freq.n) / freq.f1) / Math.log(r) - 1;
  return Math.max(1, Math.ceil(m));
}

export type Chao1Variant = 'iNEXT (Chao et al. 2014)';

export interface RichnessEstimate {
  readonly estimate: number;
  readonly se: number;
  /**
   * 95% interval: from the log-normal transform of the unseen types (Chao 1987), or,
   * when none is estimated unseen, iNEXT's interval about S/(1 − P) (see nothingUnseen).
   */
  readonly low: number;
  readonly high: number;
  readonly variant: Chao1Variant;
}

const VARIANT: Chao1Variant = 'iNEXT (Chao et al. 2014)';

/**
 * Chao1 richness, in the form iNEXT uses (Chao et al. 2014): S + ((n−1)/n)·f1²/(2 f2),
 * or S + ((n−1)/n)·f1(f1−1)/2 when no type is seen twice; with its variance and the
 * log-normal interval, whose lower limit never falls below the types observed.
 */
export function chao1(freq: Frequencies): RichnessEstimate | null {
  const { n, s, f1, f2 } = freq;
  if (n === 0) return null;
  if (f1 === 0 || (f1 === 1 && f2 === 0)) return nothingUnseen(freq);
  const a = (n - 1) / n;
  let unseen: number;
  let variance: number;
  if (f2 > 0) {
    const r = f1 / f2;
    unseen = (a * f1 * f1) / (2 * f2);
    variance = f2 * ((a * r ** 2) / 2 + a ** 2 * r ** 3 + (a ** 2 * r ** 4) / 4);
  } else {
    unseen = (a * f1 * (f1 - 1)) / 2;
    variance = (a * f1 * (f1 - 1)) / 2 + (a ** 2 * f1 * (2 * f1 - 1) ** 2) / 4 - (a ** 2 * f1 ** 4) / (4 * (s + unseen));
  }
  const estimate = s + unseen;
  variance = Math.max(0, variance);
  const k = Math.exp(Z95 * Math.sqrt(Math.log(1 + variance / unseen ** 2)));
  return { estimate, se: Math.sqrt(variance), low: s + unseen / k, high: s + unseen * k, variant: VARIANT };
}

/**
 * f1 = 0, or one singleton and no doubleton: the estimate is S, but not without error.
 * iNEXT's ChaoRichness (R/EstIndex.R) then takes, over the observed counts X_i,
 * var = Σ e^(−X_i)(1 − e^(−X_i)) − (Σ X_i e^(−X_i))²/n, and the interval
 * S/(1 − P) ± z·se/(1 − P) with P = Σ e^(−X_i)/S, its lower limit not below S.
 */
function nothingUnseen({ n, s, counts }: Frequencies): RichnessEstimate {
  let spread = 0;
  let tilt = 0;
  let missed = 0;
  for (const x of counts) {
    const e = Math.exp(-x);
    spread += e * (1 - e);
    tilt += x * e;
    missed += e;
  }
  const se = Math.sqrt(Math.max(0, spread - tilt ** 2 / n));
  const stretch = 1 / (1 - missed / s);
  return { estimate: s, se, low: Math.max(s, s * stretch - Z95 * se * stretch), high: s * stretch + Z95 * se * stretch, variant: VARIANT };
}
