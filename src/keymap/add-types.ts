import { findNodeAtLocation, parseTree } from 'jsonc-parser';
import type { Group } from './groups.js';
import { parseKeymap } from './parse-keymap.js';

export interface AddedType {
  readonly key: string;
  readonly taxon: string;
  readonly group: Group;
}

export type AddResult =
  | { readonly ok: true; readonly text: string; readonly added: readonly AddedType[]; readonly skipped: readonly string[] }
  | { readonly ok: false; readonly message: string };

/** One more key after the last one of "keys", on its own line, indented like the line before. */
function insertKey(text: string, t: AddedType): string {
  const keys = findNodeAtLocation(parseTree(text) as NonNullable<ReturnType<typeof parseTree>>, ['keys']);
  const last = keys?.children?.at(-1);
  const entry = `${JSON.stringify(t.key)}: { "taxon": ${JSON.stringify(t.taxon)}, "group": ${JSON.stringify(t.group)} }`;
  if (!keys || !last) return text;
  const end = last.offset + last.length;
  const lineStart = text.lastIndexOf('\n', last.offset) + 1;
  const indent = /^[ \t]*/.exec(text.slice(lineStart))?.[0] ?? '  ';
  return `${text.slice(0, end)},\n${indent}${entry}${text.slice(end)}`;
}

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
    edited = insertKey(edited, t);
    added.push(t);
  }
  // The result must be a keymap as good as the one it came from.
  const after = parseKeymap(edited, source);
  if (!after.ok) return after;
  return { ok: true, text: edited, added, skipped };
}
