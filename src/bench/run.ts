// npm run bench: speed measured as ratios against baselines taken in the same run, on the same disk.
// `npm run bench -- --only tally,resume` runs the named sections alone; --suite adds the test-suite timing.
import { cpus } from 'node:os';
import { benchCoreView } from './core-view.js';
import { benchCraftedInput } from './crafted-input.js';
import { benchFaults } from './fault-bench.js';
import { benchDamage } from './fault-damage.js';
import { benchFirstFrame } from './first-frame.js';
import { benchKill } from './kill-bench.js';
import { benchLockRace } from './lock-race-bench.js';
import { benchOptionalStopping } from './optional-stopping.js';
import { benchStatsRecompute } from './stats-recompute.js';
import { benchResume } from './resume.js';
import { benchTallyPath } from './tally-path.js';
import { benchTestSuite } from './test-suite.js';
import { benchAuditScale, benchStartUp } from './start-up.js';
import { benchKeyFrame } from './key-frame.js';

// The same benchmark built into dist/bundle/ by scripts/bundle.mjs, with the patched Ink users run.
const bundledKeyFrame = async () => ((await import(new URL('../bundle/bench-key-frame.js', import.meta.url).href)) as typeof import('./key-frame.js')).benchKeyFrame;

type Section = { name: string; run: () => string[] | Promise<string[]>; optIn?: boolean };

// One line per section; a new section is one more line here.
const SECTIONS: Section[] = [
  { name: 'tally', run: benchTallyPath },
  { name: 'resume', run: benchResume },
  { name: 'first-frame', run: benchFirstFrame },
  { name: 'stats', run: benchStatsRecompute },
  { name: 'stopping', run: () => benchOptionalStopping(Number(process.env.EXINE_SIM_RUNS ?? 2000)) },
  { name: 'crafted', run: benchCraftedInput },
  { name: 'lock-race', run: () => benchLockRace(Number(process.env.EXINE_LOCK_ROUNDS ?? 1000)) },
  { name: 'faults', run: () => benchFaults(Number(process.env.EXINE_FAULT_CASES ?? 2000)), optIn: true },
  { name: 'damage', run: () => benchDamage() },
  { name: 'kill', run: () => benchKill(Number(process.env.EXINE_KILL_ROUNDS ?? 1000)), optIn: true },
  { name: 'start-up', run: benchStartUp },
  { name: 'audit-scale', run: benchAuditScale },
  {
    name: 'key-frame',
    // Beside it, as its baseline, Ink as published (tsc's dist/, node_modules as installed) at one size.
    run: async () => [...(await (await bundledKeyFrame())()), ...(await benchKeyFrame([20_000], 150, ['stubbed'], 'Ink as published, unpatched'))],
  },
  { name: 'core-view', run: () => benchCoreView() },
  { name: 'suite', run: benchTestSuite, optIn: true },
];

function chosen(argv: string[]): Section[] {
  const at = argv.indexOf('--only');
  const legacySuiteOnly = argv.includes('--suite-only');
  if (at < 0 && !legacySuiteOnly) {
    return SECTIONS.filter((s) => !s.optIn || argv.includes(`--${s.name}`));
  }
  const names = legacySuiteOnly ? ['suite'] : (argv[at + 1] ?? '').split(',').filter(Boolean);
  const unknown = names.filter((n) => !SECTIONS.some((s) => s.name === n));
  if (names.length === 0 || unknown.length > 0) {
    process.stderr.write(`exine bench: --only takes section names separated by commas (${SECTIONS.map((s) => s.name).join(', ')})${unknown.length ? `, not ${unknown.join(', ')}` : ''}\n`);
    process.exit(2);
  }
  return SECTIONS.filter((s) => names.includes(s.name));
}

const sections = chosen(process.argv.slice(2));
process.stdout.write(`exine benchmark · node ${process.version} · ${cpus()[0]?.model ?? 'cpu'} × ${cpus().length}\n\n`);
for (const section of sections) process.stdout.write(`${(await section.run()).join('\n')}\n\n`);
