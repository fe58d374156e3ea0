import { basename } from 'node:path';
import { Box, useApp } from 'ink';
import { useEffect, useRef, useState } from 'react';
import type { CoreModel } from '../core/core-model.js';
import type { CoreSource } from '../core/core-source.js';
import type { OverviewRow } from '../core/overview.js';
import { CountingSession } from '../session/counting-session.js';
import type { OpenedLevel } from '../session/session-files.js';
import { levelTable } from '../stats/level-table.js';
import type { KeyPress } from '../input/key-press.js';
import { CountScreen } from './count-screen.js';
import { coreKey } from './core-keys.js';
import { coreScreenView, START_CORE_UI, type CoreUi } from './core-view.js';
import { StyledLines } from './styled-text.js';
import { useTerminalSize } from './terminal-size.js';
import { themeFor } from './theme.js';
import { useRawKeys } from './use-raw-keys.js';

export interface CoreScreenProps {
  readonly source: CoreSource;
  /** Open (or create) a row's level for counting, holding its lock; throws an error with a message for a person. */
  readonly openLevel: (row: OverviewRow) => OpenedLevel;
  readonly columns?: number;
  readonly rows?: number;
  /** How often the folder is looked at for changed files. */
  readonly pollMs?: number;
  /** The counting screen's options, as `exine count` would take them. */
  readonly count?: { readonly bell?: boolean; readonly rareThreshold?: number; readonly breakMinutes?: number | null };
  /** Told of the counting session while one is open, so a signal can close it. */
  readonly onSession?: (session: CountingSession | null) => void;
}

/** The core view drawn from a model; the screen adds keys and polling. */
export function CoreTable({ model, ui, columns, rows }: { model: CoreModel; ui: CoreUi; columns: number; rows: number }) {
  const theme = themeFor();
  const view = coreScreenView(model, ui, { columns, rows });
  return (
    <Box flexDirection="column" width={view.width} height={view.height}>
      <StyledLines lines={view.heading} theme={theme} />
      <Box flexDirection="column" height={view.body.height} overflow="hidden">
        <StyledLines lines={view.body.lines} theme={theme} />
      </Box>
      <StyledLines lines={view.footer} theme={theme} />
    </Box>
  );
}

/**
 * The core view: the folder's levels and what to count next. Enter counts the
 * selected level in the counting screen, in the same terminal; quitting it comes
 * back here. The folder is polled, and only changed files are read again.
 */
export function CoreScreen({ source, openLevel, columns, rows, pollMs = 1000, count: countOptions = {}, onSession }: CoreScreenProps) {
  const { exit } = useApp();
  const terminal = useTerminalSize();
  const [model, setModel] = useState<CoreModel>(() => source.read());
  const [ui, setUi] = useState<CoreUi>(START_CORE_UI);
  const [session, setSession] = useState<CountingSession | null>(null);
  const uiRef = useRef(ui);
  const modelRef = useRef(model);
  modelRef.current = model;

  const refresh = (message?: string) => {
    try {
      const next = source.refresh();
      if (next) setModel(next);
      if (message !== undefined) {
        uiRef.current = { ...uiRef.current, message };
        setUi(uiRef.current);
      }
    } catch (error) {
      uiRef.current = { ...uiRef.current, message: `could not read the folder again: ${(error as Error).message}` };
      setUi(uiRef.current);
    }
  };

  useEffect(() => {
    if (session) return undefined;
    const timer = setInterval(() => refresh(), pollMs);
    timer.unref?.();
    return () => clearInterval(timer);
  }, [source, pollMs, session]);

  const sessionRef = useRef<CountingSession | null>(null);

  const open = (row: OverviewRow): CountingSession | null => {
    try {
      const opened = openLevel(row);
      const s = new CountingSession(opened.writer, opened.state, opened.notices, opened.unconfirmed);
      sessionRef.current = s;
      onSession?.(s);
      setSession(s);
      return s;
    } catch (error) {
      uiRef.current = { ...uiRef.current, message: `not opened: ${(error as Error).message}` };
      setUi(uiRef.current);
      return null;
    }
  };

  const back = (s: CountingSession) => {
    const { grains, pollenSum } = levelTable(s.getSnapshot().state);
    sessionRef.current = null;
    onSession?.(null);
    setSession(null);
    refresh(`saved ${basename(s.path)}: ${grains} grains, pollen sum ${pollenSum}`);
  };

  /** Keys for the level being counted; true when its screen quit. */
  const count = (s: CountingSession, presses: readonly KeyPress[]): boolean => {
    if (s.pressAll(presses) !== 'quit') return false;
    s.shutdown();
    back(s);
    return true;
  };

  // One reader of keys for both screens, never unmounted: keys typed right after Enter go to the level, in order.
  useRawKeys((presses) => {
    const counting = sessionRef.current;
    if (counting) {
      count(counting, presses);
      return;
    }
    for (const [i, press] of presses.entries()) {
      const { ui: next, action } = coreKey(uiRef.current, press, modelRef.current.rows.length);
      uiRef.current = next;
      if (action?.kind === 'quit') {
        setUi(next);
        exit();
        return;
      }
      if (action?.kind === 'open') {
        const row = modelRef.current.rows[action.index];
        uiRef.current = { ...next, message: null };
        setUi(uiRef.current);
        const s = row ? open(row) : null;
        if (s) count(s, presses.slice(i + 1));
        return;
      }
    }
    setUi(uiRef.current);
  });

  if (session) {
    return <CountScreen session={session} columns={columns} rows={rows} bell={countOptions.bell ?? true} rareThreshold={countOptions.rareThreshold ?? 2} breakMinutes={countOptions.breakMinutes ?? null} readKeys={false} />;
  }
  return <CoreTable model={model} ui={ui} columns={columns ?? terminal.columns} rows={rows ?? terminal.rows} />;
}
