import { Box, Text, useApp, useInput } from 'ink';
import { useEffect, useMemo, useRef, useState } from 'react';
import { splitKeys } from '../input/key-press.js';
import { auditKey, eventsOf, START_UI, type AuditUi, type AuditView } from './audit-keys.js';
import { describeCell } from '../audit/evenness.js';
import { describeCorrection, timelineBar, type LevelAudit, type TraverseRow } from '../audit/level-audit.js';
import type { AuditRead, AuditSource } from '../audit/audit-source.js';
import { describeEvent } from '../model/describe-event.js';
import { formatDuration } from '../text/durations.js';
import type { RestorePayload, SessionEvent, VoidPayload } from '../model/events.js';
import { fit, plural, right } from '../text/cells.js';
import { perMinute } from '../text/numbers.js';
import { themeFor } from './theme.js';
import { useTerminalSize } from './terminal-size.js';

const time = (iso: string | null) => (iso ? iso.slice(11, 19) : '–');

function traverseLine(t: TraverseRow): string {
  const mark = t.voidedWhole ? ' VOID' : '';
  return `${right(String(t.traverse), 3)} ${fit(time(t.start), 8)} ${right(formatDuration(t.activeMs).slice(3), 5)} ${right(String(t.grains), 5)} ${right(String(t.types), 4)} ${right(perMinute(t.perMinute), 5)} ${right(String(t.newTypes.length), 3)} ${right(String(t.undos), 3)} ${right(String(t.voided), 3)} ${right(String(t.notes), 3)}${mark}`;
}

