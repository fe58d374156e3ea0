import { readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { killRounds } from '../../src/bench/kill-rounds.js';
import { tempDir } from '../helpers/temp-dir.js';

// The random-kill harness of `npm run bench -- --only kill` (1,000 rounds there), kept working here.
describe('random kill -9 of exine count in a real pty', () => {
  it('two rounds on one file: every grain shown is on disk, the file reads and resumes each time', async () => {
    const dir = tempDir();
    const f = await killRounds(dir, 2, { perFile: 2, seed: 11 });
    expect(f).toMatchObject({ rounds: 2, files: 1, lost: 0, unreadable: 0, notResumed: 0 });
    expect(f.keysSent).toBeGreaterThan(0);
    expect(f.onDisk).toBeGreaterThanOrEqual(f.shown);
    expect(readdirSync(dir).filter((n) => n.endsWith('.jsonl'))).toEqual(['kill-0-0.jsonl']);
  });
});
