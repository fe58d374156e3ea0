import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { fmt, ratio, summarise } from './stats.js';

const ROOT = resolve(fileURLToPath(import.meta.url), '../../..');
/** A test file with no I/O and no screen: what one vitest start costs. */
const TRIVIAL = 'tests/text/braille-plot.test.ts';

interface Timed {
  readonly ms: number;
  readonly ok: boolean;
  readonly tally: string;
}

/** `npx vitest run [files]` in `dir`, without npx's own start-up; its "Tests N passed" line kept. */
function vitest(dir: string, files: string[]): Timed {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [resolve(dir, 'node_modules/vitest/vitest.mjs'), 'run', ...files], { cwd: dir, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  const ms = performance.now() - t0;
  const text = `${r.stdout}${r.stderr}`.replace(/\x1b\[[0-9;]*m/g, '');
  const tally = /^\s*Tests\s+(.*)$/m.exec(text)?.[1]?.trim() ?? 'no tally';
  return { ms, ok: r.status === 0, tally };
}

function bareNode(): number {
  const t0 = performance.now();
  spawnSync(process.execPath, ['-e', '0'], { stdio: 'ignore' });
  return performance.now() - t0;
}

/**
 * (f), opt-in: the wall time of the whole test suite, against one trivial test
 * file and a bare node start measured around it, so a busy machine slows the
 * baselines too. EXINE_BENCH_SUITE_DIR times another checkout (built, with
 * node_modules) against the same baselines, e.g. the commit before a change.
 */
export function benchTestSuite(runs = 3): string[] {
  const dir = process.env.EXINE_BENCH_SUITE_DIR ? resolve(process.env.EXINE_BENCH_SUITE_DIR) : ROOT;
  const bare: number[] = [];
  const trivial: number[] = [];
  const baselines = () => {
    for (let i = 0; i < runs; i++) {
      bare.push(bareNode());
      trivial.push(vitest(ROOT, [TRIVIAL]).ms);
    }
  };
  baselines();
  const suite = vitest(dir, []);
  baselines();
  const b = summarise(bare).median;
  const t = summarise(trivial).median;
  return [
    `(f) the whole test suite (vitest run${dir === ROOT ? '' : ` in ${dir}`}), baselines median of ${2 * runs} taken before and after it`,
    `    bare node start           ${fmt(b)}`,
    `    one trivial test file     ${fmt(t)}   ${ratio(t, b)}`,
    `    whole suite               ${fmt(suite.ms / 1000, 's')}   ${ratio(suite.ms, t)} of one file   ${ratio(suite.ms, b)} of node   (${suite.ok ? '' : 'FAILED: '}${suite.tally})`,
  ];
}
