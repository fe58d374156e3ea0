import type { Io } from '../io.js';

/** `exine core init DIR …` makes a core folder; `exine core DIR` shows it. */
export async function coreCommand(args: string[], io: Io): Promise<number> {
  if (args[0] === 'init') return (await import('./core-init.js')).coreInitCommand(args.slice(1), io);
  return (await import('./core-view.js')).runCoreView(args, io);
}
