import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll } from 'vitest';

// No test reads or writes the real user's preferences: every test file, and every child it starts, uses its own folder.
const dir = mkdtempSync(join(tmpdir(), 'exine-config-'));
process.env.EXINE_CONFIG_DIR = dir;
// Screens and reports show local time: every test, and every child it starts, sees one zone, whatever the machine's.
process.env.TZ = 'UTC';
afterAll(() => rmSync(dir, { recursive: true, force: true }));
