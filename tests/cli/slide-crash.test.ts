import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openForCounting } from '../../src/cli/commands/count.js';
import { slideCounts } from '../../src/model/slides.js';
import { readLevel } from '../../src/session/session-files.js';
import { startChild } from '../helpers/child.js';
import { writeCore } from '../helpers/core-json.js';
import { tempDir } from '../helpers/temp-dir.js';

const CHILD = fileURLToPath(new URL('../fixtures/core-tally-child.mjs', import.meta.url));

describe('a level counted on a second slide', () => {
  it('resumes on the second slide after the process is killed, with every acknowledged grain on it', async () => {
    const dir = tempDir();
    writeCore(dir);
    const first = openForCounting(dir, { depth: '10' }, () => {}, {}, dir);
    first.writer.append({ type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a' });
    first.writer.append({ type: 'grain', taxon: 'Betula', traverse: 1, key: 'b' });
    first.writer.append({ type: 'close' });
    first.writer.close();

    const child = startChild([CHILD, dir, '10', 'B']);
    await child.waitFor(/ready slide B traverse 2 seq \d+\n/);
    const ready = Number(/seq (\d+)/.exec(child.stdout())?.[1]);
    child.proc.stdin.write('aac');
    // The keys may come in more than one burst: wait for the last grain's seq.
    const acked = ready + 3;
    await child.waitFor((out) => [...out.matchAll(/ack (\d+)/g)].some((m) => Number(m[1]) >= acked));
    child.proc.kill('SIGKILL');
    await child.exited();

    const path = join(dir, 'tm1-010cm.jsonl');
    const after = readLevel(path).state;
    expect(after.lastSeq).toBeGreaterThanOrEqual(acked);
    expect(after.slide).toBe('B');
    expect(slideCounts(after).map((s) => [s.slide, s.grains, s.firstTraverse])).toEqual([['A', 2, 1], ['B', 3, 2]]);

    // Resumed without --slide, counting goes on on B, and the unclean stop is said.
    const resumed = openForCounting(dir, { depth: '10' }, () => {}, {}, dir);
    expect(resumed.state.slide).toBe('B');
    expect(resumed.state.slides).toHaveLength(2);
    expect(resumed.notices.join(' ')).toMatch(/the last sitting was not closed cleanly/);
    resumed.writer.append({ type: 'grain', taxon: 'Corylus', traverse: resumed.state.traverse, key: 'c' });
    resumed.writer.close();
    expect(slideCounts(readLevel(path).state).map((s) => [s.slide, s.grains])).toEqual([['A', 2], ['B', 4]]);
  });
});
