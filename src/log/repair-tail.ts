import { closeSync, fsyncSync, ftruncateSync, openSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { fsyncDir } from '../io/fsync-dir.js';
import type { Damage } from './scan-log.js';

export interface TailRepair {
  readonly damage: Damage;
  readonly cutBytes: number;
  /** File name of the backup, in the session's folder. */
  readonly backup: string;
}

/**
 * Cut a damaged tail off a session file. The cut bytes are first saved, synced,
 * beside the session; only then is the file truncated. The caller holds the lock.
 */
export function repairTail(path: string, bytes: Buffer, damage: Damage, now: Date): TailRepair {
  const cut = bytes.subarray(damage.offset);
  const stamp = now.toISOString().replace(/[:.]/g, '-');
  const backup = `${basename(path)}.cut-${stamp}.bak`;
  const backupPath = join(dirname(path), backup);
  const bfd = openSync(backupPath, 'wx');
  try {
    writeFileSync(bfd, cut);
    fsyncSync(bfd);
  } finally {
    closeSync(bfd);
  }
  fsyncDir(dirname(path));
  const fd = openSync(path, 'r+');
  try {
    ftruncateSync(fd, damage.offset);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
  return { damage, cutBytes: cut.length, backup };
}
