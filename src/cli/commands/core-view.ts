import { resolve } from 'node:path';
import { coreJson } from '../../core/core-json.js';
import { corePlainText } from '../../screens/core-plain.js';
import { fileCoreSource } from '../../core/core-source.js';
import type { OverviewRow } from '../../core/overview.js';
import { UsageError } from '../../errors.js';
import { readPreferences } from '../../prefs/preferences.js';
import { drawLiveOnThisTerminal } from '../interactive-terminal.js';
import type { Io } from '../io.js';
import { parseFlags } from '../parse-flags.js';
import { openForCounting, requireTerminal, screenOptions } from './count.js';

const OPTIONS = {
  plain: { type: 'boolean', default: false },
  json: { type: 'boolean', default: false },
  quiet: { type: 'boolean' },
} as const;

/** `exine core DIR`: the core view (Ink), or `--plain` text, or `--json`. */
export async function runCoreView(args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseFlags('core', args, OPTIONS);
  if (positionals.length !== 1) throw new UsageError('exine core: give one core folder DIR (see exine core --help)');
  if (values.plain && values.json) throw new UsageError('exine core: give --plain or --json, not both');
  const dir = resolve(io.cwd, positionals[0] as string);
  const source = fileCoreSource(dir);
  const model = source.read();
  if (values.json) {
    io.stdout.write(`${JSON.stringify(coreJson(model), null, 2)}\n`);
    return 0;
  }
  if (values.plain) {
    io.stdout.write(corePlainText(model));
    return 0;
  }
  requireTerminal('core', io);
  const { prefs } = readPreferences(io.env);
  const screen = screenOptions(prefs, { quiet: values.quiet });
  // A level in the folder resumes from its own file (a copied-in one keeps its name); a planned depth is created in the core.
  const openLevel = (row: OverviewRow) =>
    row.path ? openForCounting(row.path, {}, () => {}, prefs, io.cwd) : openForCounting(dir, { depth: String(row.depth) }, () => {}, prefs, io.cwd);
  drawLiveOnThisTerminal();
  const { runCoreScreen } = await import('../../screens/run-core-screen.js');
  return runCoreScreen(source, openLevel, screen);
}
