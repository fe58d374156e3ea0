import { fit } from '../text/cells.js';
import { visible } from '../text/visible.js';
import { groupLetters } from './group-labels.js';
import { actionOn, keyGrid, type GridKey } from './key-grid.js';
import { ACTION_NAMES, bindingInSum, bindingsOf, keyLabel, type Keymap } from './keymap.js';

function cellFor(keymap: Keymap, letters: ReadonlyMap<string, string>, key: string, width: number): [string, string] {
  const binding = keymap.keys[key];
  const action = actionOn(keymap, key);
  const label = keyLabel(key);
  if (binding) return [fit(`${label} ${letters.get(binding.group) ?? '?'}`, width), fit(visible(binding.taxon), width)];
  if (action) return [fit(label, width), fit(`(${action})`, width)];
  return [fit(label, width), fit('·', width)];
}

/** Text rows of a drawing: each key row as two lines (key and group letter, taxon), blank rows left out. */
function drawRows(keymap: Keymap, keys: readonly GridKey[], cellWidth: number, stagger: boolean): string[] {
  const letters = groupLetters(keymap.groups.map((g) => g.name));
  const out: string[] = [];
  const rows = [...new Set(keys.map((k) => k.y))].sort((a, b) => a - b);
  for (const y of rows) {
    const row = keys.filter((k) => k.y === y).sort((a, b) => a.x - b.x);
    const bound = (k: GridKey) => keymap.keys[k.key] !== undefined || actionOn(keymap, k.key) !== null;
    if (!row.some(bound)) continue;
    let end = row.length;
    while (end > 0 && !bound(row[end - 1] as GridKey)) end--;
    const start = stagger ? 0 : 0;
    const first = row[start] as GridKey;
    const cells = row.slice(start, end).map((k) => cellFor(keymap, letters, k.key, cellWidth * k.w + (k.w - 1)));
    const indent = ' '.repeat(Math.round(stagger ? first.x * 2 : first.x * (cellWidth + 1)));
    out.push(indent + cells.map((c) => c[0]).join(' ').trimEnd());
    out.push(indent + cells.map((c) => c[1]).join(' ').trimEnd());
    out.push('');
  }
  return out;
}

/** Only the drawing of the keyboard or keypad, row by row. */
export function drawGrid(keymap: Keymap, cellWidth?: number): string[] {
  const grid = keyGrid(keymap);
  return grid.kind === 'keypad' ? drawRows(keymap, grid.keys, cellWidth ?? 12, false) : drawRows(keymap, grid.keys, cellWidth ?? 7, true);
}

/** The keymap drawn as the keyboard (or numeric keypad) it is used on, then as a list in the file's order. */
export function drawLayout(keymap: Keymap): string {
  const grid = keyGrid(keymap);
  const pad = grid.kind === 'keypad';
  const drawing = drawGrid(keymap);
  const letters = groupLetters(keymap.groups.map((g) => g.name));
  const used = new Set(Object.values(keymap.keys).map((b) => b.group));
  const list = bindingsOf(keymap).map(
    ([key, b]) => `  ${fit(keyLabel(key), 6)} ${fit(visible(b.taxon), 26)} ${fit(visible(b.group), 15)}${bindingInSum(keymap, b) ? 'in sum' : b.inSum === false ? 'taken out of the sum' : ''}`,
  );
  const groupsLine = keymap.groups
    .filter((g) => used.has(g.name) || g.role === 'sum')
    .map((g) => `${letters.get(g.name)} ${visible(g.name)} (${g.role})`)
    .join(', ');
  return [
    `${visible(keymap.name)} — ${keymap.order.length} taxa, laid out on ${pad ? 'the numeric keypad' : 'the keyboard'}`,
    '',
    ...drawing,
    `groups: ${groupsLine}`,
    '',
    ...(grid.offGrid.length ? [`not drawn above: ${grid.offGrid.map(keyLabel).join(' ')}`, ''] : []),
    `  ${fit('key', 6)} ${fit('taxon', 26)} ${fit('group', 15)}`,
    ...list,
    '',
    `actions: ${ACTION_NAMES.map((a) => `${a} = ${keyLabel(keymap.actions[a])}`).join(', ')}; Ctrl-C saves and quits`,
    `pollen sum: ${keymap.sum.map(visible).join(' + ')}`,
  ].join('\n');
}
