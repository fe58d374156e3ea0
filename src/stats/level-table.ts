import type { Group } from '../keymap/groups.js';
import { bindingInSum, bindingsOf, groupRank, roleOf, type Keymap } from '../keymap/keymap.js';
import type { LevelCounts } from './level-counts.js';
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
  /** Grains of every group of the keymap (0 for a group not counted). */
  readonly groupTotals: Readonly<Record<Group, number>>;
  readonly sumGroups: readonly Group[];
  /** The keymap's groups in table order (an object's keys would put a group named "1" first). */
  readonly groups: readonly Group[];
  /** Grains of the groups with the marker role. */
  readonly markers: number;
  readonly grains: number;
}

interface Slot {
  readonly key: string | null;
  readonly taxon: string;
  readonly group: Group;
  readonly inSum: boolean;
}

// The row order depends on the keymap alone, and the screen asks after every grain: work it out once per keymap.
const layouts = new WeakMap<Keymap, { slots: readonly Slot[]; known: ReadonlySet<string> }>();

function layoutOf(keymap: Keymap) {
  let layout = layouts.get(keymap);
  if (!layout) {
    const slots = bindingsOf(keymap).map(([key, b]) => ({ key, taxon: b.taxon, group: b.group, inSum: bindingInSum(keymap, b) }));
    // Stable order for every view: by group, then as the keymap lists them (sort is stable).
    slots.sort((a, b) => groupRank(keymap, a.group) - groupRank(keymap, b.group));
    layout = { slots, known: new Set(slots.map((s) => s.taxon)) };
    layouts.set(keymap, layout);
  }
  return layout;
}

/**
 * Counts, percentages and intervals of one level. Taxa in the pollen sum are a
 * percentage of the sum; taxa of groups outside it (spores, aquatics …) a
 * percentage of the sum plus their own group, the usual convention.
 */
export function levelTable(state: LevelCounts): LevelTable {
  const { keymap, counts } = state;
  const layout = layoutOf(keymap);
  let slots = layout.slots;
  const unknown = Object.keys(counts).filter((t) => !layout.known.has(t));
  if (unknown.length) {
    const extra = unknown.map((taxon): Slot => ({ key: null, taxon, group: 'other', inSum: roleOf(keymap, 'other') === 'sum' }));
    slots = [...slots, ...extra].sort((a, b) => groupRank(keymap, a.group) - groupRank(keymap, b.group));
  }
  const groupTotals: Record<Group, number> = Object.fromEntries(keymap.groups.map((g) => [g.name, 0]));
  let pollenSum = 0;
  let markers = 0;
  for (const s of slots) {
    const n = counts[s.taxon] ?? 0;
    groupTotals[s.group] = (groupTotals[s.group] ?? 0) + n;
    if (s.inSum) pollenSum += n;
    else if (roleOf(keymap, s.group) === 'marker') markers += n;
  }

  const rows = slots.map((s): TaxonRow => {
    const count = counts[s.taxon] ?? 0;
    // A taxon taken out of a group in the sum is a percent of the sum plus itself.
    const basis = s.inSum ? pollenSum : pollenSum + (roleOf(keymap, s.group) === 'sum' ? count : (groupTotals[s.group] ?? 0));
    if (basis === 0) return { key: s.key, taxon: s.taxon, group: s.group, inSum: s.inSum, count, basis, percent: null, ciLow: null, ciHigh: null };
    const ci = wilsonInterval(count, basis);
    return { key: s.key, taxon: s.taxon, group: s.group, inSum: s.inSum, count, basis, percent: (100 * count) / basis, ciLow: 100 * ci.low, ciHigh: 100 * ci.high };
  });
  return { rows, pollenSum, groupTotals, sumGroups: keymap.sum, groups: keymap.groups.map((g) => g.name), markers, grains: state.grains };
}
