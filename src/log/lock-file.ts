import { randomBytes } from 'node:crypto';
import { closeSync, fsyncSync, linkSync, openSync, readFileSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { processStartToken } from '../io/process-info.js';

export interface LockInfo {
  readonly pid: number;
  readonly host: string;
  /** Process start token of the holder (see process-info.ts), to tell a reused pid from the holder. */
  readonly started: string | null;
  readonly token: string;
  readonly at: string;
}

/** What is found at a lock path. */
export type LockRead =
  | { readonly kind: 'gone' }
  | { readonly kind: 'lock'; readonly info: LockInfo; readonly ino: number }
  /** Content exine does not write: only a pid could be made out of it, or nothing. */
  | { readonly kind: 'unreadable'; readonly pid: number | null; readonly host: string | null; readonly empty: boolean; readonly mtimeMs: number; readonly ino: number };

export function newLockInfo(): LockInfo {
  return { pid: process.pid, host: hostname(), started: processStartToken(process.pid), token: randomBytes(12).toString('hex'), at: new Date().toISOString() };
}

const isPid = (v: unknown): v is number => Number.isSafeInteger(v) && (v as number) > 0;

/** The lock as exine writes it, every field of the right kind; anything else is unreadable. */
function lockInfoOf(value: unknown): LockInfo | null {
  if (typeof value !== 'object' || value === null) return null;
  const v = value as Record<string, unknown>;
  const ok =
    isPid(v.pid) &&
    typeof v.host === 'string' &&
    (v.started === null || typeof v.started === 'string') &&
    typeof v.token === 'string' &&
    /^[0-9a-f]{24}$/.test(v.token) &&
    typeof v.at === 'string';
  return ok ? (v as unknown as LockInfo) : null;
}

export function readLock(path: string): LockRead {
  let text: string;
  let stat;
  try {
    stat = statSync(path);
    text = readFileSync(path, 'utf8');
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return { kind: 'gone' };
    throw error;
  }
  let value: unknown = null;
  try {
    value = JSON.parse(text);
  } catch {
    // unreadable below
  }
  const info = lockInfoOf(value);
  if (info) return { kind: 'lock', info, ino: stat.ino };
  const v = (typeof value === 'object' && value !== null ? value : {}) as Record<string, unknown>;
  return { kind: 'unreadable', pid: isPid(v.pid) ? v.pid : null, host: typeof v.host === 'string' ? v.host : null, empty: text.length === 0, mtimeMs: stat.mtimeMs, ino: stat.ino };
}

/**
 * Create a lock file that exists whole or not at all: written and synced under a
 * name of its own, then linked into place, which fails if a lock is already
 * there. A full disk fails before anything is at `path`.
 */
export function createLockFile(path: string, info: LockInfo): 'created' | 'exists' {
  const temp = `${path}.new-${info.token}`;
  const fd = openSync(temp, 'wx');
  try {
    try {
      writeSync(fd, `${JSON.stringify(info)}\n`);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    linkSync(temp, path);
    return 'created';
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'EEXIST') return 'exists';
    throw error;
  } finally {
    try {
      unlinkSync(temp);
    } catch {
      // already gone
    }
  }
}
