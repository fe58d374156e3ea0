import { Box, Text, useApp, useInput, useStdout } from 'ink';
import { useTerminalSize } from './terminal-size.js';
import { useEffect, useMemo, useRef, useState, useSyncExternalStore } from 'react';
import { splitKeys } from '../input/key-press.js';
import { keyLabel } from '../keymap/keymap.js';
import { formatDuration } from '../text/durations.js';
import type { CountingSession } from '../session/counting-session.js';
import type { LevelState } from '../model/level-state.js';
import { levelReport } from '../rules/level-report.js';
import { ringStopSignal } from './bell.js';
import { RulesPanel, rulesPanelHeight, stopBanner } from './rules-panel.js';
import { RecentEvents } from './recent-events.js';
import { SumPanel, sumPanelHeight } from './sum-panel.js';
import { themeFor } from './theme.js';
import { TotalsTable } from './totals-table.js';
import { countLayout } from './count-layout.js';
import { saturationCurve } from '../stats/accumulation.js';
import { ringOnce } from './bell.js';
import { HelpOverlay } from './help-overlay.js';
import { rareLineCount, rareLines, rareTypes } from './rare-types.js';
import { LinesPanel } from './lines-panel.js';
import { saturationLines } from './saturation-panel.js';
import type { InputMode } from '../session/input-mode.js';
import { isTypeGroup } from '../keymap/groups.js';

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
  /** Terminal bells: one for a new type, three for the stop signal, one for a break (default on). */
  readonly bell?: boolean;
  /** Types with at most this many grains are listed as rare (default 2). */
  readonly rareThreshold?: number;
  /** Remind the analyst to rest the eyes after this many minutes of a sitting; null: never. */
  readonly breakMinutes?: number | null;
}

/**
 * Ring when `value` rises above the last value seen: a new rules-met event (its
 * seq), one more type, one more break span. What was already so when the screen
 * opened does not ring.
 */
function useRingOnRise(value: number, enabled: boolean, ring: (stdout: NodeJS.WriteStream) => void): void {
  const { stdout } = useStdout();
  const seen = useRef(value);
  useEffect(() => {
    if (value > seen.current && enabled) ring(stdout);
    seen.current = value;
  }, [value, enabled, stdout, ring]);
}

/** The pollen and spore types counted so far (markers, indeterminables and charcoal are not discoveries). */
function typesFound(state: LevelState): ReadonlySet<string> {
  const groupOf = new Map(Object.values(state.keymap.keys).map((b) => [b.taxon, b.group]));
  return new Set(Object.keys(state.firstSeen).filter((t) => isTypeGroup(groupOf.get(t) ?? 'other')));
}

function promptOf(mode: InputMode | null): string | null {
  if (mode?.kind === 'note') {
    const on = mode.grain === null ? 'the level' : `#${mode.grain} ${mode.taxon ?? ''}`.trim();
    return `Note on ${on} (Enter saves, Esc cancels, "@x,y" = stage position): ${mode.text}█`;
  }
  if (mode?.kind === 'new-type') return `New type as "name, group" (Enter counts one grain, Esc cancels): ${mode.text}█`;
  return null;
}

