import { unlinkSync } from 'node:fs';
import { hostname } from 'node:os';
import { basename } from 'node:path';
import { ExineError } from '../errors.js';
import { plainIoError } from '../io/describe-io-error.js';
import { isProcessRunning, processStartToken } from '../io/process-info.js';
import { createLockFile, newLockInfo, readLock, type LockInfo, type LockRead } from './lock-file.js';

export type { LockInfo };

/** An empty lock (left by an exine older than this one, stopped while starting) is this old before it counts as abandoned. */
export const EMPTY_LOCK_GRACE_MS = 5_000;
/** How long to wait for another process that is taking over the same stale lock. */
const TAKEOVER_WAIT_MS = 3_000;

export function lockPathOf(sessionPath: string): string {
  return `${sessionPath}.lock`;
}

type Found = Exclude<LockRead, { kind: 'gone' }>;
type Judgement = { readonly stale: true; readonly who: string } | { readonly stale: false; readonly holder: string };

/** Whether a lock's holder is gone. A lock from another host cannot be checked from here: it is never stale. */
function judge(found: Found, name: string): Judgement {
  const here = hostname();
  if (found.kind === 'lock') {
    const { pid, host, started, at } = found.info;
    if (host !== here) return { stale: false, holder: `exine process ${pid} on ${host} (since ${at})` };
    if (!isProcessRunning(pid)) return { stale: true, who: `left by process ${pid}, no longer running` };
    const now = processStartToken(pid);
    if (started !== null && now !== null && now !== started) return { stale: true, who: `left by process ${pid}, no longer running (its number is now another program's)` };
    return { stale: false, holder: `exine process ${pid} on ${host} (since ${at})` };
  }
  if (found.pid !== null && (found.host === null || found.host === here)) {
    if (!isProcessRunning(found.pid)) return { stale: true, who: `left by process ${found.pid}, no longer running` };
    return { stale: false, holder: `process ${found.pid}, whose lock file ${name} is incomplete` };
  }
  if (found.pid !== null) return { stale: false, holder: `process ${found.pid} on ${found.host}, whose lock file ${name} is incomplete` };
  if (found.empty && Date.now() - found.mtimeMs > EMPTY_LOCK_GRACE_MS) return { stale: true, who: 'left empty by a writer that stopped while starting' };
  if (found.empty) return { stale: false, holder: 'another exine that is starting up' };
  return { stale: false, holder: `a process unknown: the lock file ${name} cannot be read (exine did not write it); if no exine has this level open, delete ${name} by hand and try again` };
}

function sameLock(a: LockRead, b: Found): boolean {
  if (a.kind === 'gone' || a.ino !== b.ino || a.kind !== b.kind) return false;
  return a.kind === 'unreadable' || (b.kind === 'lock' && a.info.token === b.info.token);
}

const pause = (ms: number) => Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);

function releaseIfOurs(path: string, info: LockInfo): void {
  const current = readLock(path);
  if (current.kind === 'lock' && current.info.token === info.token) {
    try {
      unlinkSync(path);
    } catch {
      // already gone
    }
  }
}

/**
 * Remove a stale lock, one taker at a time. Only a process holding `PATH.break`
 * removes a lock, and only the very lock it judged stale (same file, same
 * token), so a lock created in the meantime by a live writer is never touched.
 * The break file is held for microseconds; a break file left by a killed taker is
 * itself removed when its holder is dead.
 */
function removeStale(path: string, judged: Found): void {
  const breakPath = `${path}.break`;
  const deadline = Date.now() + TAKEOVER_WAIT_MS;
  for (;;) {
    const info = newLockInfo();
    if (createLockFile(breakPath, info) === 'created') {
      try {
        if (sameLock(readLock(path), judged)) unlinkSync(path);
      } finally {
        releaseIfOurs(breakPath, info);
      }
      return;
    }
    const other = readLock(breakPath);
    if (other.kind !== 'gone') {
      const j = judge(other, basename(breakPath));
      // Checked again just before removal: a live taker's break file is never removed.
      if (j.stale && sameLock(readLock(breakPath), other)) {
        try {
          unlinkSync(breakPath);
        } catch {
          // another taker removed it
        }
        continue;
      }
      if (Date.now() > deadline) throw new ExineError(`cannot lock: another process has been taking over the same stale lock for ${TAKEOVER_WAIT_MS / 1000} s (${basename(breakPath)}); try again`);
      pause(2);
    }
  }
}

const describeFailure = (error: unknown): string => plainIoError(error) ?? (error as Error).message;

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
    for (let attempt = 0; attempt < 8; attempt++) {
      const info = newLockInfo();
      let made: 'created' | 'exists';
      try {
        made = createLockFile(path, info);
      } catch (error) {
        throw new ExineError(`cannot lock ${sessionPath}: ${describeFailure(error)}; nothing was changed`);
      }
      if (made === 'created') return new SessionLock(path, info, tookOverFrom);
      const found = readLock(path);
      if (found.kind === 'gone') continue;
      const j = judge(found, basename(path));
      if (!j.stale) throw new ExineError(`${sessionPath} is already open in ${j.holder}; close it there first (lock file: ${basename(path)})`);
      try {
        removeStale(path, found);
      } catch (error) {
        if (error instanceof ExineError) throw error;
        throw new ExineError(`cannot lock ${sessionPath}: ${describeFailure(error)}; nothing was changed`);
      }
      tookOverFrom = j.who;
    }
    throw new ExineError(`cannot lock ${sessionPath}: the lock file keeps changing; is another exine starting on it?`);
  }

  release(): void {
    if (this.released) return;
    this.released = true;
    releaseIfOurs(this.path, this.info);
  }
}
