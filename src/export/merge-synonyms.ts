import type { Keymap, TaxonBinding } from '../keymap/keymap.js';
import type { LevelState } from '../model/level-state.js';

/** One synonym merged in one level. */
export interface Merge {
  readonly from: string;
  readonly to: string;
  readonly grains: number;
  /** Set when the two names are in different groups: the grains now count in the group of `to`. */
  readonly groupChange: { readonly from: string; readonly to: string } | null;
}

/**
 * The level with each synonym's grains counted under the name it is merged into,
 * and its key bound to that name (or dropped when that name has a key of its own),
 * so the table, the percentages and the export read one taxon. The stack and first
 * appearances are left as they were: only the counts are for the export.
 */
export function mergeSynonyms(state: LevelState, synonyms: Readonly<Record<string, string>>): { state: LevelState; merges: Merge[] } {
  const merges: Merge[] = [];
  const present = Object.keys(synonyms).filter((from) => (state.counts[from] ?? 0) > 0 || Object.values(state.keymap.keys).some((b) => b.taxon === from));
  if (present.length === 0) return { state, merges };
  const bindingOf = (taxon: string) => Object.values(state.keymap.keys).find((b) => b.taxon === taxon);
  const counts: Record<string, number> = { ...state.counts };
  const keys: Record<string, TaxonBinding> = {};
  for (const [key, b] of Object.entries(state.keymap.keys)) {
    const to = synonyms[b.taxon];
    if (to === undefined) keys[key] = b;
    else if (!bindingOf(to)) keys[key] = { taxon: to, group: b.group };
  }
  for (const from of present) {
    const to = synonyms[from] as string;
    const n = counts[from] ?? 0;
    delete counts[from];
    if (n > 0) counts[to] = (counts[to] ?? 0) + n;
    const a = bindingOf(from);
    const b = bindingOf(to);
    if (n > 0) merges.push({ from, to, grains: n, groupChange: a && b && a.group !== b.group ? { from: a.group, to: b.group } : null });
  }
  const keymap: Keymap = { ...state.keymap, keys, order: state.keymap.order.filter((k) => k in keys) };
  return { state: { ...state, keymap, counts }, merges };
}
