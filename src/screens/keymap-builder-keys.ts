import type { KeyPress } from '../input/key-press.js';
import { editLine } from '../input/line-edit.js';
import { removeKey, setGroup, setKey } from '../keymap/edit-keymap-text.js';
import { isRole, ROLES, type GroupRole } from '../keymap/groups.js';
import { DEFAULT_ACTIONS, DEFAULT_GROUPS, keyLabel, type ActionName, type Keymap } from '../keymap/keymap.js';
import { isPrintableKey, parseKeymap } from '../keymap/parse-keymap.js';
import { visible } from '../text/visible.js';

export type BuilderStep =
  | { readonly kind: 'key' }
  | { readonly kind: 'taxon'; readonly key: string; readonly text: string; readonly replacing: string | null }
  | { readonly kind: 'group'; readonly key: string; readonly taxon: string; readonly text: string }
  | { readonly kind: 'role'; readonly key: string; readonly taxon: string; readonly group: string };

export interface BuilderUi {
  /** The keymap file's text as it will be written. */
  readonly text: string;
  /** That text, read; a keymap with no keys yet while it has none. */
  readonly keymap: Keymap;
  readonly step: BuilderStep;
  /** The group chosen last: Enter on an empty group line takes it again. */
  readonly lastGroup: string | null;
  readonly message: { readonly text: string; readonly warning: boolean } | null;
  readonly changed: boolean;
  readonly done: boolean;
}

export const ROLE_CHOICES: readonly (readonly [string, GroupRole, string])[] = [
  ['1', 'sum', 'in the pollen sum'],
  ['2', 'outside', 'outside the sum (percent of sum + group)'],
  ['3', 'marker', 'exotic marker'],
  ['4', 'indeterminable', 'indeterminable'],
];

function emptyKeymap(name: string): Keymap {
  return { name, keys: {}, order: [], actions: { ...DEFAULT_ACTIONS }, groups: DEFAULT_GROUPS, sum: ['trees', 'shrubs', 'herbs'] };
}

/** The builder on a keymap text: a new one (no keys) or a file to edit. */
export function startBuilder(text: string, name: string, source: string): BuilderUi | { error: string } {
  const r = parseKeymap(text, source);
  let keymap: Keymap;
  if (r.ok) keymap = r.keymap;
  else if (/"keys" is empty/.test(r.message)) keymap = emptyKeymap(name);
  else return { error: r.message };
  return { text, keymap, step: { kind: 'key' }, lastGroup: null, message: null, changed: false, done: false };
}

const say = (ui: BuilderUi, text: string, warning = false): BuilderUi => ({ ...ui, message: { text, warning } });

function actionOf(keymap: Keymap, name: string): ActionName | null {
  for (const [action, key] of Object.entries(keymap.actions)) if (key === name) return action as ActionName;
  return null;
}

/** The groups whose names start with what is typed (an exact name wins). */
export function matchingGroups(keymap: Keymap, typed: string): string[] {
  const t = typed.trim().toLowerCase();
  const names = keymap.groups.map((g) => g.name);
  const exact = names.filter((g) => g.toLowerCase() === t);
  return exact.length ? exact : names.filter((g) => g.toLowerCase().startsWith(t));
}

/** The text edited and read back; a change that would make a bad keymap is refused and said. */
function apply(ui: BuilderUi, text: string, done: string): BuilderUi {
  const r = parseKeymap(text, 'the new keymap');
  if (!r.ok) {
    if (/"keys" is empty/.test(r.message)) return { ...ui, text, keymap: emptyKeymap(ui.keymap.name), step: { kind: 'key' }, changed: true, message: { text: done, warning: false } };
    return say({ ...ui, step: { kind: 'key' } }, r.message.replace(/^keymap the new keymap: /, ''), true);
  }
  return { ...ui, text, keymap: r.keymap, step: { kind: 'key' }, changed: true, message: { text: done, warning: false } };
}

function bind(ui: BuilderUi, key: string, taxon: string, group: string, role: GroupRole | null): BuilderUi {
  let text = ui.text;
  if (role) text = setGroup(text, group, role);
  text = setKey(text, key, { taxon, group });
  const next = apply(ui, text, `${keyLabel(key)} = ${taxon} (${group})${role ? `; new group ${group}: ${role}` : ''}`);
  return next.keymap.keys[key]?.taxon === taxon ? { ...next, lastGroup: group } : next;
}

