import { closeSync, fsyncSync, ftruncateSync, openSync, readSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { ExineError } from '../errors.js';
import { plainIoError } from '../io/describe-io-error.js';
import { fsyncDir } from '../io/fsync-dir.js';
import type { Damage } from './scan-log.js';

export interface TailRepair {
  readonly damage: Damage;
  readonly cutBytes: number;
  /** File name of the backup, in the session's folder. */
  readonly backup: string;
}

/** Backups are named `FILE.cut-TIME.bak`: the next open looks for ones no repair event names. */
export const isBackupOf = (session: string, name: string) => name.startsWith(`${basename(session)}.cut-`) && name.endsWith('.bak');

/** A new backup file: never an existing name, never through a link (O_EXCL refuses both). */
function createBackup(path: string, stamp: string): { fd: number; name: string } {
  for (let n = 1; ; n++) {
    const name = `${basename(path)}.cut-${stamp}${n === 1 ? '' : `-${n}`}.bak`;
    try {
      return { fd: openSync(join(dirname(path), name), 'wx'), name };
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST' || n >= 100) throw error;
    }
  }
}

/** Copy the session's bytes from `from` to its end into the backup, a block at a time; the number copied. */
function copyTail(session: number, backup: number, from: number): number {
  const block = Buffer.allocUnsafe(1024 * 1024);
  let copied = 0;
  for (let n = readSync(session, block, 0, block.length, from); n > 0; n = readSync(session, block, 0, block.length, from + copied)) {
    for (let written = 0; written < n; ) written += writeSync(backup, block, written, n - written);
    copied += n;
  }
  return copied;
}

/**
 * Cut a damaged tail off a session file. The cut bytes, read again from the
 * file, are first saved, synced, beside the session; only then is the file
 * truncated. The caller holds the lock, so nothing is appended meanwhile.
 */
export function repairTail(path: string, damage: Damage, now: Date): TailRepair {
  const stamp = now.toISOString().replace(/[:.]/g, '-');
  const fd = openSync(path, 'r+');
  try {
    let backup: { fd: number; name: string };
    try {
      backup = createBackup(path, stamp);
    } catch (error) {
      throw new ExineError(`cannot repair ${path}: the backup of its damaged tail could not be created (${(error as NodeJS.ErrnoException).code ?? (error as Error).message}); nothing was changed`);
    }
    const backupPath = join(dirname(path), backup.name);
    let cutBytes: number;
    try {
      cutBytes = copyTail(fd, backup.fd, damage.offset);
      fsyncSync(backup.fd);
    } catch (error) {
      closeSync(backup.fd);
      rmSync(backupPath, { force: true });
      const why = plainIoError(error) ?? (error as NodeJS.ErrnoException).code ?? (error as Error).message;
      throw new ExineError(`cannot repair ${path}: saving its damaged tail to ${backup.name} failed (${why}); nothing was changed, the file is as it was`);
    }
    closeSync(backup.fd);
    fsyncDir(dirname(path));
    ftruncateSync(fd, damage.offset);
    fsyncSync(fd);
    return { damage, cutBytes, backup: backup.name };
  } finally {
    closeSync(fd);
  }
}
