import { readFileSync } from 'node:fs';
import { ExineError } from '../errors.js';

/** A session file's bytes, or one line saying why they cannot be had. */
export function readSessionBytes(path: string): Buffer {
  try {
    return readFileSync(path);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') throw new ExineError(`${path}: no such session file`);
    if (code === 'EISDIR') throw new ExineError(`${path} is a folder, not a session file`);
    throw new ExineError(`${path}: cannot be read (${code ?? String(error)})`);
  }
}
