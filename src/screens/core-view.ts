import type { CoreModel } from '../core/core-model.js';
import { oddShort, suggestionText } from '../core/next-words.js';
import type { OverviewRow } from '../core/overview.js';
import type { Strip } from '../core/strips.js';
import { levelFileName } from '../core/level-name.js';
import { fit, plural } from '../text/cells.js';
import { compact } from '../text/numbers.js';
import { formatDuration } from '../text/durations.js';
import { wordWrap } from '../text/word-wrap.js';
import { localDateTime } from '../text/local-time.js';
import { scrollWindow } from './audit-view.js';
import { cellText, columnsFor, depthText, headingText, rowFacts, stripBar, stripScale, tableWidth, type Column, type RowFacts } from './core-lines.js';
import { line, textOf, truncated, type Line, type Span } from './styled-line.js';

export interface CoreUi {
  readonly selected: number;
  readonly message: string | null;
}

export const START_CORE_UI: CoreUi = { selected: 0, message: null };

export interface CoreScreenView {
  readonly width: number;
  readonly height: number;
  /** Title, column headings, strip scales. */
  readonly heading: readonly Line[];
  /** The level rows that fit, and the room they have. */
  readonly body: { readonly height: number; readonly lines: readonly Line[] };
  /** The selected level's details (two lines), the suggestion and any flags, the message, the keys. */
  readonly footer: readonly Line[];
}

const STRIP_WIDTH = 8;
/** Two strips at least beside the table, even at 80 columns. */
const MIN_STRIP_ROOM = 2 * (STRIP_WIDTH + 1);
const HEADING = 3;

export function titleText(model: CoreModel): string {
  const counts = new Map<string, number>();
  for (const r of model.rows) counts.set(r.status, (counts.get(r.status) ?? 0) + 1);
  const parts = ['finished', 'rules met', 'in progress', 'planned', 'unreadable'].filter((s) => counts.get(s)).map((s) => `${counts.get(s)} ${s}`);
  return `${model.config.site} · core ${model.config.core} · ${plural(model.rows.length, 'level')}${parts.length ? `: ${parts.join(', ')}` : ''}`;
}

function stripHeadings(strips: readonly Strip[]): { names: Span[]; scales: Span[] } {
  const names: Span[] = [];
  const scales: Span[] = [];
  for (const s of strips) {
    names.push({ text: ` ${fit(s.name, STRIP_WIDTH)}`, bold: true, ...(s.group ? { tone: 'accent' as const } : {}) });
    scales.push({ text: ` ${fit(`0–${stripScale(s)}%`, STRIP_WIDTH)}`, tone: 'dim' });
  }
  return { names, scales };
}

/** One level row: its cells, then a bar per strip. */
export function rowLine(row: OverviewRow, index: number, facts: RowFacts, cols: readonly Column[], strips: readonly Strip[], selected: boolean): Line {
  const spans: Span[] = cols.map((col, i) => {
    const cell = cellText(col, row, facts);
    return { text: `${i === 0 ? '' : ' '}${cell.text}`, ...(cell.tone ? { tone: cell.tone } : {}) };
  });
  if (selected) spans.unshift({ text: '▶', bold: true });
  else spans.unshift({ text: ' ' });
  for (const s of strips) spans.push({ text: ` ${stripBar(s.values[index] ?? null, stripScale(s), STRIP_WIDTH)}`, ...(s.group ? { tone: 'accent' as const } : {}) });
  return { spans: selected ? spans.map((s) => ({ ...s, inverse: true })) : spans, wrap: 'truncate-end' };
}

function concentrationText(r: OverviewRow, model: CoreModel): string {
  const c = r.concentration;
  // The core has its marker batch; the sample's volume or mass is given per level, so say how.
  if (!c && model.config.markerBatch !== null) return 'no sample volume yet (exine count --volume or --mass adds it)';
  if (!c || c.value === null) return c ? 'concentration: no marker yet' : 'no spike data';
  const err = c.relativeError === null ? '' : ` ±${(100 * c.relativeError).toFixed(0)}%`;
  return `${compact(c.value)} ${c.unit}${err}`;
}

