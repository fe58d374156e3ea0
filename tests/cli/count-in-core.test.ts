import { copyFileSync, existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openForCounting } from '../../src/cli/commands/count.js';
import { readCoreFolder } from '../../src/core/read-core.js';
import { writeCore } from '../helpers/core-json.js';
import { newLevelFile, TINY_KEYMAP } from '../helpers/levels.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const open = (dir: string, flags: Record<string, string>) => {
  const opened = openForCounting(dir, flags, () => {}, { analyst: 'A. Counter' }, dir);
  opened.writer.close();
  return opened;
};

describe('exine count DIR --depth D in a core folder', () => {
  it('creates the level named from core and depth, with the core keymap, rules and batch', () => {
    const dir = tempDir();
    writeCore(dir, { rules: { targetSum: 300, precision: null, coverage: null, plateau: null, markers: 50, concError: null, mode: 'all', minSum: null } });
    const { state } = open(dir, { depth: '112', volume: '2' });
    expect(existsSync(join(dir, 'tm1-112cm.jsonl'))).toBe(true);
    expect(state.header).toMatchObject({ level: 'tm1-112cm', depth: 112, site: 'Test Mere', core: 'TM-1', slide: 'A', analyst: 'A. Counter', fromCore: { overrides: [] } });
    expect(state.keymap).toEqual(TINY_KEYMAP);
    expect(state.rules).toMatchObject({ targetSum: 300, markers: 50 });
    expect(state.spike).toEqual({ tablets: 1, perTablet: 18583, perTabletSd: 1708, volume: 2, mass: null, accumulationRate: null });
    const [level] = readCoreFolder(dir).levels;
    expect(level).toMatchObject({ outside: false, differences: [], overrides: [] });
  });

  it('counts markers without spike data when no volume is given', () => {
    const dir = tempDir();
    writeCore(dir);
    expect(open(dir, { depth: '4.5' }).state.spike).toBeNull();
    expect(readdirSync(dir).sort()).toEqual(['core.json', 'tm1-004.5cm.jsonl']);
  });

  it('records the flags that overrode the core, in the open line', () => {
    const dir = tempDir();
    writeCore(dir);
    const { state } = open(dir, { depth: '20', target: '200', 'per-tablet': '20000', volume: '1' });
    expect(state.rules.targetSum).toBe(200);
    expect(state.spike?.perTablet).toBe(20000);
    expect(state.header.fromCore).toEqual({ overrides: ['target', 'per-tablet'] });
    const [level] = readCoreFolder(dir).levels;
    expect(level).toMatchObject({ outside: false, overrides: ['target', 'per-tablet'] });
  });

  it('resumes the level with what it recorded; a rule flag on resume is a rules event', () => {
    const dir = tempDir();
    writeCore(dir);
    open(dir, { depth: '20' });
    writeCore(dir, { rules: { targetSum: 100, precision: null, coverage: null, plateau: null, markers: null, concError: null, mode: 'all', minSum: null } });
    const resumed = open(dir, { depth: '20' });
    // An edit of core.json is for new levels: this one keeps its rules.
    expect(resumed.state.rules.targetSum).toBe(500);
    const changed = open(dir, { depth: '20', target: '250' });
    expect(changed.state.rules.targetSum).toBe(250);
    expect(changed.notices).toContain('stop rules changed from pollen sum 500 to pollen sum 250');
  });

  it('keeps the own keymap and rules of a level copied in from elsewhere', () => {
    const dir = tempDir();
    writeCore(dir, { core: 'TM-1', keymap: { ...TINY_KEYMAP, name: 'core keymap' } });
    const other = tempDir();
    const made = newLevelFile(other, 'x.jsonl', TINY_KEYMAP, { targetSum: 150, precision: null, coverage: null, plateau: null, markers: null, concError: null, mode: 'all', minSum: null });
    made.writer.close();
    // The copied level records depth 10: it is the level at 10 once named as the core names it.
    copyFileSync(made.path, join(dir, 'tm1-010cm.jsonl'));
    const { state } = open(dir, { depth: '10' });
    expect(state.keymap.name).toBe('tiny');
    expect(state.rules.targetSum).toBe(150);
    expect(readCoreFolder(dir).levels[0]?.differences).toEqual(['own keymap "tiny"', 'own rules: pollen sum 150']);
  });

  it('refuses, in one line and writing nothing: no depth, another site, a bad core.json', async () => {
    const dir = tempDir();
    writeCore(dir);
    const noDepth = await runExine(['count', dir], dir);
    expect(noDepth.code).toBe(2);
    expect(oneLine(noDepth)).toMatch(/is a core folder; give --depth D for the level to count \(planned: 10, 20, 30\)/);
    const site = await runExine(['count', dir, '--depth', '10', '--site', 'Elsewhere'], dir);
    expect(oneLine(site)).toMatch(/this core is site "Test Mere" \(core.json\), not "Elsewhere"; leave out --site/);
    writeCore(dir, { depths: [-1] });
    const bad = await runExine(['count', dir, '--depth', '10'], dir);
    expect(oneLine(bad)).toMatch(/core.json: line \d+: "depths.0" must be at least 0/);
    expect(readdirSync(dir)).toEqual(['core.json']);
  });
});

describe('slides', () => {
  it('records a slide event on resume with another slide; traverse numbers go on', () => {
    const dir = tempDir();
    writeCore(dir);
    const first = openForCounting(dir, { depth: '10' }, () => {}, {}, dir);
    first.writer.append({ type: 'grain', taxon: 'Alnus', traverse: 1, key: 'a' });
    first.writer.append({ type: 'traverse', traverse: 2 });
    first.writer.append({ type: 'grain', taxon: 'Betula', traverse: 2, key: 'b' });
    first.writer.close();
    const second = open(dir, { depth: '10', slide: 'B' });
    expect(second.state.slide).toBe('B');
    expect(second.state.traverse).toBe(3);
    expect(second.state.slides.map((s) => [s.slide, s.traverse])).toEqual([['A', 1], ['B', 3]]);
    expect(second.notices).toContain('counting on slide B from traverse 3 (slide A before)');
    // The same slide again records nothing new.
    const again = open(dir, { depth: '10', slide: 'B' });
    expect(again.state.slides).toHaveLength(2);
  });
});
