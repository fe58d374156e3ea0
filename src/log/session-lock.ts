import { randomBytes } from 'node:crypto';
import { closeSync, fsyncSync, linkSync, openSync, readFileSync, renameSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { basename } from 'node:path';
import { ExineError } from '../errors.js';
import { isProcessRunning, processStartToken } from '../io/process-info.js';

export interface LockInfo {
  readonly pid: number;
  readonly host: string;
  /** Process start token of the holder (see process-info.ts), to tell a reused pid from the holder. */
  readonly started: string | null;
  readonly token: string;
  readonly at: string;
}

/** A lock file created while its writer had not yet filled it is this old before it counts as abandoned. */
export const EMPTY_LOCK_GRACE_MS = 5_000;

export function lockPathOf(sessionPath: string): string {
  return `${sessionPath}.lock`;
}

function readLock(path: string): LockInfo | 'unreadable' | 'gone' {
  try {
    const info = JSON.parse(readFileSync(path, 'utf8')) as LockInfo;
    return typeof info.pid === 'number' && typeof info.token === 'string' ? info : 'unreadable';
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'ENOENT' ? 'gone' : 'unreadable';
  }
}

function isStale(path: string, info: LockInfo | 'unreadable'): boolean {
  if (info === 'unreadable') {
    try {
      return Date.now() - statSync(path).mtimeMs > EMPTY_LOCK_GRACE_MS;
    } catch {
      return true;
    }
  }
  // A lock from another machine (a shared drive) cannot be checked from here: never take it over.
  if (info.host !== hostname()) return false;
  if (!isProcessRunning(info.pid)) return true;
  const started = processStartToken(info.pid);
  return info.started !== null && started !== null && started !== info.started;
}

/** An exclusive claim on one session file for this process's lifetime. */
export class SessionLock {
  private released = false;

  private constructor(
    readonly path: string,
    readonly info: LockInfo,
    /** Set when a stale lock was taken over: whose it was, in words. */
    readonly tookOverFrom: string | null,
  ) {}

  static acquire(sessionPath: string): SessionLock {
    const path = lockPathOf(sessionPath);
    let tookOverFrom: string | null = null;
    for (let attempt = 0; attempt < 5; attempt++) {
      const info: LockInfo = {
        pid: process.pid,
        host: hostname(),
        started: processStartToken(process.pid),
        token: randomBytes(12).toString('hex'),
        at: new Date().toISOString(),
      };
      try {
        const fd = openSync(path, 'wx');
        try {
          writeSync(fd, `${JSON.stringify(info)}\n`);
          fsyncSync(fd);
        } finally {
          closeSync(fd);
        }
        return new SessionLock(path, info, tookOverFrom);
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code !== 'EEXIST') {
          throw new ExineError(`cannot lock ${sessionPath}: ${(error as Error).message}`);
        }
      }
      const held = readLock(path);
      if (held === 'gone') continue;
      if (!isStale(path, held)) {
        const who = held === 'unreadable' ? 'another exine that is starting up' : `exine process ${held.pid} on ${held.host} (since ${held.at})`;
        throw new ExineError(
          `${sessionPath} is already open in ${who}; close it there first (lock file: ${basename(path)})`,
        );
      }
      // Move the stale lock aside (never delete evidence), then check that what moved is what was judged stale.
      const aside = `${path}.stale-${randomBytes(6).toString('hex')}`;
      try {
        renameSync(path, aside);
      } catch {
        continue;
      }
      const moved = readLock(aside);
      const sameLock = held === 'unreadable' ? moved === 'unreadable' : moved !== 'unreadable' && moved !== 'gone' && moved.token === held.token;
      if (!sameLock) {
        // Another process replaced it in between: put its live lock back unless a third one already did.
        try {
          linkSync(aside, path);
          unlinkSync(aside);
        } catch {
          // leave it aside; the next attempt re-reads the lock in place
        }
        continue;
      }
      // The rename was the claim; the stale lock itself is of no further use.
      try {
        unlinkSync(aside);
      } catch {
        // left aside; harmless
      }
      tookOverFrom = moved === 'unreadable' || moved === 'gone' ? 'left empty by a writer that stopped while starting' : `left by process ${moved.pid}, no longer running`;
    }
    throw new ExineError(`cannot lock ${sessionPath}: the lock file keeps changing; is another exine starting on it?`);
  }

  release(): void {
    if (this.released) return;
    this.released = true;
    const current = readLock(this.path);
    if (current !== 'gone' && current !== 'unreadable' && current.token === this.info.token) {
      try {
        unlinkSync(this.path);
      } catch {
        // already gone
      }
    }
  }
}