/** What became of each grain, for the event list of a traverse. */
function grainStatus(read: AuditRead): (e: SessionEvent) => string {
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
function overviewLines({ audit }: AuditRead, width: number): string[] {
  const ev = audit.evenness;
  return [
    ...audit.sittings.flatMap((s) => [
      `sitting ${s.sitting}: ${s.start.slice(0, 16).replace('T', ' ')}–${time(s.end)} · counting ${formatDuration(s.countingMs)}${s.pauses.length ? ` · ${plural(s.pauses.length, 'pause')} (${s.pauses.map((p) => `${Math.round(p.ms / 60_000)} min`).join(', ')})` : ''}${s.closedCleanly ? '' : ' · not closed cleanly'}`,
      `  ${s.start.slice(11, 16)} ${timelineBar(s, Math.max(10, Math.min(60, width - 16)))} ${s.end.slice(11, 16)}`,
    ]),
    ...(ev.ok ? ev.test.flagged.map(describeCell) : []),
    ...audit.flags.map((f) => `[${f.kind}] ${f.text}`),
    ...audit.corrections.map((c) => `#${c.seq} ${describeCorrection(c)}`),
  ];
}

function viewOf(read: AuditRead): AuditView {
  const { counting } = read.audit;
  return { traverses: read.audit.traverses, state: read.state, statusOf: grainStatus(read), counts: (seq) => counting.has(seq) };
}

function window<T>(items: readonly T[], selected: number, room: number): { shown: readonly T[]; offset: number } {
  if (items.length <= room) return { shown: items, offset: 0 };
  const offset = Math.max(0, Math.min(items.length - room, selected - Math.floor(room / 2)));
  return { shown: items.slice(offset, offset + room), offset };
}

export function AuditScreen({ source, columns, rows, pollMs = 1000 }: { source: AuditSource; columns?: number; rows?: number; pollMs?: number }) {
  const { exit } = useApp();
  const terminal = useTerminalSize();
  const theme = themeFor();
  const [read, setRead] = useState<AuditRead>(() => source.read());
  const [ui, setUi] = useState<AuditUi>(START_UI);
  // Keys are applied to these, never to values captured at the last render; the view is made once per read.
  const viewRef = useRef<AuditView | null>(null);
  viewRef.current ??= viewOf(read);
  const uiRef = useRef(ui);
  const adopt = (next: AuditRead) => {
    viewRef.current = viewOf(next);
    setRead(next);
  };

  // Follow the file while another exine counts it.
  useEffect(() => {
    const timer = setInterval(() => {
      try {
        if (source.changed()) adopt(source.read());
      } catch (error) {
        uiRef.current = { ...uiRef.current, message: `could not re-read the file: ${(error as Error).message}` };
        setUi(uiRef.current);
      }
    }, pollMs);
    timer.unref?.();
    return () => clearInterval(timer);
  }, [source, pollMs]);

  useInput((input, key) => {
    for (const press of splitKeys(input, key)) {
      let next = auditKey(uiRef.current, press, viewRef.current as AuditView);
      if (next.pending) {
        const what = (next.pending.type === 'restore' ? `restore of void #${next.pending.of}` : next.pending.grain !== null ? `void of grain #${next.pending.grain}` : `void of traverse ${next.pending.traverse}`);
        try {
          source.correct(next.pending);
          adopt(source.read());
          next = { ...next, pending: null, message: `recorded: ${what}, "${next.pending.reason}"` };
        } catch (error) {
          next = { ...next, pending: null, message: `not recorded: ${(error as Error).message}` };
        }
      }
      uiRef.current = next;
      if (next.quit) {
        setUi(next);
        exit();
        return;
      }
    }
    setUi(uiRef.current);
  });

  const { audit } = read;
  const { selected, focus, grainIndex, overview, asking, message } = ui;
  const traverse = audit.traverses[Math.min(selected, audit.traverses.length - 1)] as TraverseRow | undefined;
  const grains = useMemo(() => eventsOf(traverse), [traverse]);
  const { statusOf } = viewRef.current;

  const width = columns ?? terminal.columns;
  const height = Math.max(16, (rows ?? terminal.rows) - 1);
  const h = read.state.header;
  const where = [h.site, h.core].filter(Boolean).join(' ');
  const ev = audit.evenness;
  const evenLine = ev.ok
    ? `Evenness χ² ${ev.test.result.statistic.toFixed(1)}, df ${ev.test.result.df}, p ${ev.test.result.p < 0.001 ? '<0.001' : ev.test.result.p.toFixed(3)}${ev.test.result.p < 0.05 ? ': types NOT spread alike' : ': no sign of uneven spread'}${ev.test.flagged.length ? ` · ${plural(ev.test.flagged.length, 'cell')} stand out` : ''}`
    : `Evenness: not tested (${ev.reason})`;
  // Four header lines, the table's title, the detail's two title lines, two lines of prompt or message, the key line.
  const fixed = 10;
  const tableRoom = Math.max(3, Math.min(audit.traverses.length, Math.floor((height - fixed) / 2)));
  const detailRoom = Math.max(3, height - fixed - tableRoom);
  const tv = window(audit.traverses, selected, tableRoom);
  const gv = window(grains, grainIndex, detailRoom);

  return (
    <Box flexDirection="column" width={width} height={height}>
      <Text bold color={theme.accent} wrap="truncate-end">{`Audit · ${where ? `${where} · ` : ''}level ${h.level}${h.depth === null ? '' : ` · depth ${h.depth}`} · slide ${h.slide ?? '–'}`}</Text>
      <Text wrap="truncate-end" color={read.verdict.intact || read.writing ? undefined : theme.error}>
        {`${read.verdict.intact ? 'file intact' : read.writing ? 'last line incomplete (being written?)' : 'FILE DAMAGED'} · ${plural(audit.grains, 'grain')} · ${plural(audit.traverses.length, 'traverse')} · ${plural(audit.sittings.length, 'sitting')} · ${formatDuration(audit.countingMs)} counting · ${perMinute(audit.perMinute)}/min`}
      </Text>
      <Text wrap="truncate-end">{evenLine}</Text>
      <Text wrap="truncate-end" color={audit.flags.length ? theme.warning : undefined}>
        {`${audit.flags.length ? `${plural(audit.flags.length, 'flag')} to review` : 'no flags'} · ${audit.corrections.length ? plural(audit.corrections.length, 'correction') : 'no corrections'} · f shows them`}
      </Text>
      {overview ? null : <Text bold>{fit('   # start     time grain type  /min new und voi not', width)}</Text>}
      {(overview ? [] : tv.shown).map((t, i) => {
        const here = tv.offset + i === selected;
        return (
          <Text key={t.traverse} inverse={here && focus === 'traverses'} bold={here} color={t.voidedWhole ? theme.zero : undefined} wrap="truncate-end">
            {`${here ? (focus === 'traverses' ? '▶' : '›') : ' '}${traverseLine(t)}`}
          </Text>
        );
      })}
      {overview ? (
        // The overview takes the table's room as well.
        <Box flexDirection="column" height={detailRoom + tableRoom + 3}>
          <Text bold>Sittings, flags and corrections (f: back)</Text>
          {overviewLines(read, width).slice(0, detailRoom + tableRoom + 2).map((line, i) => (
            <Text key={i} wrap="truncate-end">{line}</Text>
          ))}
        </Box>
      ) : (
        <Box flexDirection="column" height={detailRoom + 2} overflow="hidden">
          <Text bold wrap="truncate-end">
            {traverse
              ? `Traverse ${traverse.traverse}${traverse.voidedWhole ? ` VOIDED (#${traverse.voidedWhole.seq}: ${traverse.voidedWhole.reason})` : ''} · ${traverse.byTaxon.map(([t, c]) => `${t} ${c}`).join(', ') || 'no grain counts'}`
              : 'no traverse yet'}
          </Text>
          <Text wrap="truncate-end" color={theme.zero}>{traverse?.newTypes.length ? `new here: ${traverse.newTypes.join(', ')}` : ' '}</Text>
          {gv.shown.map((e, i) => {
            const status = statusOf(e);
            return (
              <Text key={e.seq} inverse={focus === 'grains' && gv.offset + i === grainIndex} color={status ? theme.warning : undefined} wrap="truncate-end">
                {`${focus === 'grains' && gv.offset + i === grainIndex ? '▶' : ' '} #${e.seq} ${time(e.at)} ${describeEvent(e)}${status ? ` · ${status}` : ''}`}
              </Text>
            );
          })}
        </Box>
      )}
      {asking ? (
        <Box height={2} overflow="hidden">
          <Text bold wrap="wrap">{`${asking.prompt}${ui.reason}█`}</Text>
        </Box>
      ) : (
        <Box height={2} overflow="hidden">
          <Text color={message?.startsWith('not recorded') ? theme.error : theme.warning} wrap="wrap">
            {message ?? (read.verdict.warnings[0] ? `warning: ${read.verdict.warnings[0]}` : ' ')}
          </Text>
        </Box>
      )}
      <Text dimColor={theme.dim} wrap="truncate-end">
        {asking ? (message ?? 'Enter records the correction · Esc cancels') : '↑↓ select · Tab traverses/grains · v void · r restore · f flags · q quit'}
      </Text>
    </Box>
  );
}
