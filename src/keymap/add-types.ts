import type { Group } from './groups.js';
import { setKey } from './edit-keymap-text.js';
import { parseKeymap } from './parse-keymap.js';

export interface AddedType {
  readonly key: string;
  readonly taxon: string;
  readonly group: Group;
}

export type AddResult =
  | { readonly ok: true; readonly text: string; readonly added: readonly AddedType[]; readonly skipped: readonly string[] }
  | { readonly ok: false; readonly message: string };

/**
 * The keymap file's text with the types added during a count bound to their
 * keys, edited in place (the file keeps its layout and order). A taxon already
 * in the file is skipped; a key already taken there is refused.
 */
export function addTypesToKeymap(text: string, source: string, types: readonly AddedType[]): AddResult {
  const before = parseKeymap(text, source);
  if (!before.ok) return before;
  const known = new Set(Object.values(before.keymap.keys).map((b) => b.taxon));
  const added: AddedType[] = [];
  const skipped: string[] = [];
  let edited = text;
  for (const t of types) {
    if (known.has(t.taxon)) {
      skipped.push(t.taxon);
      continue;
    }
    const holder = before.keymap.keys[t.key];
    if (holder) return { ok: false, message: `keymap ${source}: key "${t.key}" holds ${holder.taxon} there, so ${t.taxon} cannot take it; add it by hand on a free key` };
    edited = setKey(edited, t.key, { taxon: t.taxon, group: t.group });
    added.push(t);
  }
  // The result must be a keymap as good as the one it came from.
  const after = parseKeymap(edited, source);
  if (!after.ok) return after;
  return { ok: true, text: edited, added, skipped };
}
