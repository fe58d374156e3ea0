import { spawnSync } from 'node:child_process';
import { main } from '../../src/cli/main.js';
import { EXINE_BIN } from './child.js';

export interface Run {
  readonly code: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

/**
 * The exine command line run inside the test process: main() with its output
 * collected, the test's environment on top of this process's, relative paths
 * from `cwd`, and no terminal. For output and exit codes; a test where the
 * process itself is the point (locks, signals, crashes, the screen) starts one.
 */
export async function runExine(args: string[], cwd = process.cwd(), env: NodeJS.ProcessEnv = {}): Promise<Run> {
  let stdout = '';
  let stderr = '';
  const exitCode = process.exitCode;
  const code = await main(args, {
    stdin: { isTTY: false },
    stdout: { write: (text: string) => (stdout += text) },
    stderr: { write: (text: string) => (stderr += text) },
    env: { ...process.env, ...env },
    cwd,
  });
  // main returns the code; setting it on the process would leak into the next test.
  if (process.exitCode !== exitCode) throw new Error(`exine ${args.join(' ')} set process.exitCode to ${process.exitCode}; main must return it`);
  return { code, stdout, stderr };
}

/** The built program in a child process, as a user runs it, with no terminal attached. */
export function spawnExine(args: string[], cwd?: string, env: NodeJS.ProcessEnv = {}): Run {
  const r = spawnSync(process.execPath, [EXINE_BIN, ...args], { cwd, encoding: 'utf8', env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** One clear line on stderr and no stack trace. */
export function oneLine(run: Run): string {
  const lines = run.stderr.trimEnd().split('\n');
  if (lines.length !== 1 || /^\s+at /m.test(run.stderr)) throw new Error(`expected one stderr line, got:\n${run.stderr}`);
  return lines[0] as string;
}
