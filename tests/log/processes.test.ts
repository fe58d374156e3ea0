import { existsSync, readFileSync, utimesSync, writeFileSync } from 'node:fs';
import { hostname } from 'node:os';
import { describe, expect, it } from 'vitest';
import { EMPTY_LOCK_GRACE_MS, lockPathOf } from '../../src/log/session-lock.js';
import { processStartToken } from '../../src/io/process-info.js';
import { scanLog } from '../../src/log/scan-log.js';
import { resumeLevel } from '../../src/session/session-files.js';
import { TALLY_CHILD, startChild } from '../helpers/child.js';
import { newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

function closedLevel() {
  const level = newLevelFile(tempDir());
  level.writer.close();
  return level.path;
}

const lockInfo = (pid: number, started: string | null, host = hostname()) =>
  `${JSON.stringify({ pid, host, started, token: 'feedfacefeedfacefeedface', at: '2026-11-02T09:00:00.000Z' })}\n`;

describe('one writer per session file (real processes)', () => {
  it('a second process on the same file is refused with a line naming the holder', async () => {
    const path = closedLevel();
    const first = startChild([TALLY_CHILD, path]);
    await first.waitFor(/ready/);
    const second = startChild([TALLY_CHILD, path]);
    expect(await second.exited()).toBe(1);
    expect(second.stderr()).toMatch(new RegExp(`is already open in exine process ${first.proc.pid} on ${hostname()}.*close it there first`));
    expect(second.stderr().trim().split('\n')).toHaveLength(1);
    first.proc.stdin.end();
    expect(await first.exited()).toBe(0);
    expect(existsSync(lockPathOf(path))).toBe(false);
  });

  it('a lock left by a killed process is recognised as stale and taken over', async () => {
    const path = closedLevel();
    const holder = startChild([TALLY_CHILD, path]);
    await holder.waitFor(/ready/);
    holder.proc.kill('SIGKILL');
    await holder.exited();
    expect(existsSync(lockPathOf(path))).toBe(true);
    const opened = resumeLevel(path);
    opened.writer.close();
    expect(opened.notices.join()).toMatch(new RegExp(`took over a stale lock \\(left by process ${holder.proc.pid}, no longer running\\)`));
  });

  it('a lock whose pid was reused by another process (other start time) is stale; a live holder or another host is not', () => {
    const path = closedLevel();
    writeFileSync(lockPathOf(path), lockInfo(process.pid, 'not-my-start-time'));
    const opened = resumeLevel(path);
    opened.writer.close();
    expect(opened.notices.join()).toMatch(/took over a stale lock/);

    writeFileSync(lockPathOf(path), lockInfo(process.pid, processStartToken(process.pid)));
    expect(() => resumeLevel(path)).toThrow(/is already open in exine process/);
    writeFileSync(lockPathOf(path), lockInfo(1, null, 'another-host.example'));
    expect(() => resumeLevel(path)).toThrow(/on another-host\.example/);
  });
});

describe('several writers racing for one stale lock (real processes)', () => {
  it('exactly one wins; the others are refused naming it', async () => {
    const path = closedLevel();
    const dead = startChild(['-e', '0']);
    await dead.exited();
    writeFileSync(lockPathOf(path), lockInfo(dead.proc.pid as number, null));
    const racers = Array.from({ length: 4 }, () => startChild([TALLY_CHILD, path]));
    const outcomes = await Promise.all(
      racers.map(
        (r) =>
          new Promise<'won' | 'refused'>((resolve) => {
            r.waitFor(/ready/).then(() => resolve('won'), () => {});
            r.exited().then((code) => code === 1 && resolve('refused'));
          }),
      ),
    );
    expect(outcomes.filter((o) => o === 'won')).toHaveLength(1);
    for (const r of racers.filter((_, i) => outcomes[i] === 'refused')) expect(r.stderr()).toMatch(/is already open in (exine process \d+|another exine that is starting up)/);
    const winner = racers[outcomes.indexOf('won')]!;
    winner.proc.stdin.end();
    expect(await winner.exited()).toBe(0);
    expect(existsSync(lockPathOf(path))).toBe(false);
  });
});

describe('a lock file without content (a writer stopped between creating and filling it)', () => {
  it('is respected while fresh, and taken over once older than the grace period', () => {
    const path = closedLevel();
    writeFileSync(lockPathOf(path), '');
    expect(() => resumeLevel(path)).toThrow(/already open in another exine that is starting up/);
    const old = new Date(Date.now() - EMPTY_LOCK_GRACE_MS - 1000);
    utimesSync(lockPathOf(path), old, old);
    const opened = resumeLevel(path);
    opened.writer.close();
    expect(opened.notices.join()).toMatch(/took over a stale lock \(left empty by a writer that stopped while starting\)/);
  });
});

describe('a crash loses no acknowledged grain (real process, SIGKILL)', () => {
  it('kills the counter in the middle of a burst; every acknowledged grain is in the file', async () => {
    const path = closedLevel();
    const child = startChild([TALLY_CHILD, path]);
    await child.waitFor(/ready/);
    // Small bursts keep arriving while the process is killed.
    const typing = setInterval(() => child.proc.stdin.write('abcoabcoab'), 2);
    await child.waitFor(/(ack \d+\n){100}/);
    child.proc.kill('SIGKILL');
    clearInterval(typing);
    await child.exited();
    const acks = [...child.stdout().matchAll(/ack (\d+)/g)].map((m) => Number(m[1]));
    const lastAck = Math.max(...acks);
    const scan = scanLog(readFileSync(path));
    expect(scan.corruption).toBeNull();
    const grains = scan.events.filter((e) => e.type === 'grain').map((e) => e.seq);
    // Every seq from the child's sitting up to the last acknowledged one is on disk: a
    // grain, or the stop signal recorded beside the grain that crossed the target.
    const first = scan.events.find((e) => e.type === 'sitting' && e.sitting === 2)!.seq + 1;
    const typeOf = new Map(scan.events.map((e) => [e.seq, e.type]));
    for (let seq = first; seq <= lastAck; seq++) expect(['grain', 'rules-met']).toContain(typeOf.get(seq));
    expect(scan.events.at(-1)!.seq).toBeGreaterThanOrEqual(lastAck);
    // The next sitting resumes from there, repairing a torn tail if the kill left one.
    const opened = resumeLevel(path);
    opened.writer.close();
    expect(opened.state.grains).toBe(grains.length);
    const signals = scan.events.filter((e) => e.type === 'rules-met' && e.seq >= first && e.seq <= lastAck).length;
    expect(opened.state.grains).toBeGreaterThanOrEqual(lastAck - first + 1 - signals);
  });
});
