import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { onTestFinished } from 'vitest';

/** A fresh real folder, removed when the test that asked for it ends. */
export function tempDir(): string {
  const dir = mkdtempSync(join(tmpdir(), 'exine-test-'));
  // Tied to the test, not to a file-level hook: test files share one module cache (isolate: false).
  onTestFinished(() => rmSync(dir, { recursive: true, force: true }));
  return dir;
}
