import { fit } from '../text/cells.js';
import { GROUPS, type Group } from './groups.js';
import { ACTION_NAMES, keyLabel, type Keymap } from './keymap.js';

/** One capital per group, for cells too narrow for the name. */
export const GROUP_LETTER: Readonly<Record<Group, string>> = {
  trees: 'T',
  shrubs: 'S',
  herbs: 'H',
  spores: 'P',
  aquatics: 'A',
  markers: 'M',
  indeterminable: 'I',
  other: 'O',
};

const KEYBOARD_ROWS = ['1234567890-=', 'qwertyuiop[]', "asdfghjkl;'", 'zxcvbnm,./'];
const KEYPAD_ROWS: readonly (readonly string[])[] = [
  ['/', '*', '-'],
  ['7', '8', '9', '+'],
  ['4', '5', '6'],
  ['1', '2', '3', 'enter'],
  ['0', '', '.'],
];
const KEYPAD_KEYS = new Set(KEYPAD_ROWS.flat().filter(Boolean));

function cellFor(keymap: Keymap, key: string, width: number): [string, string] {
  if (!key) return [' '.repeat(width), ' '.repeat(width)];
  const binding = keymap.keys[key];
  const action = ACTION_NAMES.find((a) => keymap.actions[a] === key);
  const label = keyLabel(key);
  if (binding) return [fit(`${label} ${GROUP_LETTER[binding.group]}`, width), fit(binding.taxon, width)];
  if (action) return [fit(label, width), fit(`(${action})`, width)];
  return [fit(label, width), fit('·', width)];
}

function drawRows(keymap: Keymap, rows: readonly (readonly string[])[], width: number, stagger: boolean): string[] {
  const out: string[] = [];
  rows.forEach((row, i) => {
    if (!row.some((k) => k && (keymap.keys[k] || ACTION_NAMES.some((a) => keymap.actions[a] === k)))) return;
    const bound = (k: string) => k && (keymap.keys[k] || ACTION_NAMES.some((a) => keymap.actions[a] === k));
    let end = row.length;
    while (end > 0 && !bound(row[end - 1] as string)) end--;
    const cells = row.slice(0, end).map((k) => cellFor(keymap, k, width));
    const indent = stagger ? ' '.repeat(i) : '';
    out.push(indent + cells.map((c) => c[0]).join(' ').trimEnd());
    out.push(indent + cells.map((c) => c[1]).join(' ').trimEnd());
    out.push('');
  });
  return out;
}

/** The keymap drawn as the keyboard (or numeric keypad) it is used on, then as a list. */
export function drawLayout(keymap: Keymap): string {
  const keys = Object.keys(keymap.keys);
  const onKeypad = keys.every((k) => KEYPAD_KEYS.has(k));
  const grid = onKeypad
    ? drawRows(keymap, KEYPAD_ROWS, 12, false)
    : drawRows(keymap, KEYBOARD_ROWS.map((r) => [...r]), 7, true);
  const offGrid = onKeypad ? [] : keys.filter((k) => !KEYBOARD_ROWS.some((r) => r.includes(k)));
  const list = Object.entries(keymap.keys).map(
    ([key, b]) => `  ${fit(keyLabel(key), 6)} ${fit(b.taxon, 26)} ${fit(b.group, 15)}${keymap.sum.includes(b.group) ? 'in sum' : ''}`,
  );
  return [
    `${keymap.name} — ${keys.length} taxa, laid out on ${onKeypad ? 'the numeric keypad' : 'the keyboard'}`,
    '',
    ...grid,
    `groups: ${GROUPS.map((g) => `${GROUP_LETTER[g]} ${g}`).join(', ')}`,
    '',
    ...(offGrid.length ? [`not drawn above: ${offGrid.map(keyLabel).join(' ')}`, ''] : []),
    `  ${fit('key', 6)} ${fit('taxon', 26)} ${fit('group', 15)}`,
    ...list,
    '',
    `actions: ${ACTION_NAMES.map((a) => `${a} = ${keyLabel(keymap.actions[a])}`).join(', ')}; Ctrl-C saves and quits`,
    `pollen sum: ${keymap.sum.join(' + ')}`,
  ].join('\n');
}
