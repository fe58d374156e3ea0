import { describeCell } from '../audit/evenness.js';
import type { AuditRead } from '../audit/audit-source.js';
import { describeCorrection, timelineBar, type LevelAudit, type TraverseRow } from '../audit/level-audit.js';
import type { SessionEvent } from '../model/events.js';
import { slideNames } from '../model/slides.js';
import { fit, plural, right } from '../text/cells.js';
import { formatDuration } from '../text/durations.js';
import { perMinute } from '../text/numbers.js';
import { localClock, localDate, localDateTime } from '../text/local-time.js';
import { truncated, type Line } from './styled-line.js';

/** "13:10:04" of a timestamp in local time, or "–". */
export const clockTime = (iso: string | null) => (iso ? localClock(iso) : '–');

/** A traverse's start in local time, with its date ("12-03 09:14") when that is another day than its sitting's start. */
export function traverseStart(t: TraverseRow): string {
  if (!t.start) return '–';
  if (t.sittingStart && localDate(t.sittingStart) !== localDate(t.start)) return `${localDate(t.start).slice(5)} ${localClock(t.start, false)}`;
  return localClock(t.start);
}

/** The traverse table's heading: in full from 120 columns, in short words below. */
export function traverseHeading(width: number, withSlide = false): string {
  const slide = withSlide ? ' slide' : '';
  return width >= 120
    ? `   #  ${fit('start', 11)}  ${right('time', 5)}  ${right('grains', 6)}  ${right('types', 5)}  ${right('/min', 5)}  ${right('new types', 9)}  ${right('undos', 5)}  ${right('voids', 5)}  ${right('notes', 5)}${slide}`
    : `   # ${fit('start', 11)}  time grain type  /min new und voi not${slide}`;
}

/** A traverse's row of the table: start, time, grains, types, rate, new types, undos, voids, notes; "empty" when it holds no grain. */
export function traverseLine(t: TraverseRow, width = 80, withSlide = false): string {
  // Slide labels differ at their end (KM1-060-A, KM1-060-B): a long one keeps its tail.
  const label = t.slide ?? '–';
  const slide = withSlide ? ` ${fit([...label].length > 10 ? `…${[...label].slice(-9).join('')}` : label, 10)}` : '';
  const mark = t.voidedWhole ? ' VOID' : t.empty ? (t.takenBack ? ` empty (taken back by #${t.takenBack})` : ' empty') : '';
  const time = right(formatDuration(t.activeMs).slice(3), 5);
  if (width >= 120) {
    return `${right(String(t.traverse), 3)}  ${fit(traverseStart(t), 11)}  ${time}  ${right(String(t.grains), 6)}  ${right(String(t.types), 5)}  ${right(perMinute(t.perMinute), 5)}  ${right(String(t.newTypes.length), 9)}  ${right(String(t.undos), 5)}  ${right(String(t.voided), 5)}  ${right(String(t.notes), 5)}${slide}${mark}`;
  }
  return `${right(String(t.traverse), 3)} ${fit(traverseStart(t), 11)} ${time} ${right(String(t.grains), 5)} ${right(String(t.types), 4)} ${right(perMinute(t.perMinute), 5)} ${right(String(t.newTypes.length), 3)} ${right(String(t.undos), 3)} ${right(String(t.voided), 3)} ${right(String(t.notes), 3)}${slide}${mark}`;
}

/** What became of each grain, for the event list of a traverse: "undone", "VOIDED by #12", "double press?", or "". */
export function grainStatus(read: AuditRead): (e: SessionEvent) => string {
  const { undone } = read.audit;
  const voidedBy = new Map<number, number>();
  for (const [voidSeq, grains] of Object.entries(read.state.voids)) for (const g of grains) voidedBy.set(g.seq, Number(voidSeq));
  const flagged = new Map(read.audit.flags.map((f) => [f.seq, f.kind]));
  return (e) => {
    if (e.type !== 'grain') return '';
    const parts: string[] = [];
    if (undone.has(e.seq)) parts.push('undone');
    if (voidedBy.has(e.seq)) parts.push(`VOIDED by #${voidedBy.get(e.seq)}`);
    if (flagged.get(e.seq) === 'double-press') parts.push('double press?');
    if (flagged.get(e.seq) === 'interruption') parts.push('after a long gap');
    return parts.join(', ');
  };
}

/** The sittings, the cells that stand out, the flags and the corrections, one line each. */
export function overviewLines({ audit }: AuditRead, width: number): string[] {
  const ev = audit.evenness;
  return [
    ...audit.sittings.flatMap((s) => [
      `sitting ${s.sitting}: ${localDateTime(s.start)}–${clockTime(s.end)} · counting ${formatDuration(s.countingMs)}${s.pauses.length ? ` · ${plural(s.pauses.length, 'pause')} (${s.pauses.map((p) => `${Math.round(p.ms / 60_000)} min`).join(', ')})` : ''}${s.closedCleanly ? '' : ' · not closed cleanly'}`,
      `  ${localClock(s.start, false)} ${timelineBar(s, Math.max(10, Math.min(60, width - 16)))} ${localClock(s.end, false)}`,
    ]),
    ...(ev.ok ? ev.test.flagged.map(describeCell) : []),
    ...audit.flags.map((f) => `[${f.kind}] ${f.text}`),
    ...audit.corrections.map((c) => `#${c.seq} ${describeCorrection(c)}`),
  ];
}

function evennessLine(audit: LevelAudit): string {
  const ev = audit.evenness;
  if (!ev.ok) return `Evenness: not tested (${ev.reason})`;
  const { statistic, df, p } = ev.test.result;
  return `Evenness χ² ${statistic.toFixed(1)}, df ${df}, p ${p < 0.001 ? '<0.001' : p.toFixed(3)}${p < 0.05 ? ': types NOT spread alike' : ': no sign of uneven spread'}${ev.test.flagged.length ? ` · ${ev.test.flagged.length === 1 ? '1 cell stands' : `${ev.test.flagged.length} cells stand`} out` : ''}`;
}

/** The four heading lines: the level, the file's integrity with the totals, evenness across traverses, flags and corrections. */
export function auditHeading(read: AuditRead): Line[] {
  const { audit, verdict, writing } = read;
  const h = read.state.header;
  const where = [h.site, h.core].filter(Boolean).join(' ');
  const integrity = verdict.intact ? 'file intact' : writing ? 'last line incomplete (being written?)' : 'FILE DAMAGED';
  return [
    truncated(`Audit · ${where ? `${where} · ` : ''}level ${h.level}${h.depth === null ? '' : ` · depth ${h.depth}`} · ${read.state.slides.length > 1 ? 'slides' : 'slide'} ${slideNames(read.state).join(', ')}`, { bold: true, tone: 'accent' }),
    truncated(
      `${integrity} · ${plural(audit.grains, 'grain')} · ${plural(audit.traverses.length, 'traverse')} · ${plural(audit.sittings.length, 'sitting')} · ${formatDuration(audit.countingMs)} counting · ${perMinute(audit.perMinute)}/min`,
      { tone: verdict.intact || writing ? undefined : 'error' },
    ),
    truncated(evennessLine(audit)),
    truncated(`${audit.flags.length ? `${plural(audit.flags.length, 'flag')} to review` : 'no flags'} · ${audit.corrections.length ? plural(audit.corrections.length, 'correction') : 'no corrections'} · f shows them`, {
      tone: audit.flags.length ? 'warning' : undefined,
    }),
  ];
}
