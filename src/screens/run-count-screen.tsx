import { render } from 'ink';
import { CountingSession } from '../session/counting-session.js';
import type { OpenedLevel } from '../session/session-files.js';
import { levelTable } from '../stats/level-table.js';
import { visible } from '../text/visible.js';
import { CountScreen } from './count-screen.js';

const SIGNALS = { SIGINT: 2, SIGHUP: 1, SIGTERM: 15 } as const;

/**
 * Run the counting screen until the analyst quits or a signal arrives. One
 * synchronous shutdown for every way out: close event, lock released, Ink
 * unmounted (raw mode off, cursor back). Grains are on disk already.
 */
export async function runCountScreen(opened: OpenedLevel, options: { bell?: boolean; rareThreshold?: number; breakMinutes?: number | null } = {}): Promise<number> {
  const session = new CountingSession(opened.writer, opened.state, opened.notices, opened.unconfirmed);
  const instance = render(<CountScreen session={session} bell={options.bell ?? true} rareThreshold={options.rareThreshold ?? 2} breakMinutes={options.breakMinutes ?? null} />, { exitOnCtrlC: false, patchConsole: false });
  let exitCode = 0;
  const stop = (code: number) => {
    session.shutdown();
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
    process.stderr.write(`exine: unexpected error, the session was closed: ${visible(String((error as Error)?.message ?? error))}\n`);
    process.exit(1);
  };
  process.once('uncaughtException', onCrash);
  try {
    await instance.waitUntilExit();
  } finally {
    session.shutdown();
    for (const [signal, handler] of handlers) process.off(signal, handler);
    process.off('uncaughtException', onCrash);
  }
  const table = levelTable(session.getSnapshot().state);
  // Printed after the screen, outside Ink: escaped here (a lock's host, a file name).
  for (const notice of opened.notices) process.stdout.write(`on opening: ${visible(notice)}\n`);
  process.stdout.write(`saved ${visible(session.path)}: ${table.grains} grains, pollen sum ${table.pollenSum}\n`);
  return exitCode;
}