export function CountScreen({ session, columns, rows, bell = true, rareThreshold = 2, breakMinutes = null }: CountScreenProps) {
  const { exit } = useApp();
  const terminal = useTerminalSize();
  const snapshot = useSyncExternalStore(session.subscribe, session.getSnapshot);
  const { state, mode } = snapshot;
  const report = useMemo(() => levelReport(state), [state]);
  const curve = useMemo(() => saturationCurve(state), [state]);
  const rare = useMemo(() => rareTypes(state, rareThreshold), [state, rareThreshold]);
  const { table } = report.stats;
  const theme = themeFor();
  const now = useNow(1000);
  const sittingMs = now - Date.parse(state.sittingStartedAt);
  const newTypes = useMemo(() => typesFound(state), [state]);
  // Break spans passed in this sitting: the reminder shows from the first on, and each new one rings.
  const breaks = breakMinutes === null ? 0 : Math.floor(sittingMs / (breakMinutes * 60_000));
  const breakDue = breaks > 0;
  useRingOnRise(state.lastRulesMet?.seq ?? 0, bell, ringStopSignal);
  useRingOnRise(newTypes.size, bell, ringOnce);
  useRingOnRise(breaks, bell, ringOnce);

  // Every key of a burst is applied in order against the session, never against a rendered value.
  useInput((input, key) => {
    if (session.pressAll(splitKeys(input, key)) === 'quit') {
      session.shutdown();
      exit();
    }
  });

  const width = columns ?? terminal.columns;
  const height = Math.max(12, (rows ?? terminal.rows) - 1);
  const prompt = promptOf(mode);
  const status = snapshot.readOnly
    ? `READ-ONLY: ${snapshot.readOnly}`
    : prompt
      ? `${snapshot.message ? `${snapshot.message.text} · ` : ''}${prompt}`
      : (snapshot.message?.text ?? (snapshot.notice ? `On opening: ${snapshot.notice}` : ' '));
  // The status takes the lines it needs (up to 3; word wrap wastes some of each line).
  const statusLines = Math.min(3, Math.max(1, Math.ceil([...status].length / Math.max(20, width - 12))));
  const met = report.rules.met;
  const rulesHeight = rulesPanelHeight(report.rules, report.stats.concentration);
  const { mainHeight, taxonWidth, sideWidth, wide, colWidth, compactSum, gap, plotRows, legend, rareRoom, recentRoom } = countLayout({
    width,
    height,
    statusLines,
    banner: met,
    sumHeight: (compact) => sumPanelHeight(table, state.rules.targetSum, compact),
    rulesHeight,
    rareLines: rareLineCount(rare),
  });
  const showCurve = plotRows >= 2;
  const h = state.header;
  const where = [h.site, h.core].filter(Boolean).join(' ');
  const depth = h.depth === null ? '' : ` · depth ${h.depth}`;
  const a = state.keymap.actions;
  const recent = <RecentEvents events={state.recent} room={recentRoom} width={colWidth} firstSeen={state.firstSeen} isType={(t) => newTypes.has(t)} />;

  return (
    <Box flexDirection="column" width={width} height={height}>
      <Text bold color={theme.accent} wrap="truncate-end">
        {`${where ? `${where} · ` : ''}level ${h.level}${depth} · slide ${h.slide ?? '–'}`}
      </Text>
      <Text wrap="truncate-end">
        <Text bold>{`traverse ${state.traverse}`}</Text>
        {` · sitting ${state.sitting} · ${formatDuration(sittingMs)}`}
        {breakDue ? <Text bold color={theme.warning}>{` · time to rest your eyes (${breakMinutes} min)`}</Text> : null}
      </Text>
      {met ? (
        <Text bold inverse wrap="truncate-end">
          {fitBanner(stopBanner(state.rulesMet ? (state.lastRulesMet?.sum ?? null) : null), width)}
        </Text>
      ) : null}
      {mode?.kind === 'help' ? (
        <HelpOverlay keymap={state.keymap} width={width} room={mainHeight} />
      ) : (
        <Box flexDirection="row" height={mainHeight}>
          <TotalsTable table={table} room={mainHeight - 1} theme={theme} justCounted={lastGrainTaxon(state)} taxonWidth={taxonWidth} />
          <Box flexDirection="row" marginLeft={2} width={sideWidth}>
            <Box flexDirection="column" width={colWidth}>
              <SumPanel table={table} target={state.rules.targetSum} theme={theme} width={colWidth} compact={compactSum} />
              {rulesHeight ? (
                <Box marginTop={gap}>
                  <RulesPanel report={report.rules} conc={report.stats.concentration} theme={theme} width={colWidth} />
                </Box>
              ) : null}
              {showCurve ? (
                <Box marginTop={gap}>
                  <LinesPanel lines={saturationLines(curve, colWidth, plotRows, legend)} width={colWidth} />
                </Box>
              ) : null}
              {wide ? null : <Box marginTop={gap}>{recent}</Box>}
            </Box>
            {wide ? (
              <Box flexDirection="column" width={colWidth} marginLeft={2}>
                <LinesPanel lines={rareLines(rare, rareThreshold, colWidth, rareRoom)} width={colWidth} />
                <Box marginTop={gap}>{recent}</Box>
              </Box>
            ) : null}
          </Box>
        </Box>
      )}
      <Box height={statusLines} overflow="hidden">
        <Text color={snapshot.message?.tone === 'error' || snapshot.readOnly ? theme.error : prompt ? undefined : theme.warning} bold={prompt !== null} wrap="wrap">
          {status}
        </Text>
      </Box>
      <Text dimColor={theme.dim} wrap="truncate-end">
        {width >= 100
          ? `${keyLabel(a.undo)} undo · ${keyLabel(a.traverse)} traverse · ${keyLabel(a.note)} note · ${keyLabel(a.newType)} new type · ${keyLabel(a.help)} help · Ctrl-F finish · Ctrl-C quit`
          : `${keyLabel(a.undo).replace('Backspace', 'Bksp')} undo · ${keyLabel(a.traverse)} trav · ${keyLabel(a.note)} note · ${keyLabel(a.newType)} new · ${keyLabel(a.help)} help · ^F finish · ^C quit`}
      </Text>
    </Box>
  );
}
