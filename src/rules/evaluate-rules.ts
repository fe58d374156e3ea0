import { shortNumber } from '../text/numbers.js';
import { grainsToCoverage } from '../stats/coverage.js';
import { grainsToRelativeError, markersAdded, relativeError, type Spike } from '../stats/concentration.js';
import type { LevelStats } from '../stats/level-stats.js';
import { Z95 } from '../stats/wilson.js';
import type { RuleMode, RuleName, RuleSet } from './rule-set.js';

/**
 * Coverage estimates mean little on a handful of grains: four grains of one type
 * have no singleton and so "coverage 1". The coverage rule is judged only from this
 * pollen sum on (our choice; the optional-stopping simulation in the benchmark
 * shows what it gives).
 */
export const COVERAGE_FLOOR = 100;

export interface RuleStatus {
  readonly rule: RuleName;
  /** Short words for the screen: "pollen sum", "half-width ≤ 3 points ≥5%". */
  readonly label: string;
  /** The current value, in the rule's unit; null when it cannot be computed yet. */
  readonly value: number | null;
  readonly target: number;
  readonly met: boolean;
  /** More grains of the pollen sum this rule needs, as estimated now: 0 when met; null when unknown. */
  readonly grainsNeeded: number | null;
  /** Why grainsNeeded is unknown or unreachable, in words; null otherwise. */
  readonly note: string | null;
}

export interface RuleReport {
  readonly rules: readonly RuleStatus[];
  readonly mode: RuleMode;
  readonly minSum: number | null;
  readonly met: boolean;
  readonly grainsNeeded: number | null;
}

function status(rule: RuleName, label: string, value: number | null, target: number, met: boolean, needed: number | null, note: string | null = null): RuleStatus {
  return { rule, label, value, target, met, grainsNeeded: met ? 0 : needed, note: met || needed !== null ? null : note };
}

function precision(rules: RuleSet, stats: LevelStats): RuleStatus | null {
  const p = rules.precision;
  if (!p) return null;
  const label = `half-width ≤ ${shortNumber(p.halfWidth)} points ${p.taxa ? (p.taxa.length === 1 ? p.taxa[0] : `${p.taxa.length} taxa`) : `≥${shortNumber(p.share ?? 0)}%`}`;
  const rows = stats.table.rows.filter((r) =>
    p.taxa ? p.taxa.includes(r.taxon) : r.inSum && r.percent !== null && r.percent >= (p.share ?? 0),
  );
  const measured = rows.filter((r) => r.ciLow !== null && r.ciHigh !== null);
  if (measured.length === 0) return status('precision', label, null, p.halfWidth, false, null, 'no taxon qualifies yet');
  const worst = Math.max(...measured.map((r) => ((r.ciHigh as number) - (r.ciLow as number)) / 2));
  const met = worst <= p.halfWidth + 1e-12;
  // n ≈ z²·p(1−p)/e² for the widest qualifying taxon.
  const e = p.halfWidth / 100;
  let needed = 0;
  for (const r of measured) {
    const share = r.count / r.basis;
    needed = Math.max(needed, Math.ceil((Z95 ** 2 * share * (1 - share)) / e ** 2 - r.basis));
  }
  return status('precision', label, worst, p.halfWidth, met, Math.max(1, needed));
}

function markers(rules: RuleSet, stats: LevelStats): RuleStatus | null {
  if (rules.markers === null) return null;
  const m = stats.markers;
  const sum = stats.table.pollenSum;
  const met = m >= rules.markers;
  // At the ratio of sum grains to markers seen so far.
  const needed = m > 0 ? Math.ceil(((rules.markers - m) * sum) / m) : null;
  return status('markers', 'markers', m, rules.markers, met, needed, 'unknown until a marker is counted');
}

function concError(rules: RuleSet, stats: LevelStats, spike: Spike | null): RuleStatus | null {
  if (rules.concError === null) return null;
  const label = 'conc. error';
  if (!spike) return status('conc-error', label, null, rules.concError, false, null, 'no marker spike data recorded');
  const sum = stats.table.pollenSum;
  const value = relativeError(sum, stats.markers, spike);
  const met = value !== null && value <= rules.concError;
  const needed = grainsToRelativeError(sum, stats.markers, spike, rules.concError);
  if (needed === Number.POSITIVE_INFINITY) {
    const floor = Math.sqrt((spike.perTabletSd ?? 0) ** 2 * spike.tablets) / markersAdded(spike);
    return status('conc-error', label, value, rules.concError, false, null, `unreachable: the tablets' own spread is ${(100 * floor).toFixed(1)}%`);
  }
  return status('conc-error', label, value, rules.concError, met, needed, 'unknown until a marker is counted');
}

/** Each rule of the set on the level as it stands, and whether the set is met. */
export function evaluateRules(rules: RuleSet, stats: LevelStats, spike: Spike | null): RuleReport {
  const sum = stats.table.pollenSum;
  const list: RuleStatus[] = [];
  if (rules.targetSum !== null) {
    list.push(status('target', 'pollen sum', sum, rules.targetSum, sum >= rules.targetSum, Math.max(0, rules.targetSum - sum)));
  }
  const p = precision(rules, stats);
  if (p) list.push(p);
  if (rules.coverage !== null) {
    const early = sum < COVERAGE_FLOOR;
    const met = !early && stats.coverage !== null && stats.coverage >= rules.coverage;
    const needed = grainsToCoverage(stats.freq, rules.coverage);
    const floor = early ? COVERAGE_FLOOR - sum : 0;
    list.push(
      status('coverage', 'coverage', stats.coverage, rules.coverage, met, needed === null ? (early ? floor : null) : Math.max(needed, floor), 'unknown until grains are counted'),
    );
  }
  if (rules.plateau !== null) {
    const met = stats.sinceNewType >= rules.plateau;
    list.push(status('plateau', 'no new type', stats.sinceNewType, rules.plateau, met, rules.plateau - stats.sinceNewType));
  }
  const m = markers(rules, stats);
  if (m) list.push(m);
  const c = concError(rules, stats, spike);
  if (c) list.push(c);

  const gate = rules.minSum === null || sum >= rules.minSum;
  const anyMet = list.some((r) => r.met);
  const allMet = list.length > 0 && list.every((r) => r.met);
  const met = gate && (rules.mode === 'all' ? allMet : anyMet);
  let needed: number | null;
  if (met) needed = 0;
  else {
    const open = list.filter((r) => !r.met).map((r) => r.grainsNeeded);
    const known = open.filter((n): n is number => n !== null);
    if (rules.mode === 'all') needed = anyMet && open.length === 0 ? 0 : known.length === open.length ? Math.max(0, ...known) : null;
    else needed = anyMet ? 0 : known.length ? Math.min(...known) : null;
    if (rules.minSum !== null && needed !== null) needed = Math.max(needed, rules.minSum - sum);
  }
  return { rules: list, mode: rules.mode, minSum: rules.minSum, met, grainsNeeded: needed };
}
