import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { ExineError } from '../errors.js';

/**
 * Largest session file read. A level of 100,000 grains is about 25 MB; a file
 * past this is not one exine wrote, and holding it whole would only exhaust memory.
 */
export const MAX_SESSION_BYTES = 1024 * 1024 * 1024;

const mib = (bytes: number) => `${Math.ceil(bytes / 1024 / 1024)} MiB`;

/**
 * A session file's bytes, or one line saying why they cannot be had; `shown` is
 * the name the message gives. The size is checked on the open file, before reading.
 */
export function readSessionBytes(path: string, shown = path, maxBytes = MAX_SESSION_BYTES): Buffer {
  let fd: number | undefined;
  try {
    fd = openSync(path, 'r');
    const stat = fstatSync(fd);
    const size = stat.size;
    if (stat.isDirectory()) throw Object.assign(new Error('folder'), { code: 'EISDIR' });
    if (size > maxBytes) {
      throw new ExineError(`${shown} is ${mib(size)}, more than the ${mib(maxBytes)} exine reads as a session file (a level of 100,000 grains is about 25 MB); nothing was read`);
    }
    const buf = Buffer.allocUnsafe(size);
    let done = 0;
    for (let n = 1; done < size && n > 0; done += n) n = readSync(fd, buf, done, size - done, done);
    return done === size ? buf : buf.subarray(0, done);
  } catch (error) {
    if (error instanceof ExineError) throw error;
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') throw new ExineError(`${shown}: no such session file`);
    if (code === 'EISDIR') throw new ExineError(`${shown} is a folder, not a session file`);
    throw new ExineError(`${shown}: cannot be read (${code ?? String(error)})`);
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}
