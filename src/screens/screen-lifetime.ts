import { visible } from '../text/visible.js';

const SIGNALS = { SIGINT: 2, SIGHUP: 1, SIGTERM: 15 } as const;

/**
 * Wait for a screen to end, with one synchronous `stop` for every way out: the
 * analyst quits, a signal arrives (exit 128 + its number), or something throws
 * (exit 1, one line naming what was closed). `cleanup` runs however it ended.
 */
export async function untilScreenEnds(
  waitUntilExit: () => Promise<unknown>,
  stop: (code: number) => void,
  cleanup: () => void,
  closedWhat: string,
): Promise<number> {
  let exitCode = 0;
  const end = (code: number) => {
    stop(code);
    exitCode = code;
  };
  const handlers = Object.entries(SIGNALS).map(([signal, n]) => {
    const handler = () => end(128 + n);
    process.once(signal, handler);
    return [signal, handler] as const;
  });
  const onCrash = (error: unknown) => {
    end(1);
    process.stderr.write(`exine: unexpected error, ${closedWhat} was closed: ${visible(String((error as Error)?.message ?? error))}\n`);
    process.exit(1);
  };
  process.once('uncaughtException', onCrash);
  try {
    await waitUntilExit();
  } finally {
    cleanup();
    for (const [signal, handler] of handlers) process.off(signal, handler);
    process.off('uncaughtException', onCrash);
  }
  return exitCode;
}
