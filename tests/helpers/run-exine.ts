import { spawnSync } from 'node:child_process';
import { EXINE_BIN } from './child.js';

export interface Run {
  readonly code: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

/** Run the built program as a user would, with no terminal attached. */
export function runExine(args: string[], cwd?: string, env: NodeJS.ProcessEnv = {}): Run {
  const r = spawnSync(process.execPath, [EXINE_BIN, ...args], { cwd, encoding: 'utf8', env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** One clear line on stderr and no stack trace. */
export function oneLine(run: Run): string {
  const lines = run.stderr.trimEnd().split('\n');
  if (lines.length !== 1 || /^\s+at /m.test(run.stderr)) throw new Error(`expected one stderr line, got:\n${run.stderr}`);
  return lines[0] as string;
}