function keyStep(ui: BuilderUi, press: KeyPress): BuilderUi {
  const { keymap } = ui;
  if (press.kind === 'enter') return { ...ui, done: true };
  const named = press.kind === 'backspace' || press.kind === 'tab' || press.kind === 'escape' ? press.kind : null;
  if (named) {
    const action = actionOf(keymap, named);
    return say(ui, `${keyLabel(named)} is ${action ? `the ${action} action` : 'not a taxon key'}: press a character key, or Enter to finish`, true);
  }
  if (press.kind !== 'char') return ui;
  const key = press.char;
  if (!isPrintableKey(key)) return say(ui, `that key cannot hold a taxon (not a character a person can see): press another`, true);
  const action = actionOf(keymap, key === ' ' ? 'space' : key);
  if (action) return say(ui, `${keyLabel(key)} is the ${action} action: press another key`, true);
  const holder = keymap.keys[key];
  if (holder) {
    return {
      ...ui,
      step: { kind: 'taxon', key, text: '', replacing: holder.taxon },
      message: { text: `${keyLabel(key)} holds ${visible(holder.taxon)} (${visible(holder.group)}): type a new taxon to put there, "-" to free the key, or Enter to keep it`, warning: true },
    };
  }
  return { ...ui, step: { kind: 'taxon', key, text: '', replacing: null }, message: null };
}

function taxonStep(ui: BuilderUi, step: Extract<BuilderStep, { kind: 'taxon' }>, press: KeyPress): BuilderUi {
  if (press.kind === 'tab') return ui;
  const next = editLine(step.text, press);
  if (next === 'quit') return { ...ui, done: true };
  if (next === 'cancel') return say({ ...ui, step: { kind: 'key' } }, `${keyLabel(step.key)}: nothing changed`);
  if (next !== 'enter') return { ...ui, step: { ...step, text: next } };
  const taxon = step.text.trim();
  if (!taxon) {
    if (step.replacing !== null) return say({ ...ui, step: { kind: 'key' } }, `${keyLabel(step.key)} keeps ${visible(step.replacing)}`);
    return { ...ui, done: true };
  }
  if (step.replacing !== null && taxon === '-') return apply(ui, removeKey(ui.text, step.key), `${keyLabel(step.key)} is free (${visible(step.replacing)} taken out)`);
  const other = ui.keymap.order.find((k) => k !== step.key && ui.keymap.keys[k]?.taxon.normalize('NFC') === taxon.normalize('NFC'));
  if (other !== undefined) return say({ ...ui, step: { ...step, text: '' } }, `${visible(taxon)} is on key ${keyLabel(other)} already: type another name, or Esc`, true);
  return { ...ui, step: { kind: 'group', key: step.key, taxon, text: '' }, message: null };
}

function groupStep(ui: BuilderUi, step: Extract<BuilderStep, { kind: 'group' }>, press: KeyPress): BuilderUi {
  if (press.kind === 'tab') {
    // Tab completes a group name that is unique so far.
    const m = matchingGroups(ui.keymap, step.text);
    return m.length === 1 ? { ...ui, step: { ...step, text: m[0] as string } } : ui;
  }
  const next = editLine(step.text, press);
  if (next === 'quit') return { ...ui, done: true };
  if (next === 'cancel') return say({ ...ui, step: { kind: 'key' } }, `${visible(step.taxon)} not added`);
  if (next !== 'enter') return { ...ui, step: { ...step, text: next } };
  const typed = step.text.trim();
  if (!typed) {
    if (ui.lastGroup) return bind(ui, step.key, step.taxon, ui.lastGroup, null);
    return say(ui, 'type the group (its first letters are enough)', true);
  }
  const m = matchingGroups(ui.keymap, typed);
  if (m.length === 1) return bind(ui, step.key, step.taxon, m[0] as string, null);
  if (m.length > 1) return say(ui, `"${visible(typed)}" could be ${m.join(', ')}: type more of it`, true);
  if (typed.includes(',')) return say(ui, 'a group name has no comma', true);
  return { ...ui, step: { kind: 'role', key: step.key, taxon: step.taxon, group: typed }, message: null };
}

function roleStep(ui: BuilderUi, step: Extract<BuilderStep, { kind: 'role' }>, press: KeyPress): BuilderUi {
  if (press.kind === 'escape') return { ...ui, step: { kind: 'group', key: step.key, taxon: step.taxon, text: step.group }, message: null };
  if (press.kind === 'interrupt') return { ...ui, done: true };
  if (press.kind !== 'char') return ui;
  const choice = ROLE_CHOICES.find(([k, role]) => k === press.char || role[0] === press.char.toLowerCase());
  if (!choice || !isRole(choice[1])) return say(ui, `press 1–4 (${ROLES.join(', ')})`, true);
  return bind(ui, step.key, step.taxon, step.group, choice[1]);
}

/** One key in the builder. Ctrl-C ends it as Enter on an empty taxon does: what was made is kept. */
export function builderKey(ui: BuilderUi, press: KeyPress): BuilderUi {
  if (ui.done) return ui;
  if (press.kind === 'interrupt') return { ...ui, done: true };
  const { step } = ui;
  switch (step.kind) {
    case 'key':
      return keyStep(ui, press);
    case 'taxon':
      return taxonStep(ui, step, press);
    case 'group':
      return groupStep(ui, step, press);
    case 'role':
      return roleStep(ui, step, press);
  }
}
