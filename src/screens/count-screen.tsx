import { Box, Text, useApp, useInput, useStdout } from 'ink';
import { useTerminalSize } from './terminal-size.js';
import { useEffect, useMemo, useRef, useState, useSyncExternalStore } from 'react';
import { splitKeys } from '../input/key-press.js';
import { keyLabel } from '../keymap/keymap.js';
import { formatDuration } from '../session/describe-event.js';
import type { CountingSession } from '../session/counting-session.js';
import type { LevelState } from '../session/level-state.js';
import { levelReport } from '../session/rules-signal.js';
import { ringStopSignal } from './bell.js';
import { RulesPanel, rulesPanelHeight, stopBanner } from './rules-panel.js';
import { RecentEvents } from './recent-events.js';
import { SumPanel, sumPanelHeight } from './sum-panel.js';
import { themeFor } from './theme.js';
import { TotalsTable, tableWidth, taxonWidthFor } from './totals-table.js';

function useNow(intervalMs: number): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const timer = setInterval(() => setNow(Date.now()), intervalMs);
    timer.unref?.();
    return () => clearInterval(timer);
  }, [intervalMs]);
  return now;
}

function fitBanner(text: string, width: number): string {
  return text.length >= width ? text.slice(0, width) : text + ' '.repeat(width - text.length);
}

function lastGrainTaxon(state: LevelState): string | null {
  const last = state.recent.at(-1);
  return last?.type === 'grain' ? last.taxon : null;
}

export interface CountScreenProps {
  readonly session: CountingSession;
  /** Terminal size; defaults to the real terminal's. */
  readonly columns?: number;
  readonly rows?: number;
  /** Terminal bells for the stop signal (default on). */
  readonly bell?: boolean;
}

/** Three bells, once per new rules-met event of this sitting (not for one already in the file). */
function useStopBell(metSeq: number | null, enabled: boolean): void {
  const { stdout } = useStdout();
  const seen = useRef(metSeq);
  useEffect(() => {
    if (metSeq === null || metSeq === seen.current) return;
    seen.current = metSeq;
    if (enabled) ringStopSignal(stdout);
  }, [metSeq, enabled, stdout]);
}

export function CountScreen({ session, columns, rows, bell = true }: CountScreenProps) {
  const { exit } = useApp();
  const terminal = useTerminalSize();
  const snapshot = useSyncExternalStore(session.subscribe, session.getSnapshot);
  const { state } = snapshot;
  const report = useMemo(() => levelReport(state), [state]);
  const { table } = report.stats;
  useStopBell(state.lastRulesMet?.seq ?? null, bell);
  const theme = themeFor();
  const now = useNow(1000);

  // Every key of a burst is applied in order against the session, never against a rendered value.
  useInput((input, key) => {
    if (session.pressAll(splitKeys(input, key)) === 'quit') {
      session.shutdown();
      exit();
    }
  });

  const width = columns ?? terminal.columns;
  const height = Math.max(12, (rows ?? terminal.rows) - 1);
  const status = snapshot.readOnly
    ? `READ-ONLY: ${snapshot.readOnly}`
    : (snapshot.message?.text ?? (snapshot.notice ? `On opening: ${snapshot.notice}` : ' '));
  // The status takes the lines it needs (up to 3; word wrap wastes some of each line).
  const statusLines = Math.min(3, Math.max(1, Math.ceil([...status].length / Math.max(20, width - 12))));
  const met = report.rules.met;
  // Two header lines, the stop banner when met, the status, one key line.
  const mainHeight = height - 3 - statusLines - (met ? 1 : 0);
  const taxonWidth = taxonWidthFor(width);
  const sideWidth = Math.max(20, width - tableWidth(taxonWidth) - 2);
  // Recent events get what the sum panel leaves: one line for its margin, one for its title.
  const rulesHeight = rulesPanelHeight(report.rules, report.stats.concentration);
  const sideRoomForRecent = Math.max(1, mainHeight - sumPanelHeight(table, state.rules.targetSum) - rulesHeight - (rulesHeight ? 1 : 0) - 2);
  const h = state.header;
  const where = [h.site, h.core].filter(Boolean).join(' ');
  const depth = h.depth === null ? '' : ` · depth ${h.depth}`;
  const a = state.keymap.actions;

  return (
    <Box flexDirection="column" width={width} height={height}>
      <Text bold color={theme.accent} wrap="truncate-end">
        {`${where ? `${where} · ` : ''}level ${h.level}${depth} · slide ${h.slide ?? '–'}`}
      </Text>
      <Text wrap="truncate-end">
        <Text bold>{`traverse ${state.traverse}`}</Text>
        {` · sitting ${state.sitting} · ${formatDuration(now - Date.parse(state.sittingStartedAt))}`}
      </Text>
      {met ? (
        <Text bold inverse wrap="truncate-end">
          {fitBanner(stopBanner(state.rulesMet ? (state.lastRulesMet?.sum ?? null) : null), width)}
        </Text>
      ) : null}
      <Box flexDirection="row" height={mainHeight}>
        <TotalsTable table={table} room={mainHeight - 1} theme={theme} justCounted={lastGrainTaxon(state)} taxonWidth={taxonWidth} />
        <Box flexDirection="column" marginLeft={2} width={sideWidth}>
          <SumPanel table={table} target={state.rules.targetSum} theme={theme} width={sideWidth} />
          {rulesHeight ? (
            <Box marginTop={1}>
              <RulesPanel report={report.rules} conc={report.stats.concentration} theme={theme} width={sideWidth} />
            </Box>
          ) : null}
          <Box marginTop={1}>
            <RecentEvents events={state.recent} room={sideRoomForRecent} width={sideWidth} />
          </Box>
        </Box>
      </Box>
      <Box height={statusLines} overflow="hidden">
        <Text color={snapshot.message?.tone === 'error' || snapshot.readOnly ? theme.error : theme.warning} wrap="wrap">
          {status}
        </Text>
      </Box>
      <Text dimColor={theme.dim} wrap="truncate-end">
        {`${keyLabel(a.undo)} undo · ${keyLabel(a.traverse)} traverse · Ctrl-F finish · Ctrl-C quit · * outside sum`}
      </Text>
    </Box>
  );
}
