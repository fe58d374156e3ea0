import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import { TALLY_CHILD, startChild } from '../helpers/child.js';
import { newLevelFile } from '../helpers/levels.js';

// A real full disk: a 64 KiB tmpfs. Mounting needs root (as on the project's machines and CI);
// elsewhere this test is skipped and tests/log/writer-faults.test.ts covers the same path.
let mountPoint = '';
function tryMount(): boolean {
  // Not tempDir(): that is emptied after each test, and a mounted folder cannot be removed.
  mountPoint = mkdtempSync(join(tmpdir(), 'exine-full-disk-'));
  try {
    execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=64k', 'tmpfs', mountPoint], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}
let mounted = false;
beforeAll(() => {
  mounted = tryMount();
});
afterAll(() => {
  if (mounted) execFileSync('umount', [mountPoint]);
  rmSync(mountPoint, { recursive: true, force: true });
});

describe('a disk that fills up while counting (real tmpfs)', () => {
  it('shows the error, records nothing half-written, and loses no acknowledged grain', async (ctx) => {
    if (!mounted) ctx.skip();
    const { path, writer } = newLevelFile(mountPoint);
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
