import { render } from 'ink-testing-library';
import { CountScreen } from '../../src/screens/count-screen.js';
import { CountingSession } from '../../src/session/counting-session.js';
import type { OpenedLevel } from '../../src/session/session-files.js';

export const tick = (ms = 40) => new Promise((r) => setTimeout(r, ms));

export interface ScreenOptions {
  readonly columns?: number;
  readonly rows?: number;
  readonly bell?: boolean;
  readonly breakMinutes?: number | null;
}

/** The counting screen on an opened level, driven through ink-testing-library. */
export async function countScreen(level: OpenedLevel & { path: string }, { columns = 80, rows = 24, bell = false, breakMinutes = null }: ScreenOptions = {}) {
  const session = new CountingSession(level.writer, level.state, level.notices);
  const ui = render(<CountScreen session={session} columns={columns} rows={rows} bell={bell} breakMinutes={breakMinutes} />);
  await tick();
  const type = async (keys: string) => {
    ui.stdin.write(keys);
    await tick();
  };
  // A bell is written beside Ink's output, so the screen is the last frame that is not a bell.
  const frame = () => [...ui.frames].reverse().find((f) => f !== '\x07') ?? '';
  return { ...ui, session, path: level.path, type, frame };
}

export const bells = (frames: readonly string[]) => frames.filter((f) => f === '\x07').length;
