import { levelReport } from '../rules/level-report.js';
import type { RulesMetPayload, RulesUnmetPayload } from './events.js';
import type { LevelState } from './level-state.js';

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
