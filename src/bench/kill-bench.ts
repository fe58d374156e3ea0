import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { killRounds } from './kill-rounds.js';

/** Random kill -9 of exine count in a real pty while keys arrive; what was shown against what is on disk. */
export async function benchKill(rounds: number): Promise<string[]> {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-kill-'));
  try {
    const started = Date.now();
    const f = await killRounds(dir, rounds, {
      seed: Number(process.env.EXINE_KILL_SEED ?? 1),
      lanes: Number(process.env.EXINE_KILL_LANES ?? 1),
      onRound: (p) => p.rounds % 100 === 0 && process.stderr.write(`kill: ${p.rounds} rounds, ${p.shown} shown, ${p.lost} lost\n`),
    });
    const s = ((Date.now() - started) / 1000).toFixed(0);
    return [
      `(h) random kill -9 of exine count in an 80x24 pty, ${f.rounds} rounds on ${f.files} files, bursts of 1–300 keys (${s} s; EXINE_KILL_ROUNDS sets the rounds, EXINE_KILL_LANES how many run at once)`,
      `    keys sent ${f.keysSent} · grains shown ${f.shown} · grains on disk ${f.onDisk}`,
      `    shown but not on disk:        ${f.lost}   (goal: 0)`,
      `    files unreadable after a kill: ${f.unreadable}   (goal: 0)`,
      `    files that did not resume:     ${f.notResumed}   (goal: 0)`,
      `    torn last lines repaired:      ${f.tornTails}`,
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
