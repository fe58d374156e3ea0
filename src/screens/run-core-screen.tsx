import { render } from 'ink';
import { SCREEN_RENDER } from './render-options.js';
import type { CoreSource } from '../core/core-source.js';
import type { OverviewRow } from '../core/overview.js';
import type { CountingSession } from '../session/counting-session.js';
import type { OpenedLevel } from '../session/session-files.js';
import { CoreScreen } from './core-screen.js';
import { untilScreenEnds } from './screen-lifetime.js';

/** Run the core view until the analyst quits; a level open for counting is closed on every way out, as in exine count. */
export async function runCoreScreen(source: CoreSource, openLevel: (row: OverviewRow) => OpenedLevel, count: { bell: boolean; rareThreshold: number; breakMinutes: number | null }): Promise<number> {
  let session: CountingSession | null = null;
  const instance = render(<CoreScreen source={source} openLevel={openLevel} count={count} onSession={(s) => (session = s)} />, SCREEN_RENDER);
  const stop = () => {
    (session as CountingSession | null)?.shutdown();
    instance.unmount();
  };
  return untilScreenEnds(() => instance.waitUntilExit(), stop, () => (session as CountingSession | null)?.shutdown(), 'the level open for counting');
}
