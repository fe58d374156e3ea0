// npm run bench: speed measured as ratios against baselines taken in the same run, on the same disk.
import { cpus } from 'node:os';
import { benchCraftedInput } from './crafted-input.js';
import { benchFirstFrame } from './first-frame.js';
import { benchLockRace } from './lock-race-bench.js';
import { benchOptionalStopping } from './optional-stopping.js';
import { benchStatsRecompute } from './stats-recompute.js';
import { benchResume } from './resume.js';
import { benchTallyPath } from './tally-path.js';
import { benchTestSuite } from './test-suite.js';

const out = (lines: string[]) => process.stdout.write(`${lines.join('\n')}\n\n`);
// --suite adds (f), the whole test suite's wall time; --suite-only runs (f) alone.
const suiteOnly = process.argv.includes('--suite-only');
process.stdout.write(`exine benchmark · node ${process.version} · ${cpus()[0]?.model ?? 'cpu'} × ${cpus().length}\n\n`);
if (!suiteOnly) {
  out(benchTallyPath());
  out(benchResume());
  out(await benchFirstFrame());
  out(benchStatsRecompute());
  out(benchOptionalStopping(Number(process.env.EXINE_SIM_RUNS ?? 2000)));
  out(benchCraftedInput());
  out(await benchLockRace(Number(process.env.EXINE_LOCK_ROUNDS ?? 1000)));
}
if (suiteOnly || process.argv.includes('--suite')) out(benchTestSuite());
