import { spawn, spawnSync } from 'node:child_process';
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { lockPathOf } from '../log/session-lock.js';

/** The built racer: tests run from src/, but the racers are plain node processes. */
export const LOCK_RACE_CHILD = fileURLToPath(new URL('../../dist/bench/lock-race-child.js', import.meta.url));

export interface RaceResult {
  readonly rounds: number;
  /** Rounds in which more than one process held the lock at the same time. */
  readonly overlaps: number;
  /** Rounds in which no process got the lock although the old one was stale. */
  readonly noWinner: number;
  readonly refusalsNotNamingHolder: number;
}

function run(args: string[]): Promise<string> {
  return new Promise((resolve) => {
    const p = spawn(process.execPath, args, { stdio: ['ignore', 'pipe', 'inherit'] });
    let out = '';
    p.stdout.on('data', (d: Buffer) => (out += d.toString()));
    p.on('exit', () => resolve(out));
  });
}

/** Most stays at once in a journal of "+pid" / "-pid" lines. */
function mostAtOnce(journal: string): number {
  let depth = 0;
  let most = 0;
  for (const line of journal.split('\n')) {
    if (line.startsWith('+')) most = Math.max(most, ++depth);
    else if (line.startsWith('-')) depth--;
  }
  return most;
}

/**
 * `processes` racers start at once on one session file whose lock was left by a
 * dead process, `rounds` times. Every racer but the winner may also win later in
 * the round (the winner holds only 30 ms), so several winners are fine; two at the
 * same time are not.
 */
export async function lockRace(dir: string, rounds: number, processes: number, child = LOCK_RACE_CHILD): Promise<RaceResult> {
  const session = join(dir, 'race.jsonl');
  writeFileSync(session, '');
  const dead = spawnSync(process.execPath, ['-e', '0']).pid as number;
  let overlaps = 0;
  let noWinner = 0;
  let refusalsNotNamingHolder = 0;
  for (let round = 0; round < rounds; round++) {
    const journal = join(dir, `journal-${round}`);
    writeFileSync(journal, '');
    writeFileSync(lockPathOf(session), `${JSON.stringify({ pid: dead, host: hostname(), started: null, token: 'deaddeaddeaddeaddeaddead', at: new Date().toISOString() })}\n`);
    const startAt = Date.now() + 150 + processes * 15;
    const outs = await Promise.all(Array.from({ length: processes }, () => run([child, session, String(startAt), journal])));
    if (mostAtOnce(readFileSync(journal, 'utf8')) > 1) overlaps++;
    if (!outs.some((o) => o.startsWith('won'))) noWinner++;
    refusalsNotNamingHolder += outs.filter((o) => o.startsWith('refused') && !/already open in/.test(o)).length;
    rmSync(journal);
    rmSync(lockPathOf(session), { force: true });
  }
  return { rounds, overlaps, noWinner, refusalsNotNamingHolder };
}
