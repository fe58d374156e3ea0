import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { grain, openPayload, sessionText } from '../helpers/levels.js';
import { runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

// Cases the long fault run found (npm run bench -- --only faults), kept as tests.
describe('crafted levels the fault run found', () => {
  it('a traverse that jumps to 2^40 (hash chain intact): every command answers, no RangeError from the audit', async () => {
    const dir = tempDir();
    const huge = 2 ** 40;
    writeFileSync(join(dir, 'l.jsonl'), sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), { type: 'traverse', traverse: huge }, grain('Betula', huge)]));
    for (const args of [['audit', '--plain', 'l.jsonl'], ['summary', 'l.jsonl'], ['export', 'l.jsonl'], ['verify', 'l.jsonl']]) {
      const run = await runExine(args, dir);
      expect(run.stderr).toBe('');
      expect(run.code).toBe(0);
    }
    expect((await runExine(['audit', '--plain', 'l.jsonl'], dir)).stdout).toContain(String(huge));
  });
});
