import { DEFAULT_GROUPS, type Group, type GroupDef, type GroupRole } from './groups.js';

export interface TaxonBinding {
  readonly taxon: string;
  readonly group: Group;
  /** false: this taxon is kept out of the pollen sum although its group is in it (a local wetland type). */
  readonly inSum?: false;
}

export const ACTION_NAMES = ['undo', 'traverse', 'note', 'help', 'newType', 'cf'] as const;
export type ActionName = (typeof ACTION_NAMES)[number];

/** Keys that are not printable characters, by the names a keymap file uses for them. */
export const NAMED_KEYS = ['backspace', 'tab', 'enter', 'escape', 'space'] as const;
export type NamedKey = (typeof NAMED_KEYS)[number];

/** A single printable character (case-sensitive) or one of NAMED_KEYS. */
export type KeyName = string;

export interface Keymap {
  readonly name: string;
  /** Taxon keys, for lookup. Their order is `order`: a JS object puts digit keys first whatever the file said. */
  readonly keys: Readonly<Record<string, TaxonBinding>>;
  /** Taxon keys in the order the file lists them: screen, help, drawings and exports keep this order. */
  readonly order: readonly string[];
  /** null: the action has no key (its default key is a taxon key in this keymap). */
  readonly actions: Readonly<Record<ActionName, KeyName | null>>;
  /** Every group with its role, in table order (built-in ones and the keymap's own). */
  readonly groups: readonly GroupDef[];
  /** Groups whose grains make up the pollen sum (those of role "sum"), kept for readers of older copies. */
  readonly sum: readonly Group[];
}

export const DEFAULT_ACTIONS: Readonly<Record<ActionName, KeyName>> = {
  undo: 'backspace',
  traverse: 'tab',
  note: 'enter',
  help: '?',
  newType: '=',
  // The next grain is a cf. one; no bundled keymap has a taxon on the apostrophe.
  cf: "'",
};

/** Actions added after keymaps were first written: their default key yields to a taxon on it. */
export const LATER_ACTIONS: ReadonlySet<ActionName> = new Set(['help', 'newType', 'cf']);

/** Names for keys a person cannot see printed: drawn and listed with these. */
const SHOWN: Readonly<Record<string, string>> = {
  backspace: 'Backspace',
  tab: 'Tab',
  enter: 'Enter',
  escape: 'Esc',
  space: 'Space',
  ' ': 'Space',
  '\u00a0': 'NBSP',
};

/** A key as a person reads it: named keys and spaces by name (another blank character by its code point). */
export function keyLabel(key: KeyName | null): string {
  if (key === null) return '(no key)';
  const shown = SHOWN[key];
  if (shown) return shown;
  return /^\p{Zs}$/u.test(key) ? `U+${(key.codePointAt(0) ?? 0).toString(16).toUpperCase().padStart(4, '0')}` : key;
}

/** The taxon keys with their bindings, in the file's order. */
export function bindingsOf(keymap: Keymap): [string, TaxonBinding][] {
  return keymap.order.map((k) => [k, keymap.keys[k] as TaxonBinding]);
}

/** The keymap with one more taxon key at the end (a type added while counting). */
export function withKey(keymap: Keymap, key: string, binding: TaxonBinding): Keymap {
  const groups = keymap.groups.some((g) => g.name === binding.group) ? keymap.groups : [...keymap.groups, { name: binding.group, role: 'outside' as const }];
  return { ...keymap, keys: { ...keymap.keys, [key]: binding }, order: [...keymap.order, key], groups };
}

const roleMaps = new WeakMap<Keymap, ReadonlyMap<Group, GroupRole>>();

/** A group's role under this keymap; a group it does not know is outside the sum. */
export function roleOf(keymap: Keymap, group: Group): GroupRole {
  let map = roleMaps.get(keymap);
  if (!map) {
    map = new Map(keymap.groups.map((g) => [g.name, g.role]));
    roleMaps.set(keymap, map);
  }
  return map.get(group) ?? 'outside';
}

/** Position of a group in tables and exports; unknown groups go last. */
export function groupRank(keymap: Keymap, group: Group): number {
  const i = keymap.groups.findIndex((g) => g.name === group);
  return i < 0 ? keymap.groups.length : i;
}

/** Whether grains on this binding count in the pollen sum. */
export function bindingInSum(keymap: Keymap, b: TaxonBinding): boolean {
  return b.inSum !== false && roleOf(keymap, b.group) === 'sum';
}

/** The groups of a keymap that hold exotic markers. */
export function markerGroups(keymap: Keymap): Group[] {
  return keymap.groups.filter((g) => g.role === 'marker').map((g) => g.name);
}

export function hasMarkerKey(keymap: Keymap): boolean {
  return Object.values(keymap.keys).some((b) => roleOf(keymap, b.group) === 'marker');
}

export { DEFAULT_GROUPS };

// Each taxon's verdict, worked out once per keymap (a keymap is never changed; a new type makes a new one).
const sumVerdicts = new WeakMap<Keymap, Map<string, boolean>>();
// A replay asks for one keymap 100,000 times in a row: remember the last one.
let lastKeymap: Keymap | null = null;
let lastVerdicts = new Map<string, boolean>();

/** Whether a taxon's grains count in the pollen sum; a taxon the keymap does not list is "other". */
export function inPollenSum(keymap: Keymap, taxon: string): boolean {
  let verdicts = keymap === lastKeymap ? lastVerdicts : sumVerdicts.get(keymap);
  if (!verdicts) {
    verdicts = new Map();
    sumVerdicts.set(keymap, verdicts);
  }
  lastKeymap = keymap;
  lastVerdicts = verdicts;
  let verdict = verdicts.get(taxon);
  if (verdict === undefined) {
    const bindings = Object.values(keymap.keys).filter((b) => b.taxon === taxon);
    verdict = bindings.length > 0 ? bindings.some((b) => bindingInSum(keymap, b)) : roleOf(keymap, 'other') === 'sum';
    verdicts.set(taxon, verdict);
  }
  return verdict;
}
