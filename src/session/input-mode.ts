import type { Group } from '../keymap/groups.js';
import type { CountedGrain } from '../model/level-state.js';

/** What the next keys mean when they are not counting: a question, a line being typed, the help. */
export type InputMode =
  | { readonly kind: 'confirm-finish' }
  | { readonly kind: 'help' }
  /** The cf. key was pressed: the next taxon key counts a cf. grain. */
  | { readonly kind: 'cf' }
  /** A note on the grain `grain` (null: on the level), being typed. */
  | { readonly kind: 'note'; readonly grain: number | null; readonly taxon: string | null; readonly text: string }
  /** The name and group of a type that is not in the keymap, being typed. */
  | { readonly kind: 'new-type'; readonly text: string }
  /** Grains written while a sync to disk failed, never shown as counted: keep them or void them. */
  | { readonly kind: 'unconfirmed'; readonly fromSeq: number; readonly toSeq: number; readonly grains: readonly CountedGrain[] };

/** "@12.4,88.1 cf. Tilia cordata" → the stage position and the words. */
export function parseNote(text: string): { text: string; stage: { x: number; y: number } | null } {
  const m = /@\s*(-?\d+(?:\.\d+)?)\s*[,;\s]\s*(-?\d+(?:\.\d+)?)/.exec(text);
  if (!m) return { text: text.trim(), stage: null };
  const rest = `${text.slice(0, m.index)} ${text.slice(m.index + m[0].length)}`.replace(/\s+/g, ' ').trim();
  return { text: rest, stage: { x: Number(m[1]), y: Number(m[2]) } };
}

/** "Ilex aquifolium, shrubs" → name and group; the group may be shortened ("shr"). */
export function parseNewType(text: string, groups: readonly Group[]): { ok: true; taxon: string; group: Group } | { ok: false; message: string } {
  const [name, groupText, ...extra] = text.split(',').map((p) => p.trim());
  if (!name) return { ok: false, message: 'type the name of the new type, a comma, and its group' };
  if (extra.length) return { ok: false, message: 'one comma only: "name, group"' };
  if (!groupText) return { ok: false, message: `add its group after a comma: ${groups.join(', ')}` };
  // Groups of a keymap's own may have capitals (NPP): compared without case, an exact name first.
  const exact = groups.filter((g) => g.toLowerCase() === groupText.toLowerCase());
  const matches = exact.length ? exact : groups.filter((g) => g.toLowerCase().startsWith(groupText.toLowerCase()));
  if (matches.length !== 1) return { ok: false, message: `"${groupText}" is not one group of: ${groups.join(', ')}` };
  return { ok: true, taxon: name, group: matches[0] as Group };
}
