/** Where a command's text goes. Only `write` is used, so a test can collect it in a string. */
export interface TextOut {
  write(text: string): unknown;
}

/**
 * What a command reads from and writes to outside its arguments. main() and
 * every command take one, so the CLI can run inside a test process: output is
 * collected, the environment and working folder are the test's own, and the
 * exit code is returned rather than set on the process.
 *
 * The screens (count, demo, audit) draw on the process's own terminal through
 * Ink; `stdin` here only answers whether there is a terminal to draw on.
 */
export interface Io {
  readonly stdin: { readonly isTTY?: boolean; readonly setRawMode?: unknown };
  readonly stdout: TextOut;
  readonly stderr: TextOut;
  readonly env: NodeJS.ProcessEnv;
  /** The folder relative paths start from. */
  readonly cwd: string;
}

export function processIo(): Io {
  return { stdin: process.stdin, stdout: process.stdout, stderr: process.stderr, env: process.env, cwd: process.cwd() };
}
