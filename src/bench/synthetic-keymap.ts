import type { Group } from '../keymap/groups.js';
import { DEFAULT_ACTIONS, DEFAULT_GROUPS, type Keymap } from '../keymap/keymap.js';

/** A keymap of `n` taxa in the sum, keyed by code points from U+0100 on, for benchmarks of many types. */
export function syntheticKeymap(n: number, groupOf: (i: number) => Group = () => 'trees', marker = false): Keymap {
  const keys: Record<string, Keymap['keys'][string]> = {};
  for (let i = 0; i < n; i++) keys[String.fromCodePoint(0x100 + i)] = { taxon: `Taxon ${i + 1}`, group: groupOf(i) };
  if (marker) keys['.'] = { taxon: 'Marker', group: 'markers' };
  return { name: 'synthetic', keys, order: Object.keys(keys), actions: { ...DEFAULT_ACTIONS }, groups: DEFAULT_GROUPS, sum: ['trees', 'shrubs', 'herbs'] };
}
