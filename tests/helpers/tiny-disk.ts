import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll } from 'vitest';

/**
 * A real full disk: a 64 KiB tmpfs, mounted for the describe block (or file) that
 * calls this. Mounting needs root, as on the project's machines and CI; elsewhere
 * `mounted()` is false and the tests skip. Not tempDir(): that is emptied after each
 * test, and a mounted folder cannot be removed.
 */
export function tinyDisk(prefix: string): { readonly dir: string; mounted(): boolean } {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  let mounted = false;
  beforeAll(() => {
    try {
      execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=64k', 'tmpfs', dir], { stdio: 'ignore' });
      mounted = true;
    } catch {
      // not root
    }
  });
  afterAll(() => {
    if (mounted) execFileSync('umount', [dir]);
    rmSync(dir, { recursive: true, force: true });
  });
  return { dir, mounted: () => mounted };
}

/** Fill the disk with 4 KiB files `fill-0`, `fill-1` … until it refuses one; returns how many names were tried. */
export function fillDisk(dir: string): number {
  let fills = 0;
  try {
    for (;;) writeFileSync(join(dir, `fill-${fills++}`), Buffer.alloc(4096));
  } catch {
    // full
  }
  return fills;
}
