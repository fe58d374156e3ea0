import { statSync } from 'node:fs';
import { resolve } from 'node:path';
import { UsageError } from '../errors.js';

/** Device and inode of what a path names, through symlinks; null when it names nothing. */
function identity(path: string): string | null {
  try {
    const s = statSync(path, { bigint: true });
    return `${s.dev}:${s.ino}`;
  } catch {
    return null;
  }
}

/**
 * Refuse to write `output` when it is one of the command's `inputs` — the same
 * file by device and inode, so a hard link or a symlink is caught too. Called
 * before anything is written, whatever the flags (--force included): replacing
 * the file a command reads from would lose it. Paths are as the person typed
 * them (the message repeats them), relative to `cwd`.
 */
export function refuseOwnInput(command: string, output: string, inputs: readonly string[], cwd = process.cwd()): void {
  const out = identity(resolve(cwd, output));
  if (out === null) return;
  const clash = inputs.find((input) => identity(resolve(cwd, input)) === out);
  if (clash !== undefined) {
    const same = clash === output ? '' : ` (${clash} is the same file)`;
    throw new UsageError(`exine ${command}: the output ${output} is one of the files it reads${same}; write to another file (nothing was changed)`);
  }
}
