import { closeSync, fsyncSync, ftruncateSync, openSync, rmSync, writeSync } from 'node:fs';
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

/**
 * Cut a damaged tail off a session file. The cut bytes are first saved, synced,
 * beside the session; only then is the file truncated. The caller holds the lock.
 */
export function repairTail(path: string, bytes: Buffer, damage: Damage, now: Date): TailRepair {
  const cut = bytes.subarray(damage.offset);
  const stamp = now.toISOString().replace(/[:.]/g, '-');
  let backup: { fd: number; name: string };
  try {
    backup = createBackup(path, stamp);
  } catch (error) {
    throw new ExineError(`cannot repair ${path}: the backup of its damaged tail could not be created (${(error as NodeJS.ErrnoException).code ?? (error as Error).message}); nothing was changed`);
  }
  const backupPath = join(dirname(path), backup.name);
  try {
    for (let written = 0; written < cut.length; ) written += writeSync(backup.fd, cut, written, cut.length - written);
    fsyncSync(backup.fd);
  } catch (error) {
    closeSync(backup.fd);
    rmSync(backupPath, { force: true });
    const why = plainIoError(error) ?? (error as NodeJS.ErrnoException).code ?? (error as Error).message;
    throw new ExineError(`cannot repair ${path}: saving its damaged tail to ${backup.name} failed (${why}); nothing was changed, the file is as it was`);
  }
  closeSync(backup.fd);
  fsyncDir(dirname(path));
  const fd = openSync(path, 'r+');
  try {
    ftruncateSync(fd, damage.offset);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
  return { damage, cutBytes: cut.length, backup: backup.name };
}
