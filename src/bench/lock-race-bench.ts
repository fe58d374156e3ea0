import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { lockRace } from './lock-race.js';

/** Eight processes start at once on a level whose lock was left by a dead process, round after round. */
export async function benchLockRace(rounds: number, processes = 8): Promise<string[]> {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-lock-'));
  try {
    const started = Date.now();
    const r = await lockRace(dir, rounds, processes);
    const s = ((Date.now() - started) / 1000).toFixed(0);
    return [
      `(f) lock race: ${processes} processes at once on a stale lock, ${r.rounds} rounds (${s} s; EXINE_LOCK_ROUNDS sets the rounds)`,
      `    rounds with two holders at once: ${r.overlaps}   (goal: 0)`,
      `    rounds with no holder:           ${r.noWinner}   (goal: 0)`,
      `    refusals not naming the holder:  ${r.refusalsNotNamingHolder}   (goal: 0)`,
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