/** Two lines about the selected level. */
export function detailLines(model: CoreModel, row: OverviewRow | undefined): Line[] {
  if (!row) return [line(''), line('')];
  if (row.status === 'planned') {
    const file = row.depth === null ? '' : levelFileName(model.config.core, row.depth);
    return [line(`${depthText(row.depth)} planned · no file yet · Enter creates ${file} with the core's keymap and rules`, { bold: true }), line(`rules: ${row.rulesText ?? ''}`, { tone: 'dim' })];
  }
  if (row.status === 'unreadable') {
    return [line(`${row.file} cannot be read`, { bold: true, tone: 'error' }), line(row.integrity?.kind === 'damaged' ? row.integrity.message : '', { tone: 'error' })];
  }
  const need = row.grainsNeeded === null ? 'grains needed unknown' : row.grainsNeeded === 0 ? 'rules met' : `${row.grainsNeeded} more grains of the sum needed`;
  const first = `${row.file} · ${row.status} · pollen sum ${row.pollenSum} · ${need} · rules: ${row.rulesText ?? ''}`;
  const facts = [
    plural(row.slides, 'slide'),
    `${plural(row.sittings, 'sitting')}, ${formatDuration(row.countingMs)} counting`,
    `${plural(row.markers, 'marker')}, ${concentrationText(row, model)}`,
    row.analyst ? `analyst ${row.analyst}` : 'no analyst recorded',
    row.lastAt ? `last ${localDateTime(row.lastAt)}` : '',
  ].filter(Boolean);
  const integrity = row.integrity?.kind === 'torn' ? `torn last line (exine count repairs it)` : row.integrity?.kind === 'intact' && !row.integrity.closed ? 'last sitting not closed cleanly' : '';
  const outside = row.outside.length ? `own settings: ${row.outside.join(', ')}` : '';
  const second = [...facts, integrity, outside].filter(Boolean).join(' · ');
  return [line(first, { bold: true }), line(second, { tone: row.outside.length || integrity ? 'warning' : undefined })];
}

/** One styled line as the lines it takes at word breaks (at most `max`). */
function wrapped(l: Line, width: number, max: number): Line[] {
  const style = l.spans[0] ?? { text: '' };
  return wordWrap(textOf(l), width, max).map((text) => truncated(text, { ...(style.bold ? { bold: true } : {}), ...(style.tone ? { tone: style.tone } : {}) }));
}

/** Everything the core screen shows, top to bottom, as plain values. */
export function coreScreenView(model: CoreModel, ui: CoreUi, size: { columns: number; rows: number }): CoreScreenView {
  const width = Math.max(40, size.columns);
  const height = Math.max(12, size.rows);
  const cols = columnsFor(width, MIN_STRIP_ROOM);
  const room = width - tableWidth(cols) - 1;
  const strips = model.strips.slice(0, Math.max(0, Math.floor(room / (STRIP_WIDTH + 1))));
  const facts = rowFacts(model);
  const heads = stripHeadings(strips);
  const heading: Line[] = [
    truncated(titleText(model), { bold: true }),
    { spans: [{ text: ` ${cols.map(headingText).join(' ')}`, bold: true }, ...heads.names], wrap: 'truncate-end' },
    { spans: [{ text: ` ${' '.repeat(tableWidth(cols) - 1)}` }, ...heads.scales], wrap: 'truncate-end' },
  ];
  // A message is never cut mid-sentence: the footer's lines wrap at word breaks, and the table gets what is left.
  // A flag first: it asks for a check before the next count.
  const odd = oddShort(model.next);
  const advice = [odd, suggestionText(model.next)].filter(Boolean).join(' · ');
  const selected = Math.min(Math.max(0, ui.selected), Math.max(0, model.rows.length - 1));
  const roomy = height >= 20;
  const footer: Line[] = [
    ...detailLines(model, model.rows[selected]).flatMap((l) => wrapped(l, width, roomy ? 3 : 1)),
    ...wrapped(line(advice, { tone: odd ? 'warning' : 'accent' }), width, roomy ? 3 : 1),
    ...wrapped(line(ui.message ?? '', { tone: 'dim' }), width, roomy ? 2 : 1),
  ];
  const bodyHeight = height - HEADING - footer.length - 1;
  footer.push(truncated(`↑↓ select · Enter count this level · q quit${model.rows.length > bodyHeight ? ` · ${selected + 1}/${model.rows.length}` : ''}`, { tone: 'dim' }));
  const { shown, offset } = scrollWindow(model.rows, selected, bodyHeight);
  const lines = shown.map((r, i) => rowLine(r, offset + i, facts[offset + i] as RowFacts, cols, strips, offset + i === selected));
  if (model.rows.length === 0) lines.push(line('  no level and no planned depth yet: exine count DIR --depth N starts one', { tone: 'dim' }));
  return { width, height, heading, body: { height: bodyHeight, lines }, footer };
}
