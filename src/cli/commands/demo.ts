import { dirname, join } from 'node:path';
import { freshDemoCopy } from '../../demo/demo-copy.js';
import { UsageError } from '../../errors.js';
import { packageDir } from '../../io/package-dir.js';
import type { Io } from '../io.js';
import { parseFlags } from '../parse-flags.js';
import { drawLiveOnThisTerminal } from '../interactive-terminal.js';
import { readPreferences } from '../../prefs/preferences.js';
import { openForCounting, requireTerminal, screenOptions } from './count.js';

export const DEMO_DIR = join(packageDir(), 'demo-sessions');
export const DEMO_LEVEL = 'km1-084cm.jsonl';

export async function demoCommand(args: string[], io: Io): Promise<number> {
  const { positionals } = parseFlags('demo', args, {});
  if (positionals.length) throw new UsageError('exine demo: takes no arguments (see exine demo --help)');
  requireTerminal('demo', io);
  const { prefs } = readPreferences(io.env);
  const copy = freshDemoCopy(join(DEMO_DIR, DEMO_LEVEL));
  const opened = openForCounting(copy, {});
  drawLiveOnThisTerminal();
  const { runCountScreen } = await import('../../screens/run-count-screen.js');
  const code = await runCountScreen(opened, screenOptions(prefs, {}));
  io.stdout.write(`the demo copy is ${copy}; the next exine demo starts afresh (the bundled demo is unchanged)\n`);
  io.stdout.write(`the whole demo core is beside it: exine core ${dirname(copy)}\n`);
  return code;
}
