import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { bigSession } from './resume.js';
import { fmt, ratio, summarise } from './stats.js';

export const BIN = resolve(fileURLToPath(import.meta.url), '../../../bin/exine.cjs');

/** Peak resident memory of a running process, in MB (Linux: VmHWM), or NaN. */
function peakMb(pid: number): number {
  try {
    const m = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) / 1024 : Number.NaN;
  } catch {
    return Number.NaN;
  }
}

/** The program `script` runs (it execs node in place of the shell). */
function childOf(pid: number): number {
  try {
    return Number(readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8').trim().split(/\s+/)[0]);
  } catch {
    return Number.NaN;
  }
}

/** Time from start until the counting screen's first frame shows, in a real 80x24 pty (util-linux `script`), and exine's peak memory then. */
export function firstFrame(dir: string, file: string): Promise<{ ms: number; peakMb: number }> {
  return new Promise((done, fail) => {
    const command = `stty cols 80 rows 24; exec ${JSON.stringify(process.execPath)} ${JSON.stringify(BIN)} count ${file}`;
    const t0 = performance.now();
    const p = spawn('script', ['-qfec', command, '/dev/null'], { cwd: dir, stdio: 'pipe' });
    let out = '';
    let seen = false;
    p.stdout.on('data', (d: Buffer) => {
      out += d.toString();
      if (!seen && /Pollen sum/.test(out.replace(/\x1b\[[0-9;?]*[A-Za-z]/g, ''))) {
        seen = true;
        const elapsed = performance.now() - t0;
        const peak = peakMb(childOf(p.pid as number));
        p.stdin.write('\x03');
        p.on('exit', () => done({ ms: elapsed, peakMb: peak }));
      }
    });
    p.on('error', fail);
    setTimeout(() => !seen && fail(new Error(`no first frame: ${out.slice(-200)}`)), 60_000);
  });
}

export function timeCommand(args: string[], cwd?: string): number {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, args, { stdio: 'ignore', cwd });
  if (r.status !== 0) throw new Error(`${args.slice(0, 2).join(' ')} exited ${r.status}`);
  return performance.now() - t0;
}

// A bare read and JSON.parse of every line, in a fresh node process as exine's own start is.
const READ_AND_PARSE = `let n = 0; for (const line of require('node:fs').readFileSync(process.argv[1], 'utf8').split('\\n')) if (line) n += JSON.parse(line).seq > 0 ? 1 : 0; if (n === 0) process.exit(1);`;

/**
 * First frame of the counting screen, empty and resuming 100,000 events, beside a bare node
 * start and a bare read + JSON.parse of the file; peak memory beside a bare node process.
 * Runs are interleaved so that each baseline sees the same machine load.
 */
export async function benchFirstFrame(runs = 7, events = 100_000): Promise<string[]> {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-'));
  try {
    const big = join(dir, 'big.jsonl');
    writeFileSync(big, bigSession(events));
    const size = statSync(big).size / 1024 / 1024;
    const bare: number[] = [];
    const empty: number[] = [];
    const resumed: number[] = [];
    const parse: number[] = [];
    const peaks: number[] = [];
    const bareMb: number[] = [];
    for (let i = 0; i < runs; i++) {
      bare.push(timeCommand(['-e', '0']));
      empty.push((await firstFrame(dir, `empty-${i}.jsonl`)).ms);
      parse.push(timeCommand(['-e', READ_AND_PARSE, big]) - (bare.at(-1) as number));
      const r = await firstFrame(dir, 'big.jsonl');
      resumed.push(r.ms);
      peaks.push(r.peakMb);
      const probe = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.resourceUsage().maxRSS))'], { encoding: 'utf8' });
      bareMb.push(Number(probe.stdout) / 1024);
    }
    const b = summarise(bare).median;
    const e = summarise(empty).median;
    const r = summarise(resumed).median;
    const p = summarise(parse).median;
    const m = summarise(peaks).median;
    const bm = summarise(bareMb).median;
    const memGoal = bm + 3 * size;
    return [
      `(c) first frame of the counting screen (80x24 pty), median of ${runs}, interleaved`,
      `    bare node start                         ${fmt(b)}`,
      `    empty level                             ${fmt(e)}   ${ratio(e, b)}   (goal: at most 3x)`,
      `    read + JSON.parse per line, ${events.toLocaleString('en')} events (${size.toFixed(1)} MB), a node process less its start  ${fmt(p)}`,
      `    resuming ${events.toLocaleString('en')} events                 ${fmt(r)}   empty + ${((r - e) / p).toFixed(2)}x the parse   (goal: empty + at most 2x)`,
      `    peak memory resuming                    ${m.toFixed(0)} MB   bare node ${bm.toFixed(0)} MB + ${((m - bm) / size).toFixed(2)}x the file   (goal: at most ${memGoal.toFixed(0)} MB, bare + 3x)`,
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
