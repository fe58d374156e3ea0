import { execFileSync, spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { readFileSync, readlinkSync } from 'node:fs';
import { vi } from 'vitest';
import { EXINE_BIN } from './child.js';

/** Strip terminal control sequences so the screen text can be matched. */
export const plain = (s: string) => s.replace(/\x1b\[[0-9;?]*[A-Za-z]/g, '').replace(/\x1b\][^\x07]*\x07/g, '');

export interface Pty {
  readonly proc: ChildProcessWithoutNullStreams;
  output(): string;
  type(keys: string): void;
  waitFor(pattern: RegExp, timeoutMs?: number): Promise<void>;
  /** Wait for the first frame, then until Ink has switched the terminal to raw mode (keys typed before would wait in its line buffer). */
  ready(pattern: RegExp): Promise<void>;
  exited(): Promise<number | null>;
  /** pid of exine itself (the program inside the terminal). */
  programPid(): number;
}

/** Run exine in a real pseudo-terminal of 80x24, via util-linux `script`; `env` goes on top of this process's. */
export function startInPty(args: string[], cwd: string, { columns = 80, rows = 24, env = {} as NodeJS.ProcessEnv } = {}): Pty {
  const command = `stty cols ${columns} rows ${rows}; exec ${JSON.stringify(process.execPath)} ${JSON.stringify(EXINE_BIN)} ${args.map((a) => JSON.stringify(a)).join(' ')}`;
  // CI=true as on CI machines and some lab images: the screen must draw live all the same.
  const proc = spawn('script', ['-qfec', command, '/dev/null'], { cwd, stdio: 'pipe', env: { ...process.env, TERM: 'xterm-256color', CI: 'true', ...env } });
  // Keys may still be on their way when a test kills the process: a closed pipe is expected then.
  proc.stdin.on('error', () => {});
  let out = '';
  const waiters = new Set<() => void>();
  const onData = (d: Buffer) => {
    out += d.toString();
    for (const w of waiters) w();
  };
  proc.stdout.on('data', onData);
  proc.stderr.on('data', onData);
  const exit = new Promise<number | null>((resolve) => proc.on('exit', (code) => resolve(code)));
  const pty: Pty = {
    proc,
    output: () => plain(out),
    type: (keys) => proc.stdin.write(keys),
    waitFor: (pattern, timeoutMs = 15_000) =>
      new Promise((resolve, reject) => {
        const timer = setTimeout(() => {
          waiters.delete(check);
          reject(new Error(`timed out waiting for ${pattern}; screen ends: ${plain(out).slice(-400)}`));
        }, timeoutMs);
        function check() {
          if (pattern.test(plain(out))) {
            clearTimeout(timer);
            waiters.delete(check);
            resolve();
          }
        }
        waiters.add(check);
        check();
      }),
    ready: async (pattern) => {
      await pty.waitFor(pattern);
      const tty = readlinkSync(`/proc/${pty.programPid()}/fd/0`);
      await vi.waitFor(
        () => {
          if (!/(^|\s)-icanon\b/.test(execFileSync('stty', ['-a', '-F', tty], { encoding: 'utf8' }))) throw new Error(`${tty} never left line mode`);
        },
        { timeout: 15_000, interval: 10 },
      );
    },
    exited: () => exit,
    programPid: () => {
      const children = readFileSync(`/proc/${proc.pid}/task/${proc.pid}/children`, 'utf8').trim().split(/\s+/);
      return Number(children[0]);
    },
  };
  return pty;
}
