import { render } from 'ink-testing-library';
import { CountScreen } from '../../src/screens/count-screen.js';
import { CountingSession } from '../../src/session/counting-session.js';
import type { OpenedLevel } from '../../src/session/session-files.js';
import { driveScreen } from './ink-screen.js';

export { bells, until } from './ink-screen.js';

export interface ScreenOptions {
  /** null: no size given, the screen follows the terminal's. */
  readonly columns?: number | null;
  readonly rows?: number | null;
  readonly bell?: boolean;
  readonly breakMinutes?: number | null;
}

/** The counting screen on an opened level, driven through ink-testing-library. */
export async function countScreen(level: OpenedLevel & { path: string }, { columns = 80, rows = 24, bell = false, breakMinutes = null }: ScreenOptions = {}) {
  const session = new CountingSession(level.writer, level.state, level.notices);
  const size = { ...(columns === null ? {} : { columns }), ...(rows === null ? {} : { rows }) };
  const ui = await driveScreen(render(<CountScreen session={session} {...size} bell={bell} breakMinutes={breakMinutes} />));
  return { ...ui, session, path: level.path };
}
