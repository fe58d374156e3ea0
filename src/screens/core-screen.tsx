import { Box, useApp } from 'ink';
import { useEffect, useRef, useState } from 'react';
import type { CoreModel } from '../core/core-model.js';
import type { CoreSource } from '../core/core-source.js';
import type { OverviewRow } from '../core/overview.js';
import { CountingSession } from '../session/counting-session.js';
import type { OpenedLevel } from '../session/session-files.js';
import { levelTable } from '../stats/level-table.js';
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

function CoreTable({ model, ui, columns, rows }: { model: CoreModel; ui: CoreUi; columns: number; rows: number }) {
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

/** Keys of the core view; a separate component, so its key reader is gone while a level is counted. */
function CoreKeys({ onKeys }: { onKeys: (keys: Parameters<Parameters<typeof useRawKeys>[0]>[0]) => void }) {
  useRawKeys(onKeys);
  return null;
}

/**
 * The core view: the folder's levels and what to count next. Enter counts the
 * selected level in the counting screen, in the same terminal; quitting it comes
 * back here. The folder is polled, and only changed files are read again.
 */
export function CoreScreen({ source, openLevel, columns, rows, pollMs = 1000, count = {}, onSession }: CoreScreenProps) {
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

  const open = (row: OverviewRow) => {
    try {
      const opened = openLevel(row);
      const s = new CountingSession(opened.writer, opened.state, opened.notices, opened.unconfirmed);
      onSession?.(s);
      setSession(s);
    } catch (error) {
      uiRef.current = { ...uiRef.current, message: `not opened: ${(error as Error).message}` };
      setUi(uiRef.current);
    }
  };

  const onKeys = (presses: Parameters<Parameters<typeof useRawKeys>[0]>[0]) => {
    for (const press of presses) {
      const { ui: next, action } = coreKey(uiRef.current, press, modelRef.current.rows.length);
      uiRef.current = next;
      if (action?.kind === 'quit') {
        setUi(next);
        exit();
        return;
      }
      if (action?.kind === 'open') {
        const row = modelRef.current.rows[action.index];
        setUi({ ...next, message: null });
        uiRef.current = { ...next, message: null };
        if (row) open(row);
        // Keys after Enter in the same chunk belong to the counting screen, which is not drawn yet: they are not taken here.
        return;
      }
    }
    setUi(uiRef.current);
  };

  if (session) {
    const back = () => {
      const { grains, pollenSum } = levelTable(session.getSnapshot().state);
      onSession?.(null);
      setSession(null);
      refresh(`saved ${session.path}: ${grains} grains, pollen sum ${pollenSum}`);
    };
    return <CountScreen session={session} columns={columns} rows={rows} bell={count.bell ?? true} rareThreshold={count.rareThreshold ?? 2} breakMinutes={count.breakMinutes ?? null} onQuit={back} />;
  }
  return (
    <>
      <CoreKeys onKeys={onKeys} />
      <CoreTable model={model} ui={ui} columns={columns ?? terminal.columns} rows={rows ?? terminal.rows} />
    </>
  );
}
