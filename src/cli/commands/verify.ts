import { readFileSync } from 'node:fs';
import { ExineError, UsageError } from '../../errors.js';
import { scanLog } from '../../log/scan-log.js';
import { verdictOf } from '../../log/verify-log.js';
import { parseFlags } from '../parse-flags.js';

export function verifyCommand(args: string[]): number {
  const { positionals } = parseFlags('verify', args, {});
  if (positionals.length !== 1) throw new UsageError('exine verify: give one session FILE (see exine verify --help)');
  const file = positionals[0] as string;
  let bytes: Buffer;
  try {
    bytes = readFileSync(file);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new ExineError(code === 'ENOENT' ? `${file}: no such session file` : `${file}: cannot be read (${code})`);
  }
  const verdict = verdictOf(file, scanLog(bytes));
  for (const w of verdict.warnings) process.stderr.write(`exine: warning: ${w}\n`);
  (verdict.intact ? process.stdout : process.stderr).write(`${verdict.summary}\n`);
  return verdict.intact ? 0 : 1;
}
