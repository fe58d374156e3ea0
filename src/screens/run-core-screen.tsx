import { render } from 'ink';
import type { CoreSource } from '../core/core-source.js';
import type { OverviewRow } from '../core/overview.js';
import type { CountingSession } from '../session/counting-session.js';
import type { OpenedLevel } from '../session/session-files.js';
import { CoreScreen } from './core-screen.js';

const SIGNALS = { SIGINT: 2, SIGHUP: 1, SIGTERM: 15 } as const;

/** Run the core view until the analyst quits; a level open for counting is closed on every way out, as in exine count. */
export async function runCoreScreen(source: CoreSource, openLevel: (row: OverviewRow) => OpenedLevel, count: { bell: boolean; rareThreshold: number; breakMinutes: number | null }): Promise<number> {
  let session: CountingSession | null = null;
  const instance = render(<CoreScreen source={source} openLevel={openLevel} count={count} onSession={(s) => (session = s)} />, { exitOnCtrlC: false, patchConsole: false });
  let exitCode = 0;
  const stop = (code: number) => {
    (session as CountingSession | null)?.shutdown();
    instance.unmount();
    exitCode = code;
  };
  const handlers = Object.entries(SIGNALS).map(([signal, n]) => {
    const handler = () => stop(128 + n);
    process.once(signal, handler);
    return [signal, handler] as const;
  });
  const onCrash = (error: unknown) => {
    stop(1);
    process.stderr.write(`exine: unexpected error, the level open for counting was closed: ${(error as Error)?.message ?? error}\n`);
    process.exit(1);
  };
  process.once('uncaughtException', onCrash);
  try {
    await instance.waitUntilExit();
  } finally {
    (session as CountingSession | null)?.shutdown();
    for (const [signal, handler] of handlers) process.off(signal, handler);
    process.off('uncaughtException', onCrash);
  }
  return exitCode;
}
