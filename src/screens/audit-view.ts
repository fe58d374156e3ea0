import type { AuditRead } from '../audit/audit-source.js';
import type { TraverseRow } from '../audit/level-audit.js';
import { describeEvent } from '../model/describe-event.js';
import type { SessionEvent } from '../model/events.js';
import { fit } from '../text/cells.js';
import { auditHeading, clockTime, grainStatus, overviewLines, traverseHeading, traverseLine } from './audit-lines.js';
import { eventsOf, type AuditUi, type AuditView } from './audit-keys.js';
import { line, textOf, truncated, type Line } from './styled-line.js';
import { wrappedHeight } from './count-lines.js';

/** Everything the audit screen shows, top to bottom, as plain values. */
export interface AuditScreenView {
  readonly width: number;
  readonly height: number;
  /** The heading, then the traverse table when the overview is not shown. */
  readonly top: readonly Line[];
  /** The selected traverse's events (clipped to its height), or the overview. */
  readonly body: { readonly height: number; readonly clip: boolean; readonly lines: readonly Line[] };
  /** Two lines: the reason being typed, or the last message or warning. */
  readonly prompt: Line;
  /** Lines the prompt takes: two, or three for a message that needs them (the event list gives one up). */
  readonly promptHeight: number;
  readonly keys: Line;
}

/** What the keys act on, made once per read of the file. */
export function keyViewOf(read: AuditRead): AuditView {
  const { counting } = read.audit;
  return { traverses: read.audit.traverses, state: read.state, statusOf: grainStatus(read), counts: (seq) => counting.has(seq) };
}

/** The part of `items` that fits in `room`, keeping `selected` near the middle. */
export function scrollWindow<T>(items: readonly T[], selected: number, room: number): { shown: readonly T[]; offset: number } {
  if (items.length <= room) return { shown: items, offset: 0 };
  const offset = Math.max(0, Math.min(items.length - room, selected - Math.floor(room / 2)));
  return { shown: items.slice(offset, offset + room), offset };
}

/** Rows for the traverse table and the event list: four heading lines, the table's title, the detail's two title lines, two of prompt, the key line. */
export function auditRooms(height: number, traverses: number): { tableRoom: number; detailRoom: number } {
  const fixed = 10;
  const tableRoom = Math.max(3, Math.min(traverses, Math.floor((height - fixed) / 2)));
  return { tableRoom, detailRoom: Math.max(3, height - fixed - tableRoom) };
}

/** The traverse table: its title and the rows that fit; "▶" marks the selection while the keys move it, "›" otherwise. */
function traverseTable(traverses: readonly TraverseRow[], ui: AuditUi, room: number, width: number, withSlide: boolean): Line[] {
  const { shown, offset } = scrollWindow(traverses, ui.selected, room);
  return [
    line(fit(traverseHeading(width, withSlide), width), { bold: true }),
    ...shown.map((t, i) => {
      const here = offset + i === ui.selected;
      const mark = here ? (ui.focus === 'traverses' ? '▶' : '›') : ' ';
      return truncated(`${mark}${traverseLine(t, width, withSlide)}`, { inverse: here && ui.focus === 'traverses', bold: here, tone: t.voidedWhole ? 'zero' : undefined });
    }),
  ];
}

/** The selected traverse: what counts in it, the types new there, and its events with what became of each grain. */
function traverseDetail(traverse: TraverseRow | undefined, ui: AuditUi, room: number, statusOf: (e: SessionEvent) => string): Line[] {
  const { shown, offset } = scrollWindow(eventsOf(traverse), ui.grainIndex, room);
  const title = traverse
    ? `Traverse ${traverse.traverse}${traverse.voidedWhole ? ` VOIDED (#${traverse.voidedWhole.seq}: ${traverse.voidedWhole.reason})` : ''} · ${traverse.byTaxon.map(([t, c]) => `${t} ${c}`).join(', ') || 'no grain counts'}`
    : 'no traverse yet';
  return [
    truncated(title, { bold: true }),
    truncated(newHere(traverse), { tone: 'zero' }),
    ...shown.map((e, i) => {
      const status = statusOf(e);
      const picked = ui.focus === 'grains' && offset + i === ui.grainIndex;
      return truncated(`${picked ? '▶' : ' '} #${e.seq} ${clockTime(e.at)} ${describeEvent(e)}${status ? ` · ${status}` : ''}`, { inverse: picked, tone: status ? 'warning' : undefined });
    }),
  ];
}

/** What is new in a traverse: types, then other taxa apart, then its cf. grains; or that it is empty. */
function newHere(t: TraverseRow | undefined): string {
  if (!t) return ' ';
  const parts = [
    ...(t.empty ? [t.takenBack ? `empty: the change to it was taken back (#${t.takenBack})` : 'empty: no grain recorded'] : []),
    ...(t.newTypes.length ? [`new types: ${t.newTypes.join(', ')}`] : []),
    ...(t.newOthers.length ? [`first of other groups: ${t.newOthers.join(', ')}`] : []),
    ...(t.cf.length ? [`cf.: ${t.cf.map(([taxon, n]) => `${taxon} ${n}`).join(', ')}`] : []),
  ];
  return parts.join(' · ') || ' ';
}

function promptLine(read: AuditRead, ui: AuditUi): Line {
  if (ui.asking) return line(`${ui.asking.prompt}${ui.reason}█`, { bold: true }, 'wrap');
  const text = ui.message ?? (read.verdict.warnings[0] ? `warning: ${read.verdict.warnings[0]}` : ' ');
  return line(text, { tone: ui.message?.startsWith('not recorded') ? 'error' : 'warning' }, 'wrap');
}

/** The audit screen for a read of the file, the screen's own state and a terminal size. */
export function auditScreenView(read: AuditRead, ui: AuditUi, size: { columns: number; rows: number }, statusOf = grainStatus(read)): AuditScreenView {
  const width = size.columns;
  const height = Math.max(16, size.rows - 1);
  const { traverses } = read.audit;
  const { tableRoom, detailRoom } = auditRooms(height, traverses.length);
  const traverse = traverses[Math.min(ui.selected, traverses.length - 1)];
  // The overview takes the table's room as well.
  const body = ui.overview
    ? { height: detailRoom + tableRoom + 3, clip: false, lines: [line('Sittings, flags and corrections (f: back)', { bold: true }), ...overviewLines(read, width).slice(0, detailRoom + tableRoom + 2).map((l) => truncated(l))] }
    : { height: detailRoom + 2, clip: true, lines: traverseDetail(traverse, ui, detailRoom, statusOf) };
  const prompt = promptLine(read, ui);
  const promptHeight = Math.max(2, Math.min(3, wrappedHeight(textOf(prompt), width)));
  const extra = promptHeight - 2;
  return {
    width,
    height,
    top: [...auditHeading(read), ...(ui.overview ? [] : traverseTable(traverses, ui, tableRoom, width, read.state.slides.length > 1))],
    body: { ...body, height: body.height - extra, lines: body.lines.slice(0, body.height - extra) },
    prompt,
    promptHeight,
    keys: truncated(ui.asking ? (ui.message ?? 'Enter records the correction · Esc cancels') : '↑↓ select · Tab traverses/grains · v void · r restore · f flags · q quit', { tone: 'dim' }),
  };
}
