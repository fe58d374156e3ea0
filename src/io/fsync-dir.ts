import { closeSync, fsyncSync, openSync } from 'node:fs';

/** Make a file's creation or removal durable by syncing its folder (a no-op where folders cannot be opened). */
export function fsyncDir(dir: string): void {
  let fd: number | undefined;
  try {
    fd = openSync(dir, 'r');
    fsyncSync(fd);
  } catch {
    // Some platforms and file systems refuse to open or sync folders; the file itself is synced.
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}
