import { readFileSync } from 'node:fs';
import * as fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { scanLog } from '../../src/log/scan-log.js';
import type { WriterFs } from '../../src/log/session-writer.js';
import { CountingSession } from '../../src/session/counting-session.js';
import { resumeLevel } from '../../src/session/session-files.js';
import { newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

/** Real file operations, except that while `full` a write puts half the bytes down and then fails like a full disk. */
function fullDisk(): WriterFs & { full: boolean } {
  const ops = {
    full: true,
    writeSync(fd: number, buffer: Buffer, offset: number, length: number) {
      if (ops.full) {
        fs.writeSync(fd, buffer, offset, Math.floor(length / 2));
        throw Object.assign(new Error('ENOSPC: no space left on device'), { code: 'ENOSPC' });
      }
      return fs.writeSync(fd, buffer, offset, length);
    },
    fsyncSync: (fd: number) => fs.fsyncSync(fd),
    ftruncateSync: (fd: number, len: number) => fs.ftruncateSync(fd, len),
  };
  return ops;
}

describe('when the disk fails', () => {
  it('a failed write is cut back, shown, and counts nothing; counting goes on once there is room', () => {
    const { path, writer } = newLevelFile(tempDir());
    writer.close();
    const ops = fullDisk();
    ops.full = false;
    const opened = resumeLevel(path, { ops });
    ops.full = true;
    const session = new CountingSession(opened.writer, opened.state);
    const before = readFileSync(path);
    session.pressAll([{ kind: 'char', char: 'a' }]);
    expect(session.getSnapshot().state.grains).toBe(0);
    expect(session.getSnapshot().message).toMatchObject({ tone: 'error' });
    expect(session.getSnapshot().message?.text).toMatch(/failed \(the disk is full\); nothing was counted/);
    expect(readFileSync(path).equals(before)).toBe(true);
    ops.full = false;
    session.pressAll([{ kind: 'char', char: 'b' }]);
    expect(session.getSnapshot().state.counts).toEqual({ Betula: 1 });
    session.shutdown();
    expect(scanLog(readFileSync(path)).corruption).toBeNull();
  });

  it('a failed fsync is not retried: the session turns read-only and says so', () => {
    const { path, writer } = newLevelFile(tempDir());
    writer.close();
    let fsyncs = 0;
    const ops: WriterFs = {
      writeSync: (fd, b, o, l) => fs.writeSync(fd, b, o, l),
      fsyncSync: (fd) => {
        if (++fsyncs > 1) throw Object.assign(new Error('EIO'), { code: 'EIO' });
        fs.fsyncSync(fd);
      },
      ftruncateSync: (fd, l) => fs.ftruncateSync(fd, l),
    };
    const opened = resumeLevel(path, { ops });
    const session = new CountingSession(opened.writer, opened.state);
    session.pressAll([{ kind: 'char', char: 'a' }, { kind: 'char', char: 'b' }]);
    const snap = session.getSnapshot();
    expect(snap.state.grains).toBe(0);
    expect(snap.readOnly).toMatch(/syncing .* failed \(EIO\)/);
    expect(fsyncs).toBe(2);
    session.shutdown();
  });
});
