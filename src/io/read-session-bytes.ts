import { readFileSync } from 'node:fs';
import { ExineError } from '../errors.js';

/** A session file's bytes, or one line saying why they cannot be had; `shown` is the name the message gives. */
export function readSessionBytes(path: string, shown = path): Buffer {
  try {
    return readFileSync(path);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') throw new ExineError(`${shown}: no such session file`);
    if (code === 'EISDIR') throw new ExineError(`${shown} is a folder, not a session file`);
    throw new ExineError(`${shown}: cannot be read (${code ?? String(error)})`);
  }
}
