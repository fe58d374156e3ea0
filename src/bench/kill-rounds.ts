import { execFileSync, spawn } from 'node:child_process';
import { readFileSync, readlinkSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { isProcessRunning } from '../io/process-info.js';
import { scanLog } from '../log/scan-log.js';
import { foldEvents } from '../model/fold.js';
import type { OpenEvent } from '../model/events.js';
import { resumeLevel } from '../session/session-files.js';
import { seededRandom } from '../demo/seeded-random.js';

const BIN = resolve(fileURLToPath(import.meta.url), '../../../bin/exine.cjs');
// Trees only: every key is a grain in the pollen sum, so the sum on screen and the grains on disk compare one to one.
const KEYS = 'qbapu';
const strip = (s: string) => s.replace(/\x1b\[[0-9;?]*[A-Za-z]/g, '').replace(/\x1b\][^\x07]*\x07/g, '');

export interface KillFigures {
  rounds: number;
  keysSent: number;
  /** The highest pollen sum each round drew on screen, added up. */
  shown: number;
  /** Grains on disk after each kill, above what the round started with, added up. */
  onDisk: number;
  /** Grains shown that the file does not hold (the promise: 0). */
  lost: number;
  tornTails: number;
  unreadable: number;
  notResumed: number;
  files: number;
}

type Random = () => number;
const between = (random: Random, lo: number, hi: number) => lo + Math.floor(random() * (hi - lo + 1));
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Grains in a file's valid prefix, and whether it can be read at all. */
function onDiskGrains(path: string): { grains: number; torn: boolean; corrupt: boolean } {
  const scan = scanLog(readFileSync(path));
  if (scan.corruption || !scan.events[0]) return { grains: 0, torn: false, corrupt: true };
  const [open, ...rest] = scan.events;
  const state = foldEvents(open as OpenEvent, scan.keymap as NonNullable<typeof scan.keymap>, rest as never);
  return { grains: state.grains, torn: scan.tail !== null, corrupt: false };
}

function isRaw(pid: number): boolean {
  try {
    const tty = readlinkSync(`/proc/${pid}/fd/0`);
    return /(^|\s)-icanon\b/.test(execFileSync('stty', ['-a', '-F', tty], { encoding: 'utf8' }));
  } catch {
    return false;
  }
}

/**
 * One round: exine count in a real pty (util-linux `script`), bursts of 1–300
 * keys, SIGKILL at a random moment. Returns the highest sum drawn, or null when
 * the program never drew its first frame in raw mode (the file did not resume).
 */
async function killRound(dir: string, file: string, fresh: boolean, random: Random): Promise<{ shown: number; start: number; keys: number } | null> {
  const args = fresh ? ['count', file, '--quiet', '--target', '100000'] : ['count', file, '--quiet'];
  const command = `stty cols 80 rows 24; exec ${JSON.stringify(process.execPath)} ${JSON.stringify(BIN)} ${args.map((a) => JSON.stringify(a)).join(' ')}`;
  const proc = spawn('script', ['-qfec', command, '/dev/null'], { cwd: dir, stdio: 'pipe', env: { ...process.env, TERM: 'xterm-256color' } });
  proc.stdin.on('error', () => {});
  let out = '';
  proc.stdout.on('data', (d: Buffer) => (out += d.toString()));
  const exited = new Promise<void>((r) => proc.on('exit', () => r()));
  const programPid = () => Number(readFileSync(`/proc/${proc.pid}/task/${proc.pid}/children`, 'utf8').trim().split(/\s+/)[0]);
  const sums = () => [...strip(out).matchAll(/Pollen sum (\d+)/g)].map((m) => Number(m[1]));
  let pid = 0;
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (sums().length > 0) {
      try {
        pid = programPid();
      } catch {
        pid = 0;
      }
      if (pid && isRaw(pid)) break;
    }
    await sleep(5);
  }
  if (!pid || !isRaw(pid)) {
    proc.kill('SIGKILL');
    await exited;
    return null;
  }
  const start = Math.max(...sums());
  let keys = 0;
  let killed = false;
  const typing = (async () => {
    for (let b = between(random, 1, 6); b > 0 && !killed; b--) {
      const n = between(random, 1, 300);
      proc.stdin.write(Array.from({ length: n }, () => KEYS[between(random, 0, KEYS.length - 1)]).join(''));
      keys += n;
      await sleep(between(random, 0, 250));
    }
  })();
  // Any moment: before the first key is handled, mid-burst, mid-write, or after the keys are all drawn.
  await sleep(between(random, 0, 1500));
  killed = true;
  process.kill(pid, 'SIGKILL');
  await typing;
  proc.kill('SIGKILL');
  await exited;
  while (isProcessRunning(pid)) await sleep(2);
  return { shown: Math.max(...sums()), start, keys };
}


/**
 * `rounds` kill rounds, `perFile` on each level file (each round after the first
 * resumes what the last kill left), then every file is resumed once more in-process.
 * `lanes` run side by side, each on files of its own, so a busy machine's waits overlap.
 */
export async function killRounds(
  dir: string,
  rounds: number,
  { perFile = 10, seed = 1, lanes = 1, onRound }: { perFile?: number; seed?: number; lanes?: number; onRound?: (f: KillFigures) => void } = {},
): Promise<KillFigures> {
  const f: KillFigures = { rounds: 0, keysSent: 0, shown: 0, onDisk: 0, lost: 0, tornTails: 0, unreadable: 0, notResumed: 0, files: 0 };
  const lane = async (n: number, laneRounds: number) => {
    const random = seededRandom(seed + 1000 * n);
    let file = '';
    let before = 0;
    const finishFile = () => {
      if (!file) return;
      try {
        const opened = resumeLevel(join(dir, file));
        opened.writer.close();
        if (opened.state.grains !== before) f.notResumed++;
      } catch {
        f.notResumed++;
      }
    };
    for (let r = 0; r < laneRounds; r++) {
      const fresh = !file || r % perFile === 0;
      if (fresh) {
        finishFile();
        file = `kill-${n}-${f.files++}.jsonl`;
        before = 0;
      }
      const round = await killRound(dir, file, fresh, random);
      f.rounds++;
      if (!round) {
        f.notResumed++;
        file = '';
        continue;
      }
      const disk = onDiskGrains(join(dir, file));
      if (disk.corrupt) {
        f.unreadable++;
        file = '';
        continue;
      }
      if (disk.torn) f.tornTails++;
      f.keysSent += round.keys;
      f.shown += round.shown - round.start;
      f.onDisk += disk.grains - before;
      f.lost += Math.max(0, round.shown - disk.grains);
      before = disk.grains;
      onRound?.(f);
    }
    finishFile();
  };
  await Promise.all(Array.from({ length: lanes }, (_, n) => lane(n, Math.floor(rounds / lanes) + (n < rounds % lanes ? 1 : 0))));
  return f;
}
