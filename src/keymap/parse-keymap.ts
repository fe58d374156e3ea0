import { DEFAULT_SUM, GROUPS, isGroup, type Group } from './groups.js';
import { parseStrictJson } from './json-source.js';
import { keymapShapeOf } from './keymap-shape.js';
import {
  ACTION_NAMES,
  DEFAULT_ACTIONS,
  LATER_ACTIONS,
  NAMED_KEYS,
  type ActionName,
  type Keymap,
  type TaxonBinding,
} from './keymap.js';
import { describeIssue } from '../validation/describe-issue.js';
import { hasUnseen, UNSEEN, visible } from '../text/visible.js';


export type KeymapResult = { ok: true; keymap: Keymap } | { ok: false; message: string };

// Nothing a person sees on a key, or a terminal acts on: see text/visible.ts. A combining mark alone is no key either.
const COMBINING = /^[\p{Mn}\p{Me}]$/u;

/** A single printable character: one code point that a person can see on a key. */
export function isPrintableKey(key: string): boolean {
  const points = [...key];
  if (points.length !== 1) return false;
  return !UNSEEN.test(key) && !COMBINING.test(key);
}


function isActionKey(key: string): boolean {
  return (NAMED_KEYS as readonly string[]).includes(key) || (isPrintableKey(key) && key !== ' ');
}

/** Parse and check a keymap file's text. `source` names the file in every message. */
export function parseKeymap(text: string, source: string): KeymapResult {
  const fail = (message: string): KeymapResult => ({ ok: false, message: `keymap ${source}: ${message}` });
  // Editors on Windows often save a byte-order mark; it is not part of the JSON.
  const json = parseStrictJson(text.startsWith('\uFEFF') ? text.slice(1) : text);
  if (!json.ok) return fail(json.message);
  const dup = json.duplicates[0];
  if (dup) {
    if (dup.path.length === 1 && dup.path[0] === 'keys') {
      return fail(`key "${dup.name}" is bound twice (lines ${dup.firstLine} and ${dup.line}); keep one`);
    }
    const where = dup.path.length ? ` in "${dup.path.join('.')}"` : '';
    return fail(`field "${dup.name}" appears twice${where} (lines ${dup.firstLine} and ${dup.line}); keep one`);
  }
  return checkKeymapValue(json.value, source, true);
}

/** The key rule of the first exine versions: one code point, not a C0 or C1 control. Session files written then keep reading. */
function isRecordedKey(key: string): boolean {
  const points = [...key];
  if (points.length !== 1) return false;
  const code = key.codePointAt(0) ?? 0;
  return code >= 0x20 && code !== 0x7f && !(code >= 0x80 && code < 0xa0);
}

/**
 * Check an already-parsed keymap value. `strict` for a keymap a person made:
 * keys must be visible and names free of control characters. A copy held in a
 * session file is read as it was recorded, and printed with those characters
 * escaped (text/visible.ts), so an old or foreign level stays readable.
 */
export function checkKeymapValue(value: unknown, source: string, strict = false): KeymapResult {
  const fail = (message: string): KeymapResult => ({ ok: false, message: `keymap ${source}: ${message}` });
  const shape = keymapShapeOf(value);
  if (!shape.ok) return fail(shape.message);
  const raw = shape.raw;
  if (strict && hasUnseen(raw.name)) return fail(`"name" has a control or invisible character ("${visible(raw.name)}"); type the name plainly`);

  const keys: Record<string, TaxonBinding> = {};
  const keyOfTaxon = new Map<string, string>();
  for (const [key, binding] of Object.entries(raw.keys)) {
    if (!(strict ? isPrintableKey(key) : isRecordedKey(key))) {
      return fail(`key "${visible(key)}" must be a single character a person can see on the keyboard (not a control, zero-width, combining or invisible character)`);
    }
    if (!isGroup(binding.group)) {
      return fail(
        `key "${key}" has unknown group "${binding.group}" (expected one of ${GROUPS.join(', ')})`,
      );
    }
    const taxon = binding.taxon.trim();
    if (strict && hasUnseen(taxon)) return fail(`key "${visible(key)}" has a taxon name with a control or invisible character ("${visible(taxon)}"); type the name plainly`);
    // Names that differ only in how accents are encoded are one name (compared in NFC); the file's own spelling is kept.
    const other = keyOfTaxon.get(taxon.normalize('NFC'));
    if (other !== undefined) return fail(`taxon "${taxon}" is on two keys, "${other}" and "${key}"; keep one`);
    keyOfTaxon.set(taxon.normalize('NFC'), key);
    keys[key] = { taxon, group: binding.group };
  }
  if (Object.keys(keys).length === 0) return fail('"keys" is empty; bind at least one taxon');

  const actions: Record<ActionName, string | null> = { ...DEFAULT_ACTIONS };
  const given = raw.actions ?? {};
  // A keymap written before help and new types existed may have a taxon on their default keys: the taxon keeps it.
  for (const name of LATER_ACTIONS) {
    const key = actions[name] as string;
    if (!(name in given) && keys[key]) actions[name] = null;
  }
  for (const [name, key] of Object.entries(given)) {
    if (!(ACTION_NAMES as readonly string[]).includes(name)) {
      return fail(`unknown action "${name}" (expected one of ${ACTION_NAMES.join(', ')})`);
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

  let sum: Group[] = [...DEFAULT_SUM];
  if (raw.sum) {
    sum = [];
    for (const group of raw.sum) {
      if (!isGroup(group)) return fail(`"sum" lists unknown group "${group}" (expected one of ${GROUPS.join(', ')})`);
      if (!sum.includes(group)) sum.push(group);
    }
    if (sum.length === 0) return fail('"sum" is empty; list the groups of the pollen sum');
  }
  return { ok: true, keymap: { name: raw.name.trim(), keys, actions, sum } };
}
