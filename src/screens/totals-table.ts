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

/** Which rows fit: keep the keymap's order; drop uncounted rows from the end first. */
export function visibleRows(rows: readonly TaxonRow[], room: number): { shown: TaxonRow[]; hidden: number } {
  if (rows.length <= room) return { shown: [...rows], hidden: 0 };
  const keep = Math.max(0, room - 1);
  const counted = rows.filter((r) => r.count > 0);
  let shown: TaxonRow[];
  if (counted.length >= keep) shown = counted.slice(0, keep);
  else {
    let spare = keep - counted.length;
    shown = rows.filter((r) => r.count > 0 || spare-- > 0);
  }
  return { shown, hidden: rows.length - shown.length };
}

function rowText(r: TaxonRow, taxonWidth: number): string {
  const key = r.key === null ? '' : keyLabel(r.key);
  return `${fit(key, 3)} ${fit(r.taxon, taxonWidth)} ${fit(groupShort(r.group), 6)} ${right(String(r.count), 5)} ${right(pct(r.percent), 5)}  ${ci(r.ciLow, r.ciHigh)}`;
}

/**
 * The totals table: a title, a row per taxon that fits in `room`, and how many
 * rows did not. The taxon of the grain recorded last is marked, so a glance
 * confirms the key.
 */
export function totalsLines(table: LevelTable, room: number, justCounted: string | null, taxonWidth: number): Line[] {
  const { shown, hidden } = visibleRows(table.rows, room);
  const width = tableWidth(taxonWidth);
  return [
    line(`${fit('Key', 3)} ${fit('Taxon', taxonWidth)} ${fit('Group', 6)} ${right('Count', 5)} ${right('%', 5)}  95% CI`, { bold: true }),
    ...shown.map((r) =>
      line(`${fit(`${rowText(r, taxonWidth)}${r.inSum ? '' : ' *'}`, width - 2)}${r.taxon === justCounted ? '◀' : ''}`, {
        tone: r.count === 0 ? 'zero' : undefined,
        bold: r.taxon === justCounted,
      }),
    ),
    ...(hidden > 0 ? [line(`… ${hidden} more taxa not shown (a taller terminal shows them)`, { tone: 'zero' })] : []),
  ];
}
