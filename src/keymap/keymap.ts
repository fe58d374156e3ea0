import type { Group } from './groups.js';

export interface TaxonBinding {
  readonly taxon: string;
  readonly group: Group;
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
  /** Taxon keys in the order the file lists them: the screen and exports keep this order. */
  readonly keys: Readonly<Record<string, TaxonBinding>>;
  /** null: the action has no key (its default key is a taxon key in this keymap). */
  readonly actions: Readonly<Record<ActionName, KeyName | null>>;
  /** Groups whose grains make up the pollen sum. */
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

export function keyLabel(key: KeyName | null): string {
  switch (key) {
    case null:
      return '(no key)';
    case 'backspace':
      return 'Backspace';
    case 'tab':
      return 'Tab';
    case 'enter':
      return 'Enter';
    case 'escape':
      return 'Esc';
    case 'space':
      return 'Space';
    default:
      return key;
  }
}

const sumTaxa = new WeakMap<Keymap, ReadonlySet<string>>();
// A replay asks for one keymap 100,000 times in a row: remember the last one.
let lastKeymap: Keymap | null = null;
let lastSet: ReadonlySet<string> = new Set();

/** Whether a taxon's grains count in the pollen sum; a taxon the keymap does not list is "other". */
export function inPollenSum(keymap: Keymap, taxon: string): boolean {
  let set = keymap === lastKeymap ? lastSet : sumTaxa.get(keymap);
  if (!set) {
    set = new Set(Object.values(keymap.keys).filter((b) => keymap.sum.includes(b.group)).map((b) => b.taxon));
    sumTaxa.set(keymap, set);
  }
  lastKeymap = keymap;
  lastSet = set;
  if (set.has(taxon)) return true;
  return keymap.sum.includes('other') && !Object.values(keymap.keys).some((b) => b.taxon === taxon);
}
