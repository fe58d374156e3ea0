import { resolve } from 'node:path';
import { UsageError } from '../../errors.js';
import { withSessionFile } from '../../io/session-file-source.js';
import { scanInParallel } from '../../log/parallel-scan.js';
import { verdictOf } from '../../log/verify-log.js';
import type { Io } from '../io.js';
import { parseFlags } from '../parse-flags.js';

export function verifyCommand(args: string[], io: Io): number {
  const { positionals } = parseFlags('verify', args, {});
  if (positionals.length !== 1) throw new UsageError('exine verify: give one session FILE (see exine verify --help)');
  const file = positionals[0] as string;
  const verdict = verdictOf(file, withSessionFile(resolve(io.cwd, file), (source) => scanInParallel(source, () => undefined), file));
  for (const w of verdict.warnings) io.stderr.write(`exine: warning: ${w}\n`);
  (verdict.intact ? io.stdout : io.stderr).write(`${verdict.summary}\n`);
  return verdict.intact ? 0 : 1;
}
