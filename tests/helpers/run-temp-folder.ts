import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/**
 * Vitest global setup: the whole run, its workers and every child they start get
 * a temp folder of their own (TMPDIR, which os.tmpdir() reads). Whatever a test
 * leaves there fails the run, naming what was left; the folder goes either way.
 * Other runs on the same machine then neither see nor disturb these files.
 */
export function setup(): () => void {
  const root = mkdtempSync(join(tmpdir(), 'exine-run-'));
  process.env.TMPDIR = root;
  return () => {
    const left = readdirSync(root);
    if (left.length) {
      process.stderr.write(`tests left ${left.length} item(s) in the temp folder: ${left.join(', ')}\n`);
      process.exitCode = 1;
    }
    rmSync(root, { recursive: true, force: true });
  };
}
