// npm run bench: speed measured as ratios against baselines taken in the same run, on the same disk.
import { cpus } from 'node:os';
import { benchFirstFrame } from './first-frame.js';
import { benchLockRace } from './lock-race-bench.js';
import { benchOptionalStopping } from './optional-stopping.js';
import { benchStatsRecompute } from './stats-recompute.js';
import { benchResume } from './resume.js';
import { benchTallyPath } from './tally-path.js';

const out = (lines: string[]) => process.stdout.write(`${lines.join('\n')}\n\n`);
process.stdout.write(`exine benchmark · node ${process.version} · ${cpus()[0]?.model ?? 'cpu'} × ${cpus().length}\n\n`);
out(benchTallyPath());
out(benchResume());
out(await benchFirstFrame());
out(benchStatsRecompute());
out(benchOptionalStopping(Number(process.env.EXINE_SIM_RUNS ?? 2000)));
out(await benchLockRace(Number(process.env.EXINE_LOCK_ROUNDS ?? 1000)));
