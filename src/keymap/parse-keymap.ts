import { findNodeAtLocation, parseTree, type Node } from 'jsonc-parser';
import { isBuiltInGroup, type GroupDef } from './groups.js';
import { lineOf, parseStrictJson } from './json-source.js';
import { keymapShapeOf } from './keymap-shape.js';
import {
  ACTION_NAMES,
  DEFAULT_ACTIONS,
  LATER_ACTIONS,
  NAMED_KEYS,
  keyLabel,
  type ActionName,
  type Keymap,
  type TaxonBinding,
} from './keymap.js';
import { hint } from './nearest-name.js';
import { resolveGroups } from './resolve-groups.js';
import { describeIssue } from '../validation/describe-issue.js';
import { hasUnseen, UNSEEN, visible } from '../text/visible.js';


/** The fields a person writes in a keymap file; anything else is a mistake worth naming. */
export const TOP_FIELDS = ['name', 'keys', 'actions', 'sum', 'groups'] as const;
export const BINDING_FIELDS = ['taxon', 'group', 'inSum'] as const;

export type KeymapResult = { ok: true; keymap: Keymap } | { ok: false; message: string };

// Nothing a person sees on a key, or a terminal acts on: see text/visible.ts. A combining mark alone is no key either.
const COMBINING = /^[\p{Mn}\p{Me}]$/u;

/** A single printable character: one code point that a person can see on a key (a space is drawn as "Space"). */
export function isPrintableKey(key: string): boolean {
  const points = [...key];
  if (points.length !== 1) return false;
  return !UNSEEN.test(key) && !COMBINING.test(key);
}

function isActionKey(key: string): boolean {
  return (NAMED_KEYS as readonly string[]).includes(key) || (isPrintableKey(key) && key !== ' ');
}

function propertyName(prop: Node): string {
  return String(prop.children?.[0]?.value ?? '');
}

/** Fields of an object node not in `known`, with their lines. */
function strangeFields(text: string, node: Node | undefined, known: readonly string[]): { name: string; line: number } | null {
  for (const prop of node?.type === 'object' ? (node.children ?? []) : []) {
    const name = propertyName(prop);
    if (!known.includes(name)) return { name, line: lineOf(text, prop.offset) };
  }
  return null;
}

/** The checks that need the file's text: unknown fields (with their lines) and the order of "keys". */
function readLayout(text: string): { message: string } | { order: string[] | undefined } {
  const tree = parseTree(text);
  if (!tree) return { order: undefined };
  const top = strangeFields(text, tree, TOP_FIELDS);
  if (top) return { message: `line ${top.line}: unknown field "${visible(top.name)}"${hint(top.name, TOP_FIELDS)} (a keymap has ${TOP_FIELDS.join(', ')})` };
  const keys = findNodeAtLocation(tree, ['keys']);
  if (keys?.type !== 'object') return { order: undefined };
  for (const prop of keys.children ?? []) {
    const odd = strangeFields(text, prop.children?.[1], BINDING_FIELDS);
    if (odd) return { message: `line ${odd.line}: key "${visible(propertyName(prop))}" has unknown field "${visible(odd.name)}"${hint(odd.name, BINDING_FIELDS)} (a key has ${BINDING_FIELDS.join(', ')})` };
  }
  return { order: (keys.children ?? []).map(propertyName) };
}

/** Parse and check a keymap file's text. `source` names the file in every message. */
export function parseKeymap(text: string, source: string): KeymapResult {
  const fail = (message: string): KeymapResult => ({ ok: false, message: `keymap ${source}: ${message}` });
  // Editors on Windows often save a byte-order mark; it is not part of the JSON.
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;
  const json = parseStrictJson(body);
  if (!json.ok) return fail(json.message);
  const dup = json.duplicates[0];
  if (dup) {
    if (dup.path.length === 1 && dup.path[0] === 'keys') {
      return fail(`key "${dup.name}" is bound twice (lines ${dup.firstLine} and ${dup.line}); keep one`);
    }
    const where = dup.path.length ? ` in "${dup.path.join('.')}"` : '';
    return fail(`field "${dup.name}" appears twice${where} (lines ${dup.firstLine} and ${dup.line}); keep one`);
  }
  const layout = readLayout(body);
  if ('message' in layout) return fail(layout.message);
  // Only a copy that exine writes (session file, core.json) lists its groups; a person writes name → role.
  if (Array.isArray((json.value as { groups?: unknown } | null)?.groups)) return fail('"groups" must be an object of group name → role (sum, outside, marker, indeterminable), e.g. { "NPP": "outside" }');
  return checkKeymapValue(json.value, source, true, layout.order);
}

/** The key rule of the first exine versions: one code point, not a C0 or C1 control. Session files written then keep reading. */
function isRecordedKey(key: string): boolean {
  const points = [...key];
  if (points.length !== 1) return false;
  const code = key.codePointAt(0) ?? 0;
  return code >= 0x20 && code !== 0x7f && !(code >= 0x80 && code < 0xa0);
}

