import { evaluateRules, type RuleReport } from '../rules/evaluate-rules.js';
import { levelStats, type LevelStats } from '../stats/level-stats.js';
import type { RulesMetPayload, RulesUnmetPayload } from './events.js';
import type { LevelState } from './level-state.js';

export interface LevelReport {
  readonly stats: LevelStats;
  readonly rules: RuleReport;
}

export function levelReport(state: LevelState): LevelReport {
  const stats = levelStats(state);
  return { stats, rules: evaluateRules(state.rules, stats, state.spike) };
}

/**
 * The event to record when the rule set's verdict differs from what the file last
 * said: the first time it is met, again after an undo or a rule change un-met it.
 */
export function rulesSignal(state: LevelState): RulesMetPayload | RulesUnmetPayload | null {
  const { stats, rules } = levelReport(state);
  if (rules.met === state.rulesMet) return null;
  const sum = stats.table.pollenSum;
  return rules.met
    ? { type: 'rules-met', sum, grains: state.grains, met: rules.rules.filter((r) => r.met).map((r) => r.rule) }
    : { type: 'rules-unmet', sum, grains: state.grains };
}
