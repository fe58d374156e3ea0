import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { TALLY_CHILD, startChild } from '../helpers/child.js';
import { newLevelFile } from '../helpers/levels.js';
import { tinyDisk } from '../helpers/tiny-disk.js';

// A real full disk (root only; elsewhere skipped, and tests/log/writer-faults.test.ts covers the same path).
const disk = tinyDisk('exine-full-disk-');

describe('a disk that fills up while counting (real tmpfs)', () => {
  it('shows the error, records nothing half-written, and loses no acknowledged grain', async (ctx) => {
    if (!disk.mounted()) ctx.skip();
    const { path, writer } = newLevelFile(disk.dir);
    writer.close();
    const child = startChild([TALLY_CHILD, path]);
    await child.waitFor(/ready/);
    const typing = setInterval(() => child.proc.stdin.write('abco'), 1);
    await child.waitFor(/error /, 20_000);
    clearInterval(typing);
    expect(child.stdout()).toMatch(/error not recorded: writing .* failed \(the disk is full\); (nothing was counted|none of those \d+ keys was counted)/);
    child.proc.stdin.end();
    await child.exited();
    const scan = scanLog(readFileSync(path));
    expect([scan.tail, scan.corruption]).toEqual([null, null]);
    const lastAck = Math.max(...[...child.stdout().matchAll(/ack (\d+)/g)].map((m) => Number(m[1])));
    expect(scan.events.at(-1)!.seq).toBeGreaterThanOrEqual(lastAck);
    expect(scan.events.filter((e) => e.type === 'grain').length).toBeGreaterThan(100);
  });
});
