import type { LevelState } from '../session/level-state.js';
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

/** The seq of the grain that brought the newest type into the sum, or 0. */
function lastNewTypeSeq(state: LevelState, inSum: (taxon: string) => boolean): number {
  let last = 0;
  for (const [taxon, seq] of Object.entries(state.firstSeen)) if (inSum(taxon) && seq > last) last = seq;
  return last;
}

export function levelStats(state: LevelState): LevelStats {
  const table = levelTable(state);
  const sumTaxa = new Set(table.rows.filter((r) => r.inSum).map((r) => r.taxon));
  const freq = frequencies(table.rows.filter((r) => r.inSum).map((r) => r.count));
  const last = lastNewTypeSeq(state, (t) => sumTaxa.has(t));
  let sinceNewType = 0;
  for (let s = state.stack; s && s.seq > last; s = s.below) if (sumTaxa.has(s.taxon)) sinceNewType++;
  const markers = table.groupTotals.markers;
  return {
    table,
    freq,
    coverage: chaoJostCoverage(freq),
    goodTuring: goodTuringCoverage(freq),
    chao1: chao1(freq),
    sinceNewType,
    markers,
    concentration: state.spike ? concentration(table.pollenSum, markers, state.spike) : null,
  };
}
