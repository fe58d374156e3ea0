import { copyFileSync, lstatSync, mkdirSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir, userInfo } from 'node:os';
import { basename, dirname, join } from 'node:path';
import { ExineError } from '../errors.js';
import { SessionLock } from '../log/session-lock.js';

function userName(): string {
  try {
    const name = userInfo().username.replace(/[^\w.-]/g, '_');
    if (name) return name;
  } catch {
    // no passwd entry (some containers): the uid names the folder instead
  }
  return String(process.getuid?.() ?? 'user');
}

/** The demo's folder: one per user under the temp folder, so copies never pile up there. */
export function demoFolder(tmp = tmpdir()): string {
  return join(tmp, `exine-demo-${userName()}`);
}

/**
 * A fresh copy of the bundled demo core (its core.json and every level) in the
 * demo folder, replacing the copy of the last run and anything left beside it
 * (a repair's backup, a stale lock): every demo starts half-counted, and
 * `exine core` on the folder shows the whole core. Returns the copy of `bundled`,
 * the level to count. Refused while an exine still counts the last copy.
 */
export function freshDemoCopy(bundled: string, tmp = tmpdir()): string {
  const dir = demoFolder(tmp);
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  const made = lstatSync(dir);
  // The temp folder is shared: never write into a folder (or a link) that someone else made under this name.
  if (!made.isDirectory() || (process.getuid && made.uid !== process.getuid())) {
    throw new ExineError(`exine demo: ${dir} is not a folder of yours; remove it, or point TMPDIR at another folder`);
  }
  const copy = join(dir, basename(bundled));
  const lock = SessionLock.acquire(copy);
  try {
    for (const entry of readdirSync(dir)) {
      if (join(dir, entry) !== lock.path) rmSync(join(dir, entry), { recursive: true, force: true });
    }
    const core = dirname(bundled);
    for (const entry of readdirSync(core)) {
      if (entry === 'core.json' || entry.endsWith('.jsonl')) copyFileSync(join(core, entry), join(dir, entry));
    }
  } finally {
    lock.release();
  }
  return copy;
}
