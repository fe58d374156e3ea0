import type { Group } from './groups.js';

const SHORT: Readonly<Record<string, string>> = {
  trees: 'tree',
  shrubs: 'shrub',
  herbs: 'herb',
  spores: 'spore',
  aquatics: 'aquat',
  markers: 'marker',
  indeterminable: 'indet',
  other: 'other',
};

/** A group's name in at most `width` characters: the built-in short forms, else the name cut. */
export function groupShort(group: Group, width = 6): string {
  const short = SHORT[group] ?? group;
  return [...short].slice(0, width).join('');
}

/** The name with a capital, for panel cells. */
export function groupTitle(group: Group): string {
  return group.charAt(0).toUpperCase() + group.slice(1);
}

const BUILT_IN_LETTER: Readonly<Record<string, string>> = {
  trees: 'T',
  shrubs: 'S',
  herbs: 'H',
  spores: 'P',
  aquatics: 'A',
  markers: 'M',
  indeterminable: 'I',
  other: 'O',
};

/**
 * One capital per group, for cells too narrow for the name: the built-in
 * letters, then for a group of the keymap's own the first letter of its name
 * not yet taken, else the first free letter of the alphabet, else a digit.
 */
export function groupLetters(groups: readonly Group[]): ReadonlyMap<Group, string> {
  const out = new Map<Group, string>();
  const taken = new Set<string>();
  for (const g of groups) {
    const letter = BUILT_IN_LETTER[g];
    if (letter) {
      out.set(g, letter);
      taken.add(letter);
    }
  }
  for (const g of groups) {
    if (out.has(g)) continue;
    const tries = [...g.toUpperCase().replace(/[^A-Z]/g, ''), ...'ABCDEFGHIJKLMNOPQRSTUVWXYZ123456789'];
    const letter = tries.find((c) => !taken.has(c)) ?? '?';
    out.set(g, letter);
    taken.add(letter);
  }
  return out;
}
