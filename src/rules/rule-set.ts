import { shortNumber } from '../text/numbers.js';

/** The names of the rules, as the session file records which ones were met. */
export const RULE_NAMES = ['target', 'precision', 'coverage', 'plateau', 'markers', 'conc-error'] as const;
export type RuleName = (typeof RULE_NAMES)[number];

/** How the rules of a set combine: the set is met when all of them are, or when any one is. */
export type RuleMode = 'all' | 'any';

/** Every qualifying taxon's 95% interval half-width must be at most `halfWidth` percentage points. */
export interface PrecisionRule {
  readonly halfWidth: number;
  /** Taxa at or above this percent qualify (when `taxa` is null). */
  readonly share: number | null;
  /** Or exactly these taxa. */
  readonly taxa: readonly string[] | null;
}

/** The stopping rules a level is counted against; recorded in the session file. A null rule is not used. */
export interface RuleSet {
  /** Grains of the pollen sum to reach (common practice: 500, about 300 where pollen is sparse). */
  readonly targetSum: number | null;
  readonly precision: PrecisionRule | null;
  /** Sample coverage (Chao & Jost 2012) to reach, as a fraction. */
  readonly coverage: number | null;
  /** Grains of the sum in a row with no new type. */
  readonly plateau: number | null;
  /** Exotic marker grains to count. */
  readonly markers: number | null;
  /** Relative error of the concentration to reach, as a fraction. */
  readonly concError: number | null;
  readonly mode: RuleMode;
  /** The set is never met below this pollen sum. */
  readonly minSum: number | null;
}

export const DEFAULT_TARGET_SUM = 500;

export const NO_RULES: RuleSet = {
  targetSum: null,
  precision: null,
  coverage: null,
  plateau: null,
  markers: null,
  concError: null,
  mode: 'all',
  minSum: null,
};

export const DEFAULT_RULES: RuleSet = { ...NO_RULES, targetSum: DEFAULT_TARGET_SUM };

export function sameRules(a: RuleSet, b: RuleSet): boolean {
  return JSON.stringify(normalRules(a)) === JSON.stringify(normalRules(b));
}

/** A rule set read from a file with every field present, in one key order. */
export function normalRules(r: Partial<RuleSet>): RuleSet {
  return {
    targetSum: r.targetSum ?? null,
    precision: r.precision ? { halfWidth: r.precision.halfWidth, share: r.precision.share ?? null, taxa: r.precision.taxa ?? null } : null,
    coverage: r.coverage ?? null,
    plateau: r.plateau ?? null,
    markers: r.markers ?? null,
    concError: r.concError ?? null,
    mode: r.mode ?? 'all',
    minSum: r.minSum ?? null,
  };
}

/** The rule set in words, for notices and reports. */
export function describeRules(r: RuleSet): string {
  const parts: string[] = [];
  if (r.targetSum !== null) parts.push(`pollen sum ${r.targetSum}`);
  if (r.precision) {
    const which = r.precision.taxa ? r.precision.taxa.join(', ') : `taxa ≥ ${shortNumber(r.precision.share ?? 0)}%`;
    parts.push(`±${shortNumber(r.precision.halfWidth)} points for ${which}`);
  }
  if (r.coverage !== null) parts.push(`coverage ${shortNumber(r.coverage)}`);
  if (r.plateau !== null) parts.push(`no new type in ${r.plateau} grains`);
  if (r.markers !== null) parts.push(`${r.markers} markers`);
  if (r.concError !== null) parts.push(`concentration error ≤ ${shortNumber(100 * r.concError)}%`);
  const joined = parts.join(r.mode === 'all' ? ' and ' : ' or ');
  return r.minSum !== null ? `${joined}, with a pollen sum of at least ${r.minSum}` : joined;
}
