import type { CoreModel } from '../core/core-model.js';
import { MIN_COMPARED_SUM } from '../core/next-level.js';
import type { OverviewRow } from '../core/overview.js';
import type { Strip } from '../core/strips.js';
import { fit, right } from '../text/cells.js';
import { compact } from '../text/numbers.js';
import type { Tone } from './styled-line.js';
import { localDate } from '../text/local-time.js';

/** A column of the level table: its heading, its width, and a row's cell with its tone. */
export interface Column {
  readonly name: string;
  readonly width: number;
  readonly cell: (row: OverviewRow, facts: RowFacts) => { text: string; tone?: Tone };
}

/** What a row's cells know of the core beyond the row: its distance to the counted level above. */
export interface RowFacts {
  readonly distanceAbove: number | null;
  readonly odd: boolean;
  readonly next: boolean;
}

export const depthText = (d: number | null) => (d === null ? 'no depth' : `${Number(d.toFixed(2))}cm`);

/** "45m", "3h05": time spent counting. */
export function shortTime(ms: number): string {
  const minutes = Math.round(ms / 60_000);
  if (minutes < 60) return `${minutes}m`;
  return `${Math.floor(minutes / 60)}h${String(minutes % 60).padStart(2, '0')}`;
}

const STATUS_TONE: Record<OverviewRow['status'], Tone | undefined> = {
  planned: 'dim',
  'in progress': 'accent',
  'rules met': 'ok',
  finished: undefined,
  unreadable: 'error',
};

export function integrityText(row: OverviewRow): { text: string; tone?: Tone } {
  const i = row.integrity;
  if (!i) return { text: '', tone: 'dim' };
  if (i.kind === 'damaged') return { text: 'DAMAGED', tone: 'error' };
  if (i.kind === 'torn') return { text: 'torn end', tone: 'warning' };
  if (row.outside.length > 0) return { text: i.closed ? 'ok, own' : 'open, own', tone: 'warning' };
  return { text: i.closed ? 'intact' : 'open', tone: i.closed ? undefined : 'accent' };
}

function sumText(r: OverviewRow): string {
  if (r.status === 'unreadable') return '';
  const sum = r.status === 'planned' ? '–' : String(r.pollenSum);
  return r.targetSum === null ? sum : `${sum}/${r.targetSum}`;
}

function needText(r: OverviewRow): string {
  if (r.status === 'planned' || r.status === 'unreadable') return '';
  if (r.grainsNeeded === null) return '?';
  return r.grainsNeeded === 0 ? '0' : `+${compact(r.grainsNeeded)}`;
}

const c = (text: string, tone?: Tone) => (tone ? { text, tone } : { text });

/** Every column, in the order shown; `keep` says which stay at the narrowest width. */
const ALL: readonly (Column & { keep: boolean })[] = [
  { name: 'depth', width: 8, keep: true, cell: (r, f) => c(right(depthText(r.depth), 7) + (f.odd ? '?' : f.next ? '◂' : ' '), f.odd ? 'warning' : undefined) },
  { name: 'status', width: 11, keep: true, cell: (r) => c(r.status, STATUS_TONE[r.status]) },
  { name: 'sum/target', width: 9, keep: true, cell: (r) => c(sumText(r)) },
  { name: 'need', width: 5, keep: true, cell: (r) => c(needText(r), r.grainsNeeded === 0 ? 'ok' : undefined) },
  { name: 'sq.ch', width: 5, keep: true, cell: (r, f) => c(f.distanceAbove === null ? '' : f.distanceAbove.toFixed(2), f.odd ? 'warning' : undefined) },
  { name: 'mark', width: 5, keep: false, cell: (r) => c(r.status === 'planned' || r.status === 'unreadable' ? '' : String(r.markers)) },
  { name: 'conc', width: 6, keep: false, cell: (r) => c(r.concentration?.value != null ? compact(r.concentration.value) : '') },
  { name: 'sit', width: 3, keep: false, cell: (r) => c(r.sittings ? String(r.sittings) : '') },
  { name: 'time', width: 5, keep: true, cell: (r) => c(r.status === 'planned' || r.status === 'unreadable' ? '' : shortTime(r.countingMs)) },
  { name: 'analyst', width: 12, keep: false, cell: (r) => c(r.analyst ?? '') },
  { name: 'last', width: 10, keep: false, cell: (r) => c(r.lastAt ? localDate(r.lastAt) : '') },
  { name: 'integrity', width: 9, keep: true, cell: (r) => integrityText(r) },
];

/** Right-aligned numbers read best in a column; names and words stay left. */
const RIGHT = new Set(['sum/target', 'need', 'sq.ch', 'mark', 'conc', 'sit', 'time']);

export function cellText(col: Column, row: OverviewRow, facts: RowFacts): { text: string; tone?: Tone } {
  const cell = col.cell(row, facts);
  return { ...cell, text: RIGHT.has(col.name) ? right(cell.text, col.width).slice(-col.width) : fit(cell.text, col.width) };
}

export function headingText(col: Column): string {
  return RIGHT.has(col.name) ? right(col.name, col.width) : fit(col.name, col.width);
}

/** The columns for a width: all of them when they fit beside `stripRoom`, else the kept ones. */
export function columnsFor(width: number, stripRoom: number): Column[] {
  const total = (cols: readonly Column[]) => cols.reduce((a, col) => a + col.width + 1, 0);
  const all = ALL.filter(() => true);
  if (total(all) + stripRoom <= width) return all;
  return ALL.filter((col) => col.keep);
}

export const tableWidth = (cols: readonly Column[]) => cols.reduce((a, col) => a + col.width + 1, 0);

/** Each row's distance to the counted level above it, and whether it is odd or the next to count. */
export function rowFacts(model: CoreModel): RowFacts[] {
  const byLower = new Map(model.next.distances.map((d) => [d.lower, d.distance]));
  const odd = new Set(model.next.odd.map((o) => o.depth));
  const s = model.next.suggestion;
  const next = s.kind === 'planned' ? s.depth : null;
  return model.rows.map((r) => ({
    distanceAbove: r.shares !== null && r.depth !== null && r.pollenSum >= MIN_COMPARED_SUM ? (byLower.get(r.depth) ?? null) : null,
    odd: r.depth !== null && r.shares !== null && odd.has(r.depth),
    next: r.depth !== null && r.status === 'planned' && r.depth === next,
  }));
}

// A bar in eighths of a cell, from the left edge: our look for a percentage, thin and exact to an eighth.
const EIGHTHS = ['', '▏', '▎', '▍', '▌', '▋', '▊', '▉'];

/** A percentage as a horizontal bar `width` cells long, full at `scale` percent. */
export function stripBar(value: number | null, scale: number, width: number): string {
  if (value === null) return ' '.repeat(width);
  const eighths = scale > 0 ? Math.round((Math.min(value, scale) / scale) * width * 8) : 0;
  // Present but below an eighth: a dot, so a trace is never drawn as nothing.
  if (eighths === 0) return fit(value > 0 ? '·' : '', width);
  const full = Math.floor(eighths / 8);
  return fit('█'.repeat(full) + (EIGHTHS[eighths % 8] ?? ''), width);
}

/** The strip's scale: its maximum rounded up to a step of 5 (10 above 20%), so the heading reads "0–40%". */
export function stripScale(strip: Strip): number {
  if (strip.max <= 0) return 5;
  const step = strip.max > 20 ? 10 : 5;
  return Math.min(100, Math.ceil(strip.max / step) * step);
}
