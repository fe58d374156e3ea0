import { render } from 'ink';
import { SCREEN_RENDER } from './render-options.js';
import { CountingSession } from '../session/counting-session.js';
import { readLevel, type OpenedLevel } from '../session/session-files.js';
import type { LevelState } from '../model/level-state.js';
import { levelTable } from '../stats/level-table.js';
import { visible } from '../text/visible.js';
import { CountScreen } from './count-screen.js';
import { untilScreenEnds } from './screen-lifetime.js';

/** What the terminal keeps after the screen: saved, or finished with the hash to write down, or only looked at. */
function quitLine(path: string, state: LevelState, viewOnly: boolean): string {
  const table = levelTable(state);
  const totals = `${table.grains === 1 ? '1 grain' : `${table.grains} grains`}, pollen sum ${table.pollenSum}`;
  if (!viewOnly && state.recent.at(-1)?.type !== 'finish') return `saved ${path}: ${totals}`;
  // The hash of the last line seals the file: written down now, it shows later that nothing was changed.
  const { scan } = readLevel(path);
  const seal = `last line #${state.lastSeq}, hash ${scan.lastHash}`;
  return viewOnly ? `${path} is finished and was opened read-only; nothing changed (${totals}; ${seal})` : `finished ${path}: ${totals}\n${seal} (write it down: exine verify shows it again)`;
}

/**
 * Run the counting screen until the analyst quits or a signal arrives. One
 * synchronous shutdown for every way out: close event, lock released, Ink
 * unmounted (raw mode off, cursor back). Grains are on disk already.
 */
export async function runCountScreen(opened: OpenedLevel, options: { bell?: boolean; rareThreshold?: number; breakMinutes?: number | null } = {}): Promise<number> {
  const session = new CountingSession(opened.writer, opened.state, opened.notices, opened.unconfirmed);
  const instance = render(<CountScreen session={session} bell={options.bell ?? true} rareThreshold={options.rareThreshold ?? 2} breakMinutes={options.breakMinutes ?? null} />, SCREEN_RENDER);
  const stop = () => {
    session.shutdown();
    instance.unmount();
  };
  const exitCode = await untilScreenEnds(() => instance.waitUntilExit(), stop, () => session.shutdown(), 'the session');
  // Printed after the screen, outside Ink: escaped here (a lock's host, a file name).
  for (const notice of opened.notices) process.stdout.write(`on opening: ${visible(notice)}\n`);
  for (const l of quitLine(session.path, session.getSnapshot().state, opened.writer.viewOnly === true).split('\n')) process.stdout.write(`${visible(l)}\n`);
  return exitCode;
}
