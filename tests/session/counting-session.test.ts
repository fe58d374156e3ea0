import * as fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { splitRaw } from '../../src/input/key-press.js';
import type { WriterFs } from '../../src/log/session-writer.js';
import { CountingSession } from '../../src/session/counting-session.js';
import { readLevel, resumeLevel } from '../../src/session/session-files.js';
import { newLevelFile } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

/** Real file operations that count fsyncs and can be told to fail the next write. */
function watchedFs() {
  const ops = {
    fsyncs: 0,
    failNextWrite: false,
    writeSync(fd: number, b: Buffer, o: number, l: number) {
      if (ops.failNextWrite) {
        ops.failNextWrite = false;
        fs.writeSync(fd, b, o, Math.floor(l / 3));
        throw Object.assign(new Error('ENOSPC'), { code: 'ENOSPC' });
      }
      return fs.writeSync(fd, b, o, l);
    },
    fsyncSync(fd: number) {
      ops.fsyncs++;
      fs.fsyncSync(fd);
    },
    ftruncateSync: (fd: number, len: number) => fs.ftruncateSync(fd, len),
  } satisfies WriterFs & Record<string, unknown>;
  return ops;
}

function session() {
  const { path, writer } = newLevelFile(tempDir());
  writer.close();
  const ops = watchedFs();
  const opened = resumeLevel(path, { ops });
  ops.fsyncs = 0;
  return { path, ops, s: new CountingSession(opened.writer, opened.state) };
}

const keys = (text: string) => splitRaw(text);

describe('a burst of keys', () => {
  it('goes to disk with one fsync, and only then moves the state', () => {
    const { path, ops, s } = session();
    s.pressAll(keys('aaaaabbbbbcccccooooo'.repeat(5)));
    expect(ops.fsyncs).toBe(1);
    expect(s.getSnapshot().state.grains).toBe(100);
    s.shutdown();
    expect(readLevel(path).state.counts).toEqual({ Alnus: 25, Betula: 25, Corylus: 25, Poaceae: 25 });
  });

  it('decides each key on the keys before it: an undo inside the burst cancels the grain just typed', () => {
    const { path, s } = session();
    s.pressAll(keys('ab\x7f\x7fc\tc'));
    const state = s.getSnapshot().state;
    expect(state.counts).toEqual({ Corylus: 2 });
    expect(state.traverse).toBe(2);
    s.shutdown();
    const undos = readLevel(path).state.recent.filter((e) => e.type === 'undo').map((e) => (e as { of: number }).of);
    expect(undos).toEqual([5, 4]);
  });

  it('when the write fails, none of the burst counts and the screen says so; the next burst works', () => {
    const { path, ops, s } = session();
    s.pressAll(keys('aa'));
    const before = fs.readFileSync(path);
    ops.failNextWrite = true;
    s.pressAll(keys('bbbb'));
    expect(s.getSnapshot().message?.text).toMatch(/disk is full\); none of those 4 keys was counted/);
    expect(s.getSnapshot().state.counts).toEqual({ Alnus: 2 });
    expect(fs.readFileSync(path).equals(before)).toBe(true);
    s.pressAll(keys('c'));
    expect(s.getSnapshot().state.counts).toEqual({ Alnus: 2, Corylus: 1 });
    s.shutdown();
    expect(readLevel(path).state.counts).toEqual({ Alnus: 2, Corylus: 1 });
  });

  it('Ctrl-C inside a burst records the keys before it and drops the rest', () => {
    const { path, s } = session();
    expect(s.pressAll(keys('ab\x03cc'))).toBe('quit');
    s.shutdown();
    expect(readLevel(path).state.counts).toEqual({ Alnus: 1, Betula: 1 });
  });

  it('Ctrl-F and y in one burst finish the level; Ctrl-F and another key cancel without counting it', () => {
    const first = session();
    expect(first.s.pressAll(keys('a\x06b'))).toBeUndefined();
    expect(first.s.getSnapshot().state.counts).toEqual({ Alnus: 1 });
    expect(first.s.pressAll(keys('\x06y'))).toBe('quit');
    first.s.shutdown();
    const state = readLevel(first.path).state;
    expect(state.finishedAt).not.toBeNull();
    expect(state.recent.at(-1)?.type).toBe('finish');
  });
});
