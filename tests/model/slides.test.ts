import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { slideCounts, slideNames, slideOf } from '../../src/model/slides.js';
import { readLevel } from '../../src/session/session-files.js';
import { grain, openPayload, sessionText, stateOf } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

describe('slides in the fold', () => {
  const state = stateOf(openPayload(undefined, { slide: 'A' }), [
    { type: 'sitting', sitting: 1 },
    grain('Alnus'), // seq 3
    grain('Betula'),
    { type: 'sitting', sitting: 2 },
    { type: 'slide', slide: 'B', traverse: 2 }, // seq 6
    grain('Alnus', 2),
    { type: 'undo', of: 7 },
    grain('Corylus', 2), // seq 9
    { type: 'traverse', traverse: 3 },
    grain('Alnus', 3),
  ]);

  it('knows the slide being counted and every slide with its first traverse', () => {
    expect(state.slide).toBe('B');
    expect(state.traverse).toBe(3);
    expect(state.slides.map((s) => [s.slide, s.seq, s.traverse])).toEqual([['A', 1, 1], ['B', 6, 2]]);
    expect(slideNames(state)).toEqual(['A', 'B']);
  });

  it('gives each grain its slide, by seq', () => {
    expect([3, 4, 7, 9, 11].map((seq) => slideOf(state.slides, seq))).toEqual(['A', 'A', 'B', 'B', 'B']);
  });

  it('counts the grains that still count, per slide', () => {
    expect(slideCounts(state)).toEqual([
      { slide: 'A', grains: 2, counts: { Alnus: 1, Betula: 1 }, firstTraverse: 1 },
      { slide: 'B', grains: 2, counts: { Corylus: 1, Alnus: 1 }, firstTraverse: 2 },
    ]);
  });

  it('a void keeps each grain on its slide', () => {
    const voided = stateOf(openPayload(undefined, { slide: 'A' }), [
      grain('Alnus'),
      { type: 'slide', slide: 'B', traverse: 2 },
      grain('Betula', 2),
      { type: 'void', grain: 2, traverse: null, reason: 'x' },
      { type: 'restore', of: 5, reason: 'y' },
    ]);
    expect(slideCounts(voided).map((s) => [s.slide, s.grains])).toEqual([['A', 1], ['B', 1]]);
  });

  it('reads a format-2 file (no slide events) as one slide, the open line\'s', () => {
    const dir = tempDir();
    const path = join(dir, 'old.jsonl');
    writeFileSync(path, sessionText([{ ...openPayload(), format: 2 }, { type: 'sitting', sitting: 1 }, grain('Alnus'), { type: 'close' }]));
    const { state: old } = readLevel(path);
    expect(old.slides).toEqual([{ slide: 'TM1-010-A', seq: 1, at: old.header.at, traverse: 1 }]);
    expect(slideCounts(old)).toEqual([{ slide: 'TM1-010-A', grains: 1, counts: { Alnus: 1 }, firstTraverse: 1 }]);
  });

  it('refuses a slide event with no name, as the reader does any bad line', () => {
    const dir = tempDir();
    const path = join(dir, 'bad.jsonl');
    writeFileSync(path, sessionText([openPayload(), { type: 'slide', slide: ' ', traverse: 1 } as never]));
    expect(() => readLevel(path)).toThrow(/line 2 is not a valid event: "slide" must not be empty/);
  });
});

describe('the hand checks of the new fields agree with the schema', () => {
  it.each([
    [{ type: 'slide', slide: 'B', traverse: 2 }, true],
    [{ type: 'slide', slide: '  ', traverse: 2 }, false],
    [{ type: 'slide', slide: 'B', traverse: 0 }, false],
    [{ ...openPayload(), fromCore: { overrides: ['target'] } }, true],
    [{ ...openPayload(), fromCore: { overrides: 'target' } }, false],
  ])('%j', async (payload, ok) => {
    const { passesHandCheck } = await import('../../src/log/hand-checks.js');
    const { parseEventObject } = await import('../../src/log/event-schema.js');
    const line = { ...payload, seq: 2, at: '2026-11-02T09:00:00.000Z', prev: 'x' } as Record<string, unknown>;
    expect(passesHandCheck(line)).toBe(ok);
    expect(parseEventObject(line).ok).toBe(ok);
  });
});
