import { applyEdits, findNodeAtLocation, modify, parseTree, type Node } from 'jsonc-parser';
import type { GroupRole } from './groups.js';
import type { TaxonBinding } from './keymap.js';

/*
 * Changes to a keymap file's text that keep its layout: each key on its own
 * line as the file has it, other lines untouched. Callers check the result with
 * parseKeymap; these only place text.
 */

const FORMAT = { formattingOptions: { insertSpaces: true, tabSize: 2, eol: '\n' } };

function tree(text: string): Node {
  const root = parseTree(text);
  if (!root) throw new Error('not a JSON text');
  return root;
}

/** One key's entry as exine writes it: `"q": { "taxon": "Quercus", "group": "trees" }`. */
export function entryText(key: string, b: TaxonBinding): string {
  const out = b.inSum === false ? ', "inSum": false' : '';
  return `${JSON.stringify(key)}: { "taxon": ${JSON.stringify(b.taxon)}, "group": ${JSON.stringify(b.group)}${out} }`;
}

function bindingText(b: TaxonBinding): string {
  return entryText('', b).slice(4);
}

/** A new keymap with no keys yet. */
export function emptyKeymapText(name: string): string {
  return `{\n  "name": ${JSON.stringify(name)},\n  "keys": {}\n}\n`;
}

/** The key bound to `b`: its value replaced where it stands, or a new line after the last key. */
export function setKey(text: string, key: string, b: TaxonBinding): string {
  const root = tree(text);
  const keys = findNodeAtLocation(root, ['keys']);
  if (!keys || keys.type !== 'object') throw new Error('no "keys" object');
  const existing = keys.children?.find((p) => p.children?.[0]?.value === key)?.children?.[1];
  if (existing) return `${text.slice(0, existing.offset)}${bindingText(b)}${text.slice(existing.offset + existing.length)}`;
  const last = keys.children?.at(-1);
  if (!last) {
    const lineStart = text.lastIndexOf('\n', keys.offset) + 1;
    const indent = /^[ \t]*/.exec(text.slice(lineStart))?.[0] ?? '';
    return `${text.slice(0, keys.offset)}{\n${indent}  ${entryText(key, b)}\n${indent}}${text.slice(keys.offset + keys.length)}`;
  }
  const end = last.offset + last.length;
  const lineStart = text.lastIndexOf('\n', last.offset) + 1;
  const indent = /^[ \t]*/.exec(text.slice(lineStart))?.[0] ?? '  ';
  return `${text.slice(0, end)},\n${indent}${entryText(key, b)}${text.slice(end)}`;
}

/** The key and its line taken out; the other lines stay as they are. */
export function removeKey(text: string, key: string): string {
  const keys = findNodeAtLocation(tree(text), ['keys']);
  const props = keys?.children ?? [];
  const i = props.findIndex((p) => p.children?.[0]?.value === key);
  const prop = props[i];
  if (!keys || !prop) return text;
  const prev = props[i - 1];
  const next = props[i + 1];
  if (prev) return text.slice(0, prev.offset + prev.length) + text.slice(prop.offset + prop.length);
  if (next) return text.slice(0, prop.offset) + text.slice(next.offset);
  return `${text.slice(0, keys.offset)}{}${text.slice(keys.offset + keys.length)}`;
}

/** A group of the keymap's own, with its role, in "groups" (made when missing). */
export function setGroup(text: string, name: string, role: GroupRole): string {
  const root = tree(text);
  if (!findNodeAtLocation(root, ['groups'])) {
    // Before "keys", so that a reader sees the groups before the keys that use them.
    const keysProp = root.children?.find((p) => p.children?.[0]?.value === 'keys');
    if (keysProp) {
      const lineStart = text.lastIndexOf('\n', keysProp.offset) + 1;
      const indent = /^[ \t]*/.exec(text.slice(lineStart))?.[0] ?? '  ';
      return `${text.slice(0, keysProp.offset)}"groups": { ${JSON.stringify(name)}: ${JSON.stringify(role)} },\n${indent}${text.slice(keysProp.offset)}`;
    }
  }
  const groups = findNodeAtLocation(root, ['groups']);
  const last = groups?.children?.at(-1);
  if (groups?.type === 'object' && last && text.slice(groups.offset, groups.offset + groups.length).indexOf('\n') === -1) {
    // A one-line "groups" stays on one line.
    const end = last.offset + last.length;
    return `${text.slice(0, end)}, ${JSON.stringify(name)}: ${JSON.stringify(role)}${text.slice(end)}`;
  }
  return applyEdits(text, modify(text, ['groups', name], role, FORMAT));
}
