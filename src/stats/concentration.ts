import { clopperPearsonInterval } from './clopper-pearson.js';

/** What was added to the sample before preparation: exotic marker tablets of one batch. */
export interface Spike {
  readonly tablets: number;
  /** The batch's mean marker spores per tablet. */
  readonly perTablet: number;
  /** The batch's standard deviation per tablet; null when not known. */
  readonly perTabletSd: number | null;
  /** Sample volume in cm³, or mass in g: exactly one is set. */
  readonly volume: number | null;
  readonly mass: number | null;
  /** Sediment accumulation rate in cm per year, for influx; null when not known. */
  readonly accumulationRate: number | null;
}

export type ConcentrationUnit = 'grains/cm3' | 'grains/g';

export interface Concentration {
  /** Grains counted (the pollen sum, or one taxon) and markers counted. */
  readonly grains: number;
  readonly markers: number;
  /** null until a marker is counted. */
  readonly value: number | null;
  /** Relative standard error, as a fraction. */
  readonly relativeError: number | null;
  /** 95% interval taking the markers added as known (Regal & Cushing 1979). */
  readonly low: number | null;
  readonly high: number | null;
  readonly unit: ConcentrationUnit;
  /** Concentration × accumulation rate, grains cm⁻² yr⁻¹; null without a rate or with a mass. */
  readonly influx: number | null;
}

export function markersAdded(spike: Spike): number {
  return spike.tablets * spike.perTablet;
}

/** (σ_M/M)² for t tablets of SD s each: σ_M = s·√t. */
function batchVariance(spike: Spike): number {
  if (spike.perTabletSd === null) return 0;
  return (spike.perTabletSd * Math.sqrt(spike.tablets)) ** 2 / markersAdded(spike) ** 2;
}

/**
 * Relative error of a marker concentration with p grains and m markers: independent
 * Poisson counts plus the batch spread, (σ_C/C)² ≈ 1/p + 1/m + (σ_M/M)² (after Maher 1981).
 */
export function relativeError(p: number, m: number, spike: Spike): number | null {
  if (p <= 0 || m <= 0) return null;
  return Math.sqrt(1 / p + 1 / m + batchVariance(spike));
}

/**
 * Grains to add to the count (at the present grains-to-markers ratio) for the
 * relative error to fall to `goal`; Infinity when the batch spread alone exceeds it.
 */
export function grainsToRelativeError(p: number, m: number, spike: Spike, goal: number): number | null {
  if (p <= 0 || m <= 0) return null;
  const room = goal ** 2 - batchVariance(spike);
  if (room <= 0) return Number.POSITIVE_INFINITY;
  const needed = (1 + p / m) / room;
  return Math.max(0, Math.ceil(needed - p));
}

/**
 * Concentration by the exotic-marker method (Benninghoff 1962; Stockmarr 1971):
 * C = (p/m)·(M/V). The interval is exact for the ratio: given p + m, p is binomial
 * with θ = p/(p + m); θ's Clopper–Pearson limits become θ/(1 − θ)·M/V.
 */
export function concentration(p: number, m: number, spike: Spike): Concentration {
  const per = spike.volume ?? spike.mass ?? 1;
  const unit: ConcentrationUnit = spike.volume !== null ? 'grains/cm3' : 'grains/g';
  const scale = markersAdded(spike) / per;
  if (m <= 0) return { grains: p, markers: m, value: null, relativeError: null, low: null, high: null, unit, influx: null };
  const value = (p / m) * scale;
  const theta = clopperPearsonInterval(p, p + m);
  const toConc = (t: number) => (t / (1 - t)) * scale;
  const influx = spike.accumulationRate !== null && spike.volume !== null ? value * spike.accumulationRate : null;
  return {
    grains: p,
    markers: m,
    value,
    relativeError: relativeError(p, m, spike),
    low: toConc(theta.low),
    high: toConc(theta.high),
    unit,
    influx,
  };
}
