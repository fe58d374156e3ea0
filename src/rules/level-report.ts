import type { Spike } from '../stats/concentration.js';
import type { LevelCounts } from '../stats/level-counts.js';
import { levelStats, type LevelStats } from '../stats/level-stats.js';
import { evaluateRules, type RuleReport } from './evaluate-rules.js';
import type { RuleSet } from './rule-set.js';

/** A level's statistics and how its stop rules stand: what the screen, summary and rule signal read. */
export interface LevelReport {
  readonly stats: LevelStats;
  readonly rules: RuleReport;
}

export function levelReport(level: LevelCounts & { readonly rules: RuleSet; readonly spike: Spike | null }): LevelReport {
  const stats = levelStats(level);
  return { stats, rules: evaluateRules(level.rules, stats, level.spike) };
}
