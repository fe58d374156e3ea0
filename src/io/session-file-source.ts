import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { ExineError } from '../errors.js';
import type { FileSource } from './byte-source.js';

/**
 * Largest session file read. A level of 100,000 grains is about 25 MB; a file
 * past this is not one exine wrote.
 */
export const MAX_SESSION_BYTES = 1024 * 1024 * 1024;

const mib = (bytes: number) => `${Math.ceil(bytes / 1024 / 1024)} MiB`;

function plainReadError(error: unknown, shown: string): ExineError {
  if (error instanceof ExineError) return error;
  const code = (error as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return new ExineError(`${shown}: no such session file`);
  if (code === 'EISDIR') return new ExineError(`${shown} is a folder, not a session file`);
  return new ExineError(`${shown}: cannot be read (${code ?? String(error)})`);
}

/**
 * Open a session file and hand `use` its bytes to read in blocks (the reader
 * never holds the whole file); the file is closed after. One line says why it
 * cannot be read; `shown` is the name that line gives. The size is checked on the
 * open file, before anything is read.
 */
export function withSessionFile<T>(path: string, use: (source: FileSource) => T, shown = path, maxBytes = MAX_SESSION_BYTES): T {
  let fd: number;
  let size: number;
  try {
    fd = openSync(path, 'r');
  } catch (error) {
    throw plainReadError(error, shown);
  }
  try {
    try {
      const stat = fstatSync(fd);
      if (stat.isDirectory()) throw Object.assign(new Error('folder'), { code: 'EISDIR' });
      size = stat.size;
    } catch (error) {
      throw plainReadError(error, shown);
    }
    if (size > maxBytes) {
      throw new ExineError(`${shown} is ${mib(size)}, more than the ${mib(maxBytes)} exine reads as a session file (a level of 100,000 grains is about 25 MB); nothing was read`);
    }
    const source: FileSource = {
      fd,
      size,
      read: (into, offset, length, position) => {
        try {
          return readSync(fd, into, offset, length, position);
        } catch (error) {
          throw plainReadError(error, shown);
        }
      },
    };
    return use(source);
  } finally {
    closeSync(fd);
  }
}
