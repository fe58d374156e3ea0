import { readFileSync, writeFileSync, appendFileSync } from 'node:fs';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import type { KeyPress } from '../../src/input/key-press.js';
import { scanLog } from '../../src/log/scan-log.js';
import { CountingSession } from '../../src/session/counting-session.js';
import { correctLevel, readLevel } from '../../src/session/session-files.js';
import { NO_RULES } from '../../src/rules/rule-set.js';
import { TALLY_CHILD, startChild } from '../helpers/child.js';
import { TINY_KEYMAP, newLevelFile } from '../helpers/levels.js';
import { runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const keys = (text: string): KeyPress[] => [...text].map((c) => (c === '\t' ? { kind: 'tab' } : { kind: 'char', char: c }) as KeyPress);

/** A closed level: traverse 1 "aab", traverse 2 "cco"; grains are seq 3, 4, 5 and 7, 8, 9. */
function counted(targetSum = 500) {
  const level = newLevelFile(tempDir(), 'l.jsonl', TINY_KEYMAP, { ...NO_RULES, targetSum });
  const session = new CountingSession(level.writer, level.state);
  session.pressAll(keys('aab\tcco'));
  session.shutdown();
  return level.path;
}

const lines = (path: string) => readFileSync(path, 'utf8').trimEnd().split('\n');

describe('corrections: void and restore', () => {
  it('voids one grain: counts, summary and export honour it; the grain stays in the file', async () => {
    const path = counted();
    const before = lines(path);
    const state = correctLevel(path, { type: 'void', grain: 4, traverse: null, reason: 'double press' });
    expect(state.counts).toEqual({ Alnus: 1, Betula: 1, Corylus: 2, Poaceae: 1 });
    const after = lines(path);
    // Appended, never rewritten.
    expect(after.slice(0, before.length)).toEqual(before);
    expect(JSON.parse(after.at(-1)!)).toMatchObject({ type: 'void', grain: 4, traverse: null, reason: 'double press' });
    expect(readLevel(path).state.counts.Alnus).toBe(1);
    const summary = JSON.parse((await runExine(['summary', path, '--json'])).stdout);
    expect(summary.pollenSum).toBe(5);
    expect(summary.voided).toBe(1);
    expect((await runExine(['summary', path])).stdout).toMatch(/pollen sum 5 · 5 grains · .* · 1 grain voided in the audit\n/);
    const rows = parse((await runExine(['export', path])).stdout, { columns: true }) as Record<string, string>[];
    expect(rows.find((r) => r.taxon === 'Alnus')!.count).toBe('1');
    expect((await runExine(['verify', path])).code).toBe(0);
  });

  it('voids a whole traverse and restores it', () => {
    const path = counted();
    const voided = correctLevel(path, { type: 'void', grain: null, traverse: 2, reason: 'slide slipped' });
    expect(voided.counts).toEqual({ Alnus: 2, Betula: 1 });
    const voidSeq = voided.lastSeq;
    const restored = correctLevel(path, { type: 'restore', of: voidSeq, reason: 'checked again: it was fine' });
    expect(restored.counts).toEqual({ Alnus: 2, Betula: 1, Corylus: 2, Poaceae: 1 });
    expect(readLevel(path).state.counts).toEqual(restored.counts);
  });

  it('refuses what it cannot do, and writes nothing', () => {
    const path = counted();
    const size = readFileSync(path).length;
    expect(() => correctLevel(path, { type: 'void', grain: 6, traverse: null, reason: 'x' })).toThrow(/grain #6 does not count now/);
    expect(() => correctLevel(path, { type: 'void', grain: null, traverse: 5, reason: 'x' })).toThrow(/traverse 5 has no grain that counts now/);
    expect(() => correctLevel(path, { type: 'restore', of: 3, reason: 'x' })).toThrow(/event #3 is not a void that still stands/);
    expect(() => correctLevel(path, { type: 'void', grain: 3, traverse: null, reason: '  ' })).toThrow(/a correction needs a reason/);
    correctLevel(path, { type: 'void', grain: 3, traverse: null, reason: 'mistake' });
    const grown = readFileSync(path).length;
    expect(grown).toBeGreaterThan(size);
    expect(() => correctLevel(path, { type: 'void', grain: 3, traverse: null, reason: 'again' })).toThrow(/does not count now/);
    expect(readFileSync(path).length).toBe(grown);
  });

  it('refuses a file with a torn last line: exine count repairs it first', () => {
    const path = counted();
    appendFileSync(path, '{"seq":99,"at":"2026');
    expect(() => correctLevel(path, { type: 'void', grain: 3, traverse: null, reason: 'x' })).toThrow(/repair it, then correct/);
  });

  it('a void that takes the count below the target records rules-unmet', () => {
    const path = counted(6);
    expect(readLevel(path).state.rulesMet).toBe(true);
    const state = correctLevel(path, { type: 'void', grain: 9, traverse: null, reason: 'not Poaceae' });
    expect(state.rulesMet).toBe(false);
    expect(scanLog(readFileSync(path)).events.slice(-2).map((e) => e.type)).toEqual(['void', 'rules-unmet']);
  });

  it('waits while another process counts the level: refused with the holder named', async () => {
    const path = counted();
    const child = startChild([TALLY_CHILD, path]);
    await child.waitFor(/ready/);
    try {
      expect(() => correctLevel(path, { type: 'void', grain: 3, traverse: null, reason: 'x' })).toThrow(new RegExp(`already open in exine process ${child.proc.pid}`));
    } finally {
      child.proc.stdin.end();
      await child.exited();
    }
    expect(correctLevel(path, { type: 'void', grain: 3, traverse: null, reason: 'x' }).counts.Alnus).toBe(1);
  });

  it('a damaged file is refused for corrections, untouched', () => {
    const path = counted();
    const text = lines(path);
    text[3] = text[3]!.replace('"Alnus"', '"Betula"');
    writeFileSync(path, `${text.join('\n')}\n`);
    const bytes = readFileSync(path);
    expect(() => correctLevel(path, { type: 'void', grain: 3, traverse: null, reason: 'x' })).toThrow(/line 4 .*; no correction was made/);
    expect(readFileSync(path).equals(bytes)).toBe(true);
  });
});