/** The file's order when it is a true order of these keys, else the object's own. */
function keyOrder(raw: Record<string, unknown>, given: readonly string[] | undefined): string[] {
  const keys = Object.keys(raw);
  if (given && given.length === keys.length && new Set(given).size === keys.length && given.every((k) => k in raw)) return [...given];
  return keys;
}

/**
 * Check an already-parsed keymap value. `strict` for a keymap a person made:
 * keys must be visible and names free of control characters. A copy held in a
 * session file is read as it was recorded, and printed with those characters
 * escaped (text/visible.ts), so an old or foreign level stays readable.
 * `order`: the order of "keys" as the text gave it (a copy records its own).
 */
export function checkKeymapValue(value: unknown, source: string, strict = false, order?: readonly string[]): KeymapResult {
  const fail = (message: string): KeymapResult => ({ ok: false, message: `keymap ${source}: ${message}` });
  const shape = keymapShapeOf(value);
  if (!shape.ok) return fail(shape.message);
  const raw = shape.raw;
  if (strict && hasUnseen(raw.name)) return fail(`"name" has a control or invisible character ("${visible(raw.name)}"); type the name plainly`);

  const resolved = resolveGroups(raw.groups, raw.sum, strict);
  if (!resolved.ok) return fail(resolved.message);
  const groups: readonly GroupDef[] = resolved.groups;
  const groupNames = groups.map((g) => g.name);

  const keys: Record<string, TaxonBinding> = {};
  const keyOfTaxon = new Map<string, string>();
  const orderOfKeys = keyOrder(raw.keys, order ?? raw.order);
  for (const key of orderOfKeys) {
    const binding = raw.keys[key] as { taxon: string; group: string; inSum?: false };
    if (!(strict ? isPrintableKey(key) : isRecordedKey(key))) {
      return fail(`key "${visible(key)}" must be a single character a person can see on the keyboard (not a control, zero-width, combining or invisible character)`);
    }
    const shown = visible(keyLabel(key));
    if (!groupNames.includes(binding.group)) {
      const own = groupNames.filter((g) => !isBuiltInGroup(g));
      const extra = own.length ? '' : '; a group of your own goes in "groups" with its role';
      return fail(`key "${shown}" has unknown group "${visible(binding.group)}" (expected one of ${groupNames.join(', ')})${hint(binding.group, groupNames)}${extra}`);
    }
    const taxon = binding.taxon.trim();
    if (strict && hasUnseen(taxon)) return fail(`key "${shown}" has a taxon name with a control or invisible character ("${visible(taxon)}"); type the name plainly`);
    // Names that differ only in how accents are encoded are one name (compared in NFC); the file's own spelling is kept.
    const other = keyOfTaxon.get(taxon.normalize('NFC'));
    if (other !== undefined) return fail(`taxon "${taxon}" is on two keys, "${visible(keyLabel(other))}" and "${shown}"; keep one`);
    keyOfTaxon.set(taxon.normalize('NFC'), key);
    keys[key] = binding.inSum === false ? { taxon, group: binding.group, inSum: false } : { taxon, group: binding.group };
  }
  if (orderOfKeys.length === 0) return fail('"keys" is empty; bind at least one taxon');

  const actions: Record<ActionName, string | null> = { ...DEFAULT_ACTIONS };
  const given = raw.actions ?? {};
  // A keymap written before help and new types existed may have a taxon on their default keys: the taxon keeps it.
  for (const name of LATER_ACTIONS) {
    const key = actions[name] as string;
    if (!(name in given) && keys[key]) actions[name] = null;
  }
  for (const [name, key] of Object.entries(given)) {
    if (!(ACTION_NAMES as readonly string[]).includes(name)) {
      return fail(`unknown action "${name}" (expected one of ${ACTION_NAMES.join(', ')})${hint(name, ACTION_NAMES)}`);
    }
    if (key === null) {
      actions[name as ActionName] = null;
      continue;
    }
    if (!isActionKey(key)) {
      return fail(
        `action "${name}" has key ${JSON.stringify(key)} (expected one printable character or one of ${NAMED_KEYS.join(', ')})`,
      );
    }
    actions[name as ActionName] = key;
  }
  const actionOfKey = new Map<string, ActionName>();
  for (const name of ACTION_NAMES) {
    const key = actions[name];
    if (key === null) continue;
    const taxon = keys[key === 'space' ? ' ' : key];
    if (taxon) return fail(`key "${key}" is bound to both taxon "${taxon.taxon}" and action "${name}"; pick one`);
    const twin = actionOfKey.get(key);
    if (twin) return fail(`key "${key}" is bound to both actions "${twin}" and "${name}"; pick one`);
    actionOfKey.set(key, name);
  }
  const sum = groups.filter((g) => g.role === 'sum').map((g) => g.name);
  return { ok: true, keymap: { name: raw.name.trim(), keys, order: orderOfKeys, actions, groups, sum } };
}
