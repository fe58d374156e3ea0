import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { fmt, ratio, summarise } from './stats.js';

const BIN = resolve(fileURLToPath(import.meta.url), '../../../bin/exine.js');

/** Time from start until the counting screen's first frame shows, in a real pty (util-linux `script`). */
function firstFrame(dir: string, file: string): Promise<number> {
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
        p.stdin.write('\x03');
        p.on('exit', () => done(elapsed));
      }
    });
    p.on('error', fail);
    setTimeout(() => !seen && fail(new Error(`no first frame: ${out.slice(-200)}`)), 20_000);
  });
}

function timeCommand(args: string[]): number {
  const t0 = performance.now();
  spawnSync(process.execPath, args, { stdio: 'ignore' });
  return performance.now() - t0;
}

export async function benchFirstFrame(runs = 5): Promise<string[]> {
  const dir = mkdtempSync(join(tmpdir(), 'exine-bench-'));
  try {
    const frames: number[] = [];
    for (let i = 0; i < runs; i++) frames.push(await firstFrame(dir, `l${i}.jsonl`));
    const bare: number[] = [];
    const help: number[] = [];
    for (let i = 0; i < runs; i++) {
      bare.push(timeCommand(['-e', '0']));
      help.push(timeCommand([BIN, 'keys', 'keypad']));
    }
    const f = summarise(frames).median;
    const b = summarise(bare).median;
    const h = summarise(help).median;
    return [
      `(c) start to first frame of the counting screen (new level, 80x24 pty), median of ${runs}`,
      `    bare node start           ${fmt(b)}`,
      `    exine keys keypad         ${fmt(h)}   ${ratio(h, b)}   (a command without Ink)`,
      `    exine count, first frame  ${fmt(f)}   ${ratio(f, b)}`,
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
