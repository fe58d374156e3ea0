import { Box, Text, useApp, useStdout } from 'ink';
import { useEffect, useMemo, useRef, useState, useSyncExternalStore } from 'react';
import type { CountingSession } from '../session/counting-session.js';
import { ringMiss, ringOnce, ringStopSignal } from './bell.js';
import { countScreenView, levelFacts, type CountMain } from './count-view.js';
import { PanelBox, StyledLines, StyledText } from './styled-text.js';
import { useTerminalSize } from './terminal-size.js';
import { themeFor, type Theme } from './theme.js';
import { useRawKeys } from './use-raw-keys.js';

function useNow(intervalMs: number): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const timer = setInterval(() => setNow(Date.now()), intervalMs);
    timer.unref?.();
    return () => clearInterval(timer);
  }, [intervalMs]);
  return now;
}

export interface CountScreenProps {
  readonly session: CountingSession;
  /** Terminal size; defaults to the real terminal's. */
  readonly columns?: number;
  readonly rows?: number;
  /** Terminal bells: one for a new type, two quick ones for a key that counts nothing, three for the stop signal, one for a break (default on). */
  readonly bell?: boolean;
  /** Types with at most this many grains are listed as rare (default 2). */
  readonly rareThreshold?: number;
  /** Remind the analyst to rest the eyes after this many minutes of a sitting; null: never. */
  readonly breakMinutes?: number | null;
  /** False when a parent screen reads the keys and hands them to the session (the core view); default true. */
  readonly readKeys?: boolean;
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

function MainArea({ main, theme }: { main: CountMain; theme: Theme }) {
  if (main.kind === 'help') return <PanelBox panel={main.panel} theme={theme} />;
  return (
    <Box flexDirection="row" height={main.height}>
      <PanelBox panel={main.table} theme={theme} />
      <Box flexDirection="row" marginLeft={2} width={main.sideWidth}>
        {main.columns.map((column, i) => (
          <Box key={i} flexDirection="column" width={column.width} marginLeft={column.marginLeft}>
            {column.panels.map((panel, j) =>
              j === 0 ? (
                <PanelBox key={j} panel={panel} theme={theme} />
              ) : (
                <Box key={j} marginTop={main.gap}>
                  <PanelBox panel={panel} theme={theme} />
                </Box>
              ),
            )}
          </Box>
        ))}
      </Box>
    </Box>
  );
}

/** The counting screen: keys go to the session, and the session's snapshot is drawn as its view (count-view.ts). */
export function CountScreen({ session, columns, rows, bell = true, rareThreshold = 2, breakMinutes = null, readKeys = true }: CountScreenProps) {
  const { exit } = useApp();
  const terminal = useTerminalSize();
  const snapshot = useSyncExternalStore(session.subscribe, session.getSnapshot);
  const facts = useMemo(() => levelFacts(snapshot.state, rareThreshold), [snapshot.state, rareThreshold]);
  const now = useNow(1000);
  const view = countScreenView({ snapshot, columns: columns ?? terminal.columns, rows: rows ?? terminal.rows, now, rareThreshold, breakMinutes }, facts);
  const theme = themeFor();
  useRingOnRise(view.rings.stop, bell, ringStopSignal);
  useRingOnRise(view.rings.types, bell, ringOnce);
  useRingOnRise(view.rings.breaks, bell, ringOnce);
  useRingOnRise(view.rings.misses, bell, ringMiss);

  // Every key of a burst is applied in order against the session, never against a rendered value.
  useRawKeys((keys) => {
    if (!readKeys) return;
    if (session.pressAll(keys) === 'quit') {
      session.shutdown();
      exit();
    }
  });

  if (view.tooSmall) {
    return (
      <Box width={view.width}>
        <Text bold wrap="wrap">
          {view.tooSmall}
        </Text>
      </Box>
    );
  }
  return (
    <Box flexDirection="column" width={view.width} height={view.height}>
      <StyledLines lines={view.heading} theme={theme} />
      {view.banner ? <StyledText line={view.banner} theme={theme} /> : null}
      <MainArea main={view.main} theme={theme} />
      <Box height={view.status.height} overflow="hidden">
        <StyledText line={view.status.line} theme={theme} />
      </Box>
      <StyledText line={view.keys} theme={theme} />
    </Box>
  );
}
