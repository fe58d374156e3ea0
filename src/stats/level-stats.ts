import type { LevelCounts } from './level-counts.js';
import { concentration, type Concentration } from './concentration.js';
import { chao1, chaoJostCoverage, goodTuringCoverage, type RichnessEstimate } from './coverage.js';
import { frequencies, type Frequencies } from './frequencies.js';
import { levelTable, type LevelTable } from './level-table.js';

/** What the rules and the screen need to know about a level, computed from its state in O(types). */
export interface LevelStats {
  readonly table: LevelTable;
  /** Frequencies of the taxa in the pollen sum: richness and coverage are of the sum. */
  readonly freq: Frequencies;
  readonly coverage: number | null;
  readonly goodTuring: number | null;
  readonly chao1: RichnessEstimate | null;
  /** Grains of the sum counted since the last type new to the sum. */
  readonly sinceNewType: number;
  readonly markers: number;
  /** Of the pollen sum; null without spike data. */
  readonly concentration: Concentration | null;
}

export function levelStats(state: LevelCounts): LevelStats {
  const table = levelTable(state);
  const freq = frequencies(table.rows.filter((r) => r.inSum).map((r) => r.count));
  const markers = table.markers;
  return {
    table,
    freq,
    coverage: chaoJostCoverage(freq),
    goodTuring: goodTuringCoverage(freq),
    chao1: chao1(freq),
    sinceNewType: state.sinceNewType,
    markers,
    concentration: state.spike ? concentration(table.pollenSum, markers, state.spike) : null,
  };
}
