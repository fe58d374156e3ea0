import { existsSync, readFileSync, truncateSync, writeFileSync } from 'node:fs';
import * as fs from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { splitRaw } from '../../src/input/key-press.js';
import { TYPED_LINE_MAX } from '../../src/input/line-edit.js';
import { withSessionFile } from '../../src/io/session-file-source.js';
import { SCAN_LIMITS, scanLog } from '../../src/log/scan-log.js';
import { lockPathOf } from '../../src/log/session-lock.js';
import type { WriterFs } from '../../src/log/session-writer.js';
import type { OpenEvent } from '../../src/model/events.js';
import { foldEvents } from '../../src/model/fold.js';
import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { planBurst } from '../../src/session/plan-burst.js';
import { resumeLevel } from '../../src/session/session-files.js';
import { grain, newLevelFile, openPayload, sessionText, TINY_KEYMAP } from '../helpers/levels.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const level = (extra = 0) => sessionText([openPayload(), { type: 'sitting', sitting: 1 }, ...Array.from({ length: 3 + extra }, (_, i) => grain(['Alnus', 'Betula', 'Corylus'][i % 3] as string))]);

describe('a session file too big to hold, or with a line too long to read', () => {
  it('a file over the size limit is refused in one line before it is read (a sparse file of 1 GiB and a byte)', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'big.jsonl'), level());
    truncateSync(join(dir, 'big.jsonl'), 1024 * 1024 * 1024 + 1);
    for (const args of [['verify', 'big.jsonl'], ['summary', 'big.jsonl'], ['count', 'big.jsonl']]) {
      const run = await runExine(args, dir);
      expect(run.code).toBe(1);
      expect(oneLine(run)).toMatch(/big\.jsonl is 1025 MiB, more than the 1024 MiB exine reads as a session file .*nothing was read/);
    }
    expect(existsSync(lockPathOf(join(dir, 'big.jsonl')))).toBe(false);
  });

  it('the size limit is the one the reader is given', () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'l.jsonl'), level());
    expect(() => withSessionFile(join(dir, 'l.jsonl'), (source) => scanLog(source), 'l.jsonl', 100)).toThrow(/^l\.jsonl is 1 MiB, more than the 1 MiB/);
    expect(withSessionFile(join(dir, 'l.jsonl'), (source) => scanLog(source), 'l.jsonl')).toEqual(scanLog(Buffer.from(level())));
  });

  it('a line limit above every line read changes nothing, for files whole, cut, padded and changed', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 60 }), fc.nat(), fc.constantFrom('whole', 'cut', 'nul', 'flip'), fc.integer({ min: 2048, max: 6000 }), (n, at, how, limit) => {
        let bytes = Buffer.from(level(n));
        if (how === 'cut') bytes = bytes.subarray(0, at % bytes.length);
        if (how === 'nul') bytes = Buffer.concat([bytes, Buffer.alloc(at % 9000)]);
        if (how === 'flip') {
          bytes = Buffer.from(bytes);
          bytes[at % bytes.length] = (bytes[at % bytes.length] as number) ^ 0x20;
        }
        const one = scanLog(bytes);
        const limited = scanLog(bytes, undefined, { maxLineBytes: limit });
        expect(limited).toEqual(one);
      }),
      { numRuns: 300 },
    );
  });

  it('a line longer than the reader reads is damage named in one line, never a stack trace (a note of 17 MiB)', async () => {
    const dir = tempDir();
    const huge = 'x'.repeat(SCAN_LIMITS.maxLineBytes + 1024 * 1024);
    const text = sessionText([openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), { type: 'note', grain: 3, text: huge, stage: null }, grain('Betula')]);
    writeFileSync(join(dir, 'l.jsonl'), text);
    const verify = await runExine(['verify', 'l.jsonl'], dir);
    expect(verify.code).toBe(1);
    expect(oneLine(verify)).toMatch(/line 4 is longer than 16 MiB, far more than any line exine writes/);
    const count = await runExine(['count', 'l.jsonl'], dir);
    expect(oneLine(count)).toMatch(/line 4 is longer than 16 MiB.*nothing was changed/);
    expect(readFileSync(join(dir, 'l.jsonl'), 'utf8')).toBe(text);
    expect(existsSync(lockPathOf(join(dir, 'l.jsonl')))).toBe(false);
  });

  it('the writer never writes a line longer than the reader reads', () => {
    const { path, writer } = newLevelFile(tempDir());
    const before = readFileSync(path);
    expect(() => writer.append({ type: 'note', grain: null, text: 'y'.repeat(SCAN_LIMITS.maxLineBytes), stage: null })).toThrow(/longer than the reader reads.*nothing was written/);
    writer.close();
    expect(readFileSync(path)).toEqual(before);
  });

  it('a paste of 200,000 characters into a note keeps the first 2,000 and says so', () => {
    const start = foldEvents({ ...openPayload(), seq: 1, at: '2026-11-02T09:00:00.000Z' } as OpenEvent, TINY_KEYMAP, []);
    const plan = planBurst(start, null, splitRaw(`a\r${'n'.repeat(200_000)}`));
    expect(plan.mode).toMatchObject({ kind: 'note', text: 'n'.repeat(TYPED_LINE_MAX) });
    expect(plan.message?.text).toMatch(/at most 2000 characters: the rest was left out/);
    const done = planBurst(start, plan.mode, splitRaw('\r'));
    expect(done.payloads).toEqual([{ type: 'note', grain: 2, text: 'n'.repeat(TYPED_LINE_MAX), stage: null }]);
  });
});

/** Real file operations, except that writes from the `failAt`-th on fail like a full disk, putting half their bytes down. */
function failingFrom(failAt: number): WriterFs {
  let calls = 0;
  return {
    writeSync(fd, buffer, offset, length) {
      if (++calls >= failAt) {
        fs.writeSync(fd, buffer, offset, Math.floor(length / 2));
        throw Object.assign(new Error('ENOSPC: no space left on device'), { code: 'ENOSPC' });
      }
      return fs.writeSync(fd, buffer, offset, length);
    },
    fsyncSync: (fd) => fs.fsyncSync(fd),
    ftruncateSync: (fd, len) => fs.ftruncateSync(fd, len),
  };
}

describe('an open that fails', () => {
  it.each([1, 2, 3])('with writes failing from the %i. on: either all it records is on disk, or nothing, and no lock is left', (failAt) => {
    const { path, writer } = newLevelFile(tempDir());
    writer.append(grain('Alnus'));
    writer.close();
    const before = readFileSync(path);
    // A changed target: the open records a sitting, the new rules and their verdict.
    const rules = { ...DEFAULT_RULES, targetSum: 1 };
    let opened: ReturnType<typeof resumeLevel> | null = null;
    try {
      opened = resumeLevel(path, { ops: failingFrom(failAt), rules });
    } catch (error) {
      expect((error as Error).message).toMatch(/disk is full|ENOSPC/);
    }
    if (opened) {
      opened.writer.close();
      expect(scanLog(readFileSync(path)).events.slice(-3).map((e) => e.type)).toEqual(['sitting', 'rules', 'rules-met']);
    } else expect(readFileSync(path)).toEqual(before);
    expect(existsSync(lockPathOf(path))).toBe(false);
  });
});
