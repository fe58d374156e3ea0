import { UsageError } from '../../errors.js';
import { drawLayout } from '../../keymap/draw-layout.js';
import { loadKeymap } from '../../keymap/load-keymap.js';
import { parseFlags } from '../parse-flags.js';

export function keysCommand(args: string[]): number {
  const { positionals } = parseFlags('keys', args, {});
  if (positionals.length !== 1) throw new UsageError('exine keys: give one keymap PATH or bundled NAME (see exine keys --help)');
  const { keymap } = loadKeymap(positionals[0] as string);
  process.stdout.write(`${drawLayout(keymap)}\n`);
  return 0;
}
