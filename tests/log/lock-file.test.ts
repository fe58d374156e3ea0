import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { lockRace } from '../../src/bench/lock-race.js';
import { lockPathOf, SessionLock } from '../../src/log/session-lock.js';
import { resumeLevel } from '../../src/session/session-files.js';
import { startChild } from '../helpers/child.js';
import { newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';
import { fillDisk, tinyDisk } from '../helpers/tiny-disk.js';

function closedLevel() {
  const level = newLevelFile(tempDir());
  level.writer.close();
  return level.path;
}

const sleeper = () => startChild(['-e', 'setTimeout(() => {}, 60_000); console.log("up")']);

describe('a lock file exine did not write whole', () => {
  it('without its start-time field, a live holder keeps it, and the refusal names the pid', async () => {
    const holder = sleeper();
    await holder.waitFor(/up/);
    const path = closedLevel();
    const partial = `${JSON.stringify({ pid: holder.proc.pid, host: hostname(), token: 'feedfacefeedfacefeedface', at: '2026-11-02T09:00:00.000Z' })}\n`;
    writeFileSync(lockPathOf(path), partial);
    expect(() => resumeLevel(path)).toThrow(new RegExp(`already open in process ${holder.proc.pid}, whose lock file level\\.jsonl\\.lock is incomplete`));
    expect(readFileSync(lockPathOf(path), 'utf8')).toBe(partial);
    holder.proc.kill('SIGKILL');
    await holder.exited();
    // Once that pid is gone the lock is stale like any other.
    const opened = resumeLevel(path);
    opened.writer.close();
    expect(opened.notices.join()).toMatch(/took over a stale lock \(left by process \d+, no longer running\)/);
  });

  it('with content it cannot read at all, is respected, and the message says how to remove it by hand', () => {
    const path = closedLevel();
    writeFileSync(lockPathOf(path), 'held by the lab manager\n');
    expect(() => resumeLevel(path)).toThrow(/the lock file level\.jsonl\.lock cannot be read \(exine did not write it\); if no exine has this level open, delete level\.jsonl\.lock by hand and try again/);
    expect(existsSync(lockPathOf(path))).toBe(true);
  });

  it('is never left empty or half-written by exine: no temporary file stays behind either', () => {
    const path = closedLevel();
    const lock = SessionLock.acquire(path);
    expect(JSON.parse(readFileSync(lockPathOf(path), 'utf8'))).toMatchObject({ pid: process.pid, host: hostname() });
    lock.release();
    expect(readdirSync(join(path, '..')).filter((n) => n.includes('.lock'))).toEqual([]);
  });
});

describe('eight writers racing for one stale lock (real processes)', () => {
  it('never has two holders at once, and every refusal names the holder', async () => {
    const result = await lockRace(tempDir(), 4, 8);
    expect(result).toEqual({ rounds: 4, overlaps: 0, noWinner: 0, refusalsNotNamingHolder: 0 });
  }, 60_000);
});

// A real full disk: a 64 KiB tmpfs (root only, as on the project's machines and CI; skipped elsewhere).
describe('a disk too full for the lock file', () => {
  const disk = tinyDisk('exine-full-lock-');

  it('says so in one line at once, and leaves no lock behind', (ctx) => {
    if (!disk.mounted()) ctx.skip();
    const mountPoint = disk.dir;
    const { path, writer } = newLevelFile(mountPoint);
    writer.close();
    fillDisk(mountPoint);
    for (let i = 0; ; i++) {
      try {
        writeFileSync(join(mountPoint, `tiny-${i}`), 'x');
      } catch {
        break;
      }
    }
    expect(() => SessionLock.acquire(path)).toThrow(/^cannot lock .*level\.jsonl: the disk is full; nothing was changed$/);
    expect(readdirSync(mountPoint).filter((n) => n.includes('.lock'))).toEqual([]);
  });
});
