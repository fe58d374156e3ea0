import { randomBytes } from 'node:crypto';
import { closeSync, fsyncSync, linkSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { ExineError } from '../errors.js';
import { fsyncDir } from './fsync-dir.js';

/**
 * Write a whole file through a temporary file and a rename, so a reader never
 * sees half of it. Without `force` an existing file is never replaced, even
 * one that appears while writing (link fails where rename would overwrite).
 */
export function writeFileAtomic(path: string, text: string, force: boolean): void {
  const dir = dirname(path);
  const temp = join(dir, `.${basename(path)}.${randomBytes(6).toString('hex')}.tmp`);
  let fd: number;
  try {
    fd = openSync(temp, 'wx');
  } catch (error) {
    throw new ExineError(`cannot write ${path}: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}`);
  }
  try {
    const bytes = Buffer.from(text, 'utf8');
    let done = 0;
    while (done < bytes.length) done += writeSync(fd, bytes, done, bytes.length - done);
    fsyncSync(fd);
    closeSync(fd);
    if (force) renameSync(temp, path);
    else {
      linkSync(temp, path);
      rmSync(temp);
    }
    fsyncDir(dir);
  } catch (error) {
    try {
      closeSync(fd);
    } catch {
      // already closed
    }
    rmSync(temp, { force: true });
    if ((error as NodeJS.ErrnoException).code === 'EEXIST') {
      throw new ExineError(`${path} already exists; add --force to replace it`);
    }
    throw new ExineError(`cannot write ${path}: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}; nothing was written`);
  }
}
