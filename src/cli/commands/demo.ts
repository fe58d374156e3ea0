import { copyFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { UsageError } from '../../errors.js';
import { parseFlags } from '../parse-flags.js';
import { drawLiveOnThisTerminal } from '../interactive-terminal.js';
import { readPreferences } from '../../prefs/preferences.js';
import { openForCounting, requireTerminal, screenOptions } from './count.js';

export const DEMO_DIR = resolve(dirname(fileURLToPath(import.meta.url)), '../../../demo-sessions');
export const DEMO_LEVEL = 'km1-084cm.jsonl';

export async function demoCommand(args: string[]): Promise<number> {
  const { positionals } = parseFlags('demo', args, {});
  if (positionals.length) throw new UsageError('exine demo: takes no arguments (see exine demo --help)');
  requireTerminal('demo');
  const dir = mkdtempSync(join(tmpdir(), 'exine-demo-'));
  const copy = join(dir, DEMO_LEVEL);
  copyFileSync(join(DEMO_DIR, DEMO_LEVEL), copy);
  const { prefs } = readPreferences();
  const opened = openForCounting(copy, {});
  drawLiveOnThisTerminal();
  const { runCountScreen } = await import('../../screens/run-count-screen.js');
  const code = await runCountScreen(opened, screenOptions(prefs, {}));
  process.stdout.write(`the demo copy stays in ${copy} (the bundled demo is unchanged)\n`);
  return code;
}
