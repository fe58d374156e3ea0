import { UNSEEN, visible } from '../text/visible.js';

/** Where a command's text goes. Only `write` is used, so a test can collect it in a string. */
export interface TextOut {
  write(text: string): unknown;
  /** A terminal rather than a file or a pipe (process.stdout says so; a test may too). */
  readonly isTTY?: boolean | undefined;
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

const UNSEEN_ALL = new RegExp(UNSEEN.source, 'gu');

/**
 * Text for a terminal: every control or invisible character becomes a visible
 * escape (see text/visible.ts) except the line breaks the output is made of —
 * LF, and CR right before LF (CSV's record ends). A name, note or key from a
 * file then cannot set the title, write the clipboard, clear the screen, ring
 * the bell or turn text around.
 */
export function terminalText(text: string): string {
  return text.replace(UNSEEN_ALL, (c: string, at: number) => (c === '\n' || (c === '\r' && text.charCodeAt(at + 1) === 10) ? c : visible(c)));
}

/**
 * JSON text with every control or invisible character written as a JSON
 * escape (\u202e), so it is safe on a terminal and still parses to the same
 * values. JSON.stringify escapes C0 controls but not C1, DEL or format characters.
 */
export function terminalJson(json: string): string {
  return json.replace(UNSEEN_ALL, (c: string) => {
    if (c === '\n') return c;
    let units = '';
    for (let i = 0; i < c.length; i++) units += `\\u${c.charCodeAt(i).toString(16).padStart(4, '0')}`;
    return units;
  });
}

const DATA = Symbol('data out');
type Guarded = TextOut & { readonly [DATA]: TextOut };

function guard(out: TextOut): Guarded {
  return { isTTY: out.isTTY, write: (text: string) => out.write(terminalText(text)), [DATA]: out };
}

/**
 * The Io a command gets from main(): everything written to stdout and stderr
 * passes through `terminalText`, so no command can print a file's text raw by
 * mistake. Data meant for a file (CSV to a pipe) goes through `writeData`.
 */
export function guardedIo(io: Io): Io {
  if (DATA in io.stdout) return io;
  return { ...io, stdout: guard(io.stdout), stderr: guard(io.stderr) };
}

/**
 * Data as recorded (CSV): unchanged when stdout is a file or a pipe, where it
 * is data; escaped like any other text when stdout is a terminal.
 */
export function writeData(out: TextOut, text: string): void {
  const raw = (out as Partial<Guarded>)[DATA];
  if (raw && !raw.isTTY) raw.write(text);
  else out.write(text);
}
