import { appendFileSync, copyFileSync, utimesSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { depthFromFileName, levelFileName } from '../../src/core/level-name.js';
import { parsePlannedDepths } from '../../src/core/planned-depths.js';
import { readCoreFolder } from '../../src/core/read-core.js';
import { createLevel } from '../../src/session/session-files.js';
import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { writeCore, TINY_CORE } from '../helpers/core-json.js';
import { newLevelFile, TINY_KEYMAP } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

function coreLevel(dir: string, depth: number, overrides: string[] = [], rules = DEFAULT_RULES) {
  const path = join(dir, levelFileName('TM-1', depth));
  const opened = createLevel(path, {
    info: { level: `TM-1 ${depth}`, depth, site: 'Test Mere', core: 'TM-1', slide: 'A', analyst: null },
    keymap: TINY_KEYMAP,
    rules,
    spike: null,
    fromCore: { overrides },
  });
  opened.writer.close();
  return path;
}

describe('level file names', () => {
  it.each([
    ['KM-1', 112, 'km1-112cm.jsonl'],
    ['KM-1', 4, 'km1-004cm.jsonl'],
    ['KM-1', 112.5, 'km1-112.5cm.jsonl'],
    ['Lac Épée 3', 1200, 'lacepee3-1200cm.jsonl'],
    ['---', 0, 'core-000cm.jsonl'],
  ])('core %s at %s cm is %s, and the name gives the depth back', (core, depth, name) => {
    expect(levelFileName(core, depth)).toBe(name);
    expect(depthFromFileName(name)).toBe(depth);
  });
});

describe('planned depths', () => {
  it('expands FROM:TO:STEP, TO included when the steps land on it', () => {
    expect(parsePlannedDepths('4:36:8')).toEqual({ ok: true, depths: [4, 12, 20, 28, 36] });
    expect(parsePlannedDepths('0:1:0.1').ok && (parsePlannedDepths('0:1:0.1') as { depths: number[] }).depths).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1]);
  });
  it('reads a list, sorted, each once', () => {
    expect(parsePlannedDepths('20, 4,12.5,4')).toEqual({ ok: true, depths: [4, 12.5, 20] });
  });
  it.each(['4:200', '4:200:0', '200:4:8', 'a,b', '-4', '0:100000:1', ''])('refuses "%s"', (text) => {
    expect(parsePlannedDepths(text).ok).toBe(false);
  });
});

describe('readCoreFolder', () => {
  it('reads core.json and every level, by depth, with the planned depths left', () => {
    const dir = tempDir();
    writeCore(dir);
    coreLevel(dir, 20);
    coreLevel(dir, 10, ['target'], { ...DEFAULT_RULES, targetSum: 300 });
    const core = readCoreFolder(dir);
    expect(core.config).toEqual(TINY_CORE);
    expect(core.levels.map((l) => [l.file, l.depth, l.outside, l.overrides, l.error])).toEqual([
      ['tm1-010cm.jsonl', 10, false, ['target'], null],
      ['tm1-020cm.jsonl', 20, false, [], null],
    ]);
    expect(core.levels[0]?.state?.rules.targetSum).toBe(300);
    expect(core.planned).toEqual([30]);
  });

  it('says a level copied in from elsewhere keeps its own keymap and rules', () => {
    const dir = tempDir();
    writeCore(dir, { keymap: { ...TINY_KEYMAP, name: 'tiny core' } });
    const other = tempDir();
    const { path, writer } = newLevelFile(other, 'copied.jsonl', TINY_KEYMAP, { ...DEFAULT_RULES, targetSum: 200 });
    writer.close();
    copyFileSync(path, join(dir, 'copied.jsonl'));
    const [level] = readCoreFolder(dir).levels;
    expect(level?.outside).toBe(true);
    expect(level?.differences).toEqual(['own keymap "tiny"', 'own rules: pollen sum 200']);
  });

  it('names another core a level comes from', () => {
    const dir = tempDir();
    writeCore(dir, { core: 'TM-2' });
    coreLevel(dir, 10);
    expect(readCoreFolder(dir).levels[0]?.differences).toEqual(['core Test Mere TM-1']);
  });

  it('gives a one-line error for a damaged level and reads the rest', () => {
    const dir = tempDir();
    writeCore(dir);
    coreLevel(dir, 10);
    writeFileSync(join(dir, 'tm1-020cm.jsonl'), 'not a session\n{}\n');
    const core = readCoreFolder(dir);
    expect(core.levels.map((l) => [l.depth, l.state !== null])).toEqual([[10, true], [20, false]]);
    expect(core.levels[1]?.error).toMatch(/^\S*tm1-020cm.jsonl: line 1/);
    expect(core.levels[1]?.error?.split('\n')).toHaveLength(1);
  });

  it('leaves out backups, locks and other files', () => {
    const dir = tempDir();
    writeCore(dir);
    const path = coreLevel(dir, 10);
    writeFileSync(`${path}.lock`, '{}');
    writeFileSync(`${path}.cut-2026.bak`, 'x');
    writeFileSync(join(dir, 'notes.txt'), 'x');
    expect(readCoreFolder(dir).levels.map((l) => l.file)).toEqual(['tm1-010cm.jsonl']);
  });

  it('reads again only the files that changed, and everything when core.json changed', () => {
    const dir = tempDir();
    writeCore(dir);
    const a = coreLevel(dir, 10);
    coreLevel(dir, 20);
    const first = readCoreFolder(dir);
    appendFileSync(a, '');
    utimesSync(a, new Date(), new Date(Date.now() + 5000));
    const second = readCoreFolder(dir, first);
    expect(second.levels[0]).not.toBe(first.levels[0]);
    expect(second.levels[1]).toBe(first.levels[1]);
    writeCore(dir, { depths: [10, 20, 40] });
    const third = readCoreFolder(dir, second);
    expect(third.levels[1]).not.toBe(second.levels[1]);
    expect(third.planned).toEqual([40]);
  });

  it('refuses a folder with no core.json, and a bad core.json, in one line', () => {
    const dir = tempDir();
    expect(() => readCoreFolder(dir)).toThrow(/is not a core folder: it has no core.json \(exine core init/);
    writeFileSync(join(dir, 'core.json'), '{"site": "x"}');
    expect(() => readCoreFolder(dir)).toThrow(/core.json: line 1: "core" is missing/);
  });
});
