import { groupShort, groupTitle } from '../keymap/group-labels.js';
import type { Group } from '../keymap/groups.js';
import type { LevelTable } from '../stats/level-table.js';
import { bar, fit, right } from '../text/cells.js';
import { line, type Line } from './styled-line.js';

const SHORT: Readonly<Record<string, string>> = {
  trees: 'Trees',
  herbs: 'Herbs',
  markers: 'Marks',
};
const shortOf = (g: Group) => SHORT[g] ?? groupTitle(groupShort(g, 5));
const capital = groupTitle;

function shownGroups(table: LevelTable) {
  return table.groups.filter((g) => table.sumGroups.includes(g) || (table.groupTotals[g] ?? 0) > 0);
}

/** Lines the panel takes, so the screen can give the rest to other panels. */
export function sumPanelHeight(table: LevelTable, target: number | null, compact = false): number {
  const groups = compact ? Math.ceil(shownGroups(table).length / 2) : shownGroups(table).length;
  if (target === null) return 1 + groups;
  return 2 + (table.pollenSum >= target ? 1 : 0) + groups;
}

/** "Trees 135 · 57%"-style cells: count, and a share for groups outside the sum (of sum + group). */
function groupCell(table: LevelTable, g: Group, width: number): string {
  const n = table.groupTotals[g] ?? 0;
  const outside = !table.sumGroups.includes(g);
  const share = outside && n > 0 ? ` ${((100 * n) / (table.pollenSum + n)).toFixed(0)}%` : '';
  // One label width for every group, so the counts stand in one column.
  return `${fit(capital(g), Math.max(4, width - 12))} ${right(String(n), 5)}${right(share, 4)}${outside ? ' *' : ''}`;
}

/** The pollen sum against its target as a bar, then the group subtotals: whole, or two to a line when short of rows. */
export function sumLines(table: LevelTable, target: number | null, width: number, compact = false): Line[] {
  const groups = shownGroups(table);
  const half = Math.floor((width - 1) / 2);
  const pairs: string[] = [];
  if (compact) {
    for (let i = 0; i < groups.length; i += 2) {
      const cell = (g: Group | undefined) => (g ? `${fit(shortOf(g), half - 5)}${right(String(table.groupTotals[g] ?? 0), 4)}${table.sumGroups.includes(g) ? ' ' : '*'}` : '');
      // Five letters and four digits fit a 22-column side panel.
      pairs.push(`${cell(groups[i])}${cell(groups[i + 1])}`);
    }
  }
  const reached = target !== null && table.pollenSum >= target;
  const barWidth = Math.max(6, Math.min(30, width - 7));
  return [
    line(target === null ? `Pollen sum ${table.pollenSum}` : `Pollen sum ${table.pollenSum} / ${target}`, { bold: true }),
    ...(target === null ? [] : [line(`${bar(table.pollenSum / target, barWidth)} ${right(`${Math.floor((100 * table.pollenSum) / target)}%`, 4)}`, { tone: reached ? 'ok' : 'accent' })]),
    ...(reached ? [line('TARGET SUM REACHED', { tone: 'ok', bold: true })] : []),
    ...(compact ? pairs.map((p) => line(p)) : groups.map((g) => line(groupCell(table, g, width)))),
  ];
}
