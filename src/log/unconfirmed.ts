import { closeSync, fsyncSync, openSync, readFileSync, rmSync, writeSync } from 'node:fs';
import { dirname } from 'node:path';
import { fsyncDir } from '../io/fsync-dir.js';

/**
 * Left beside a session file when a sync to disk failed: the lines of that write
 * were never shown as counted, so the next sitting must not count them silently.
 */
export interface UnconfirmedWrite {
  /** The file's confirmed length before the write. */
  readonly afterBytes: number;
  readonly fromSeq: number;
  readonly toSeq: number;
  readonly at: string;
  readonly reason: string;
}

export const unconfirmedPathOf = (sessionPath: string) => `${sessionPath}.unconfirmed`;

/** Best effort: the disk has just failed once, so this may fail too, and the caller goes on either way. */
export function recordUnconfirmed(sessionPath: string, write: UnconfirmedWrite): boolean {
  try {
    const fd = openSync(unconfirmedPathOf(sessionPath), 'w');
    try {
      writeSync(fd, `${JSON.stringify(write)}\n`);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    fsyncDir(dirname(sessionPath));
    return true;
  } catch {
    return false;
  }
}

export function readUnconfirmed(sessionPath: string): UnconfirmedWrite | null {
  let text: string;
  try {
    text = readFileSync(unconfirmedPathOf(sessionPath), 'utf8');
  } catch {
    return null;
  }
  try {
    const v = JSON.parse(text) as Record<string, unknown>;
    const whole = (n: unknown) => Number.isSafeInteger(n) && (n as number) >= 0;
    if (whole(v.afterBytes) && whole(v.fromSeq) && whole(v.toSeq) && typeof v.at === 'string' && typeof v.reason === 'string') return v as unknown as UnconfirmedWrite;
  } catch {
    // unreadable below
  }
  // A marker cut short by the same failing disk: every line after the last sitting's start is suspect, but we cannot say which.
  return { afterBytes: 0, fromSeq: 0, toSeq: 0, at: '', reason: 'unreadable marker' };
}

export function clearUnconfirmed(sessionPath: string): void {
  rmSync(unconfirmedPathOf(sessionPath), { force: true });
}
