import { tableWidth, taxonWidthFor } from './totals-table.js';
import { saturationHeight } from './saturation-panel.js';

/** The smallest terminal the counting screen is laid out for: the table (56 columns) beside a side column (20), and the panels' shortest stack (12 lines). */
export const MIN_COLUMNS = 78;
export const MIN_ROWS = 12;

/** One line for a terminal below the smallest size, or null when it is large enough. */
export function tooSmall(columns: number, rows: number, min = { columns: MIN_COLUMNS, rows: MIN_ROWS }): string | null {
  if (columns >= min.columns && rows >= min.rows) return null;
  return `terminal too small: at least ${min.columns} x ${min.rows} (this one is ${columns} x ${rows}). Make the window larger; keys still count, Ctrl-C saves and quits.`;
}

export interface LayoutNeeds {
  readonly width: number;
  readonly height: number;
  /** Lines the status takes (1–3). */
  readonly statusLines: number;
  /** The stop banner takes a line while the rules are met. */
  readonly banner: boolean;
  /** Height of the sum panel, whole or compact (two groups a line). */
  readonly sumHeight: (compact: boolean) => number;
  readonly rulesHeight: number;
  /** Lines the rare-types panel would take in full. */
  readonly rareLines: number;
}

export interface CountLayout {
  readonly mainHeight: number;
  readonly taxonWidth: number;
  readonly sideWidth: number;
  /** A wide side splits in two columns: sum, rules and the curve; rare types and recent events. */
  readonly wide: boolean;
  readonly colWidth: number;
  readonly compactSum: boolean;
  /** A blank line between panels, when there is room for it. */
  readonly gap: number;
  /** Rows of the curve's plot; the curve is left out below 2. */
  readonly plotRows: number;
  readonly legend: boolean;
  readonly rareRoom: number;
  readonly recentRoom: number;
}

/** Where each panel of the counting screen goes, for a terminal of a given size. */
export function countLayout(n: LayoutNeeds): CountLayout {
  // Two header lines, the banner, the status, one key line.
  const mainHeight = n.height - 3 - n.statusLines - (n.banner ? 1 : 0);
  const taxonWidth = taxonWidthFor(n.width);
  const sideWidth = Math.max(20, n.width - tableWidth(taxonWidth) - 2);
  const wide = sideWidth >= 56;
  const colWidth = wide ? Math.floor((sideWidth - 3) / 2) : sideWidth;
  const compactSum = !wide && mainHeight < 26;
  const gap = mainHeight >= 24 ? 1 : 0;
  const left = mainHeight - n.sumHeight(compactSum) - (n.rulesHeight ? n.rulesHeight + gap : 0);
  // The curve gets what is left in its column; in one narrow column recent events keep at least four lines.
  const plotRows = Math.max(0, Math.min(wide ? 12 : 8, left - gap - (wide ? 3 : 7)));
  const legend = wide || plotRows >= 5;
  const curveHeight = plotRows >= 2 ? saturationHeight(plotRows, legend) + gap : 0;
  const rareRoom = wide ? Math.max(3, Math.min(n.rareLines, Math.floor(mainHeight / 2))) : 0;
  // One line of the recent events' room is its title.
  const recentRoom = Math.max(1, (wide ? mainHeight - rareRoom - gap : left - curveHeight - gap) - 1);
  return { mainHeight, taxonWidth, sideWidth, wide, colWidth, compactSum, gap, plotRows, legend, rareRoom, recentRoom };
}
