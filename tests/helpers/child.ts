import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export const TALLY_CHILD = fileURLToPath(new URL('../fixtures/tally-child.mjs', import.meta.url));
export const EXINE_BIN = fileURLToPath(new URL('../../bin/exine.cjs', import.meta.url));

export interface Child {
  readonly proc: ChildProcessWithoutNullStreams;
  stdout(): string;
  stderr(): string;
  /** Resolves once stdout matches (a pattern, or a test of the whole output). */
  waitFor(pattern: RegExp | ((stdout: string) => boolean), timeoutMs?: number): Promise<void>;
  exited(): Promise<number | null>;
}

export function startChild(args: string[], env: NodeJS.ProcessEnv = {}): Child {
  const proc = spawn(process.execPath, args, { env: { ...process.env, ...env }, stdio: 'pipe' });
  // Keys may still be on their way when a test kills the process: a closed pipe is expected then.
  proc.stdin.on('error', () => {});
  let out = '';
  let err = '';
  const waiters: (() => void)[] = [];
  proc.stdout.on('data', (d: Buffer) => {
    out += d.toString();
    for (const w of waiters) w();
  });
  proc.stderr.on('data', (d: Buffer) => {
    err += d.toString();
  });
  const exit = new Promise<number | null>((resolve) => proc.on('exit', (code) => resolve(code)));
  return {
    proc,
    stdout: () => out,
    stderr: () => err,
    waitFor: (pattern, timeoutMs = 10_000) =>
      new Promise((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`timed out waiting for ${pattern}; stdout: ${out.slice(-300)} stderr: ${err}`)), timeoutMs);
        const check = () => {
          if (typeof pattern === 'function' ? pattern(out) : pattern.test(out)) {
            clearTimeout(timer);
            resolve();
          }
        };
        waiters.push(check);
        check();
      }),
    exited: () => exit,
  };
}
