import { GROUPS, groupRank, type Group } from '../keymap/groups.js';
import type { LevelState } from '../session/level-state.js';
import { wilsonInterval } from './wilson.js';

export interface TaxonRow {
  readonly key: string | null;
  readonly taxon: string;
  readonly group: Group;
  readonly inSum: boolean;
  readonly count: number;
  /** The grains the percentage is taken of: the pollen sum, or sum + own group outside the sum. */
  readonly basis: number;
  /** Percent of `basis`; null while the basis is 0. */
  readonly percent: number | null;
  /** 95% Wilson interval, in percent. */
  readonly ciLow: number | null;
  readonly ciHigh: number | null;
}

export interface LevelTable {
  readonly rows: readonly TaxonRow[];
  readonly pollenSum: number;
  readonly groupTotals: Readonly<Record<Group, number>>;
  readonly sumGroups: readonly Group[];
  readonly grains: number;
}

/**
 * Counts, percentages and intervals of one level. Taxa in the pollen sum are a
 * percentage of the sum; taxa of groups outside it (spores, aquatics …) a
 * percentage of the sum plus their own group, the usual convention.
 */
export function levelTable(state: LevelState): LevelTable {
  const { keymap, counts } = state;
  const listed: { key: string | null; taxon: string; group: Group }[] = Object.entries(keymap.keys).map(
    ([key, b]) => ({ key, taxon: b.taxon, group: b.group }),
  );
  const known = new Set(listed.map((t) => t.taxon));
  for (const taxon of Object.keys(counts)) if (!known.has(taxon)) listed.push({ key: null, taxon, group: 'other' });

  const groupTotals = Object.fromEntries(GROUPS.map((g) => [g, 0])) as Record<Group, number>;
  for (const t of listed) groupTotals[t.group] += counts[t.taxon] ?? 0;
  const sumGroups = keymap.sum;
  const pollenSum = sumGroups.reduce((acc, g) => acc + groupTotals[g], 0);

  const rows = listed.map((t): TaxonRow => {
    const count = counts[t.taxon] ?? 0;
    const inSum = sumGroups.includes(t.group);
    const basis = inSum ? pollenSum : pollenSum + groupTotals[t.group];
    if (basis === 0) return { ...t, inSum, count, basis, percent: null, ciLow: null, ciHigh: null };
    const ci = wilsonInterval(count, basis);
    return { ...t, inSum, count, basis, percent: (100 * count) / basis, ciLow: 100 * ci.low, ciHigh: 100 * ci.high };
  });
  // Stable order for every view: by group, then as the keymap lists them.
  const order = new Map(rows.map((r, i) => [r, i]));
  rows.sort((a, b) => groupRank(a.group) - groupRank(b.group) || (order.get(a) as number) - (order.get(b) as number));
  return { rows, pollenSum, groupTotals, sumGroups, grains: state.grains };
}
