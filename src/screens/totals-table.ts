import { keyLabel } from '../keymap/keymap.js';
import type { LevelTable, TaxonRow } from '../stats/level-table.js';
import { ci, fit, pct, right } from '../text/cells.js';
import { line, type Line } from './styled-line.js';

import { groupShort } from '../keymap/group-labels.js';

/** The table's width for a taxon column of `taxonWidth` characters (18 fits 80 columns). */
export function tableWidth(taxonWidth: number): number {
  return taxonWidth + 38;
}

/** Wider terminals give long names (e.g. "Plantago lanceolata") room before the side panels. */
export function taxonWidthFor(columns: number): number {
  return columns >= 110 ? 30 : 18;
}

/** "1 taxon", "3 taxa". */
export const taxa = (n: number): string => `${n} ${n === 1 ? 'taxon' : 'taxa'}`;

/**
 * Which rows fit, in the keymap's order. The row just counted and the marker rows
 * always stay (a key's grain is confirmed at a glance, and the markers are watched
 * all along); then rows with counts; uncounted rows are dropped first.
 */
export function visibleRows(rows: readonly TaxonRow[], room: number, pinned: ReadonlySet<string> = new Set()): { shown: TaxonRow[]; hidden: number; hiddenCounted: number } {
  if (rows.length <= room) return { shown: [...rows], hidden: 0, hiddenCounted: 0 };
  const keep = Math.max(0, room - 1);
  const rank = (r: TaxonRow) => (pinned.has(r.taxon) || r.group === 'markers' ? 0 : r.count > 0 ? 1 : 2);
  const order = rows.map((r, i) => ({ r, i })).sort((a, b) => rank(a.r) - rank(b.r) || a.i - b.i);
  const chosen = new Set(order.slice(0, keep).map((o) => o.i));
  const shown = rows.filter((_, i) => chosen.has(i));
  const hiddenRows = rows.filter((_, i) => !chosen.has(i));
  return { shown, hidden: hiddenRows.length, hiddenCounted: hiddenRows.filter((r) => r.count > 0).length };
}

/** The taxon cell, with "cf3" at its end when cf. grains of it count: the name gives way, the tally does not. */
function taxonCell(r: TaxonRow, taxonWidth: number, cf: number): string {
  if (!cf) return fit(r.taxon, taxonWidth);
  const tag = ` cf${cf}`;
  return `${fit(r.taxon, taxonWidth - tag.length)}${tag}`;
}

function rowText(r: TaxonRow, taxonWidth: number, cf: number): string {
  const key = r.key === null ? '' : keyLabel(r.key);
  return `${fit(key, 3)} ${taxonCell(r, taxonWidth, cf)} ${fit(groupShort(r.group), 6)} ${right(String(r.count), 5)} ${right(pct(r.percent), 5)}  ${ci(r.ciLow, r.ciHigh)}`;
}

/** "… 18 taxa hidden, 3 of them counted", with the hint when it fits. */
function hiddenLine(hidden: number, counted: number, width: number): string {
  const text = `… ${taxa(hidden)} hidden, ${counted === 0 ? 'none counted yet' : `${counted === hidden ? (hidden === 1 ? 'it' : 'all') : counted} counted`}`;
  const hint = ' (a taller terminal shows them)';
  return text.length + hint.length <= width ? text + hint : text;
}

/**
 * The totals table: a title, a row per taxon that fits in `room`, and how many
 * rows did not (and how many of those hold grains). The taxon of the grain
 * recorded last is marked and always shown, so a glance confirms the key.
 */
export function totalsLines(table: LevelTable, room: number, justCounted: string | null, taxonWidth: number, cf: Readonly<Record<string, number>> = {}): Line[] {
  const { shown, hidden, hiddenCounted } = visibleRows(table.rows, room, new Set(justCounted === null ? [] : [justCounted]));
  const width = tableWidth(taxonWidth);
  return [
    line(`${fit('Key', 3)} ${fit('Taxon', taxonWidth)} ${fit('Group', 6)} ${right('Count', 5)} ${right('%', 5)}  95% CI`, { bold: true }),
    ...shown.map((r) =>
      line(`${fit(`${rowText(r, taxonWidth, cf[r.taxon] ?? 0)}${r.inSum ? '' : ' *'}`, width - 2)}${r.taxon === justCounted ? '◀' : ''}`, {
        tone: r.count === 0 ? 'zero' : undefined,
        bold: r.taxon === justCounted,
      }),
    ),
    ...(hidden > 0 ? [line(hiddenLine(hidden, hiddenCounted, width), { tone: hiddenCounted ? 'warning' : 'zero' })] : []),
  ];
}
