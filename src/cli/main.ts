import { EXIT, ExineError, UsageError } from '../errors.js';
import { HELP, MAIN_HELP } from './help.js';
import { guardedIo, processIo, type Io } from './io.js';

type Command = (args: string[], io: Io) => number | Promise<number>;

// Loaded on demand: only count and demo pay for Ink and React.
const COMMANDS: Readonly<Record<string, () => Promise<Command>>> = {
  count: async () => (await import('./commands/count.js')).countCommand,
  demo: async () => (await import('./commands/demo.js')).demoCommand,
  audit: async () => (await import('./commands/audit.js')).auditCommand,
  summary: async () => (await import('./commands/summary.js')).summaryCommand,
  export: async () => (await import('./commands/export.js')).exportCommand,
  verify: async () => (await import('./commands/verify.js')).verifyCommand,
  keys: async () => (await import('./commands/keys.js')).keysCommand,
  prefs: async () => (await import('./commands/prefs.js')).prefsCommand,
  core: async () => (await import('./commands/core.js')).coreCommand,
};

/** Run one exine command line; returns the exit code (the caller sets it on the process). */
export async function main(argv: string[], given: Io = processIo()): Promise<number> {
  // Every line printed passes one escape of control and invisible characters (cli/io.ts).
  const io = guardedIo(given);
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.stdout.write(`${MAIN_HELP}\n`);
    return name === undefined ? EXIT.usage : EXIT.ok;
  }
  const load = COMMANDS[name];
  const help = HELP[name];
  if (load && help && (rest.includes('--help') || rest.includes('-h'))) {
    io.stdout.write(`${help}\n`);
    return EXIT.ok;
  }
  try {
    if (!load) throw new UsageError(`exine: unknown command "${name}" (commands: ${Object.keys(COMMANDS).join(', ')}; see exine --help)`);
    return await (await load())(rest, io);
  } catch (error) {
    if (error instanceof ExineError) {
      io.stderr.write(`${error.message.startsWith('exine') ? '' : 'exine: '}${error.message}\n`);
      return error.exitCode;
    }
    throw error;
  }
}
