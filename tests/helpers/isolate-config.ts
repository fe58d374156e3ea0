import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// No test reads or writes the real user's preferences: every worker, and every child it starts, uses its own folder.
process.env.EXINE_CONFIG_DIR = mkdtempSync(join(tmpdir(), 'exine-config-'));
