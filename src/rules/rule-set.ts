/** The stopping rules a level is counted against; recorded in the session file. */
export interface RuleSet {
  /** Grains of the pollen sum to reach (common practice: 500, about 300 where pollen is sparse). */
  readonly targetSum: number;
}

export const DEFAULT_RULES: RuleSet = { targetSum: 500 };

export function sameRules(a: RuleSet, b: RuleSet): boolean {
  return a.targetSum === b.targetSum;
}
