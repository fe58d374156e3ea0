import { copyFileSync, existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import type { EventPayload } from '../../src/model/events.js';
import type { Keymap } from '../../src/keymap/keymap.js';
import { levelFileName } from '../../src/core/level-name.js';
import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { writeCore } from '../helpers/core-json.js';
import { grain, openPayload, sessionText, TINY_KEYMAP } from '../helpers/levels.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const RULES = { ...DEFAULT_RULES, targetSum: 5 };
const KEYMAP: Keymap = { ...TINY_KEYMAP, keys: { ...TINY_KEYMAP.keys, g: { taxon: 'Gramineae', group: 'herbs' } } };

interface LevelSpec {
  depth: number;
  grains: [string, number][];
  finish?: boolean;
  met?: boolean;
  core?: string;
  session?: string;
  slideB?: [string, number][];
  notes?: boolean;
}

let sessionNo = 0;
/** A level file as exine writes it in a core: open, sitting, grains, the verdict, finish. */
function level(dir: string, spec: LevelSpec): string {
  const events: EventPayload[] = [{ type: 'sitting', sitting: 1 }];
  const add = (list: [string, number][], traverse: number) => {
    for (const [taxon, n] of list) for (let i = 0; i < n; i++) events.push(grain(taxon, traverse, Object.entries(KEYMAP.keys).find(([, b]) => b.taxon === taxon)?.[0]));
  };
  add(spec.grains, 1);
  if (spec.notes) events.push({ type: 'note', text: 'folded', grain: 3, stage: null });
  if (spec.slideB) {
    events.push({ type: 'close' }, { type: 'sitting', sitting: 2 }, { type: 'slide', slide: 'B', traverse: 2 });
    add(spec.slideB, 2);
    if (spec.notes) events.push({ type: 'note', text: 'on B', grain: null, stage: null });
  }
  if (spec.met !== false) events.push({ type: 'rules-met', sum: 5, grains: 5, met: ['target'] });
  if (spec.finish !== false) events.push({ type: 'finish' });
  const open = openPayload(KEYMAP, {
    level: `TM-1 ${spec.depth}`,
    depth: spec.depth,
    slide: 'A',
    core: spec.core ?? 'TM-1',
    rules: RULES,
    session: spec.session ?? `${String(++sessionNo).padStart(8, '0')}aaaaaaaaaaaaaaaaaaaaaaaa`,
    fromCore: { overrides: [] },
  });
  const path = join(dir, levelFileName(spec.core ?? 'TM-1', spec.depth));
  writeFileSync(path, sessionText([open, ...events]));
  return path;
}

function core(levels: LevelSpec[]) {
  const dir = tempDir();
  writeCore(dir, { keymap: KEYMAP, rules: RULES });
  for (const l of levels) level(dir, l);
  return dir;
}

const csv = (text: string) => parse(text, { columns: true }) as Record<string, string>[];

const TWO = (): LevelSpec[] => [
  { depth: 20, grains: [['Alnus', 3], ['Poaceae', 2], ['Sphagnum', 2], ['Lycopodium', 4]] },
  { depth: 10, grains: [['Betula', 4], ['Gramineae', 2], ['Poaceae', 1], ['Corylus', 1]] },
];

describe('exine export DIR: the core matrix', () => {
  it('one row per level in depth order: status, slides, sums, markers without spike data, summary groups, taxa', async () => {
    const dir = core(TWO());
    const run = await runExine(['export', dir], dir);
    expect(run.code).toBe(0);
    const rows = csv(run.stdout);
    expect(Object.keys(rows[0]!)).toEqual([
      'level', 'depth', 'status', 'rules_met', 'slides', 'grains_by_slide', 'analyst', 'pollen_sum', 'grains', 'markers', 'concentration', 'conc_unit', 'influx',
      'sum:Arboreal', 'Alnus', 'Betula', 'Corylus', 'Poaceae', 'Sphagnum', 'Lycopodium', 'source',
    ]);
    expect(rows.map((r) => r.depth)).toEqual(['10', '20']);
    expect(rows[1]).toMatchObject({ status: 'finished', rules_met: 'yes', slides: 'A', pollen_sum: '5', grains: '11', markers: '4', concentration: '', Alnus: '3', Betula: '0', Sphagnum: '2', 'sum:Arboreal': '3', source: 'tm1-020cm.jsonl' });
    // Gramineae is merged into Poaceae (core.json synonyms).
    expect(rows[0]).toMatchObject({ Poaceae: '3', 'sum:Arboreal': '4' });
    expect(run.stderr).toMatch(/^exine: merged Gramineae into Poaceae \(synonym in core\.json\): 2 grains in 1 level\n/);
  });

  it('--values percent gives the percentages summary gives (spores on the sum plus spores)', async () => {
    const dir = core(TWO());
    const rows = csv((await runExine(['export', dir, '--values', 'percent'], dir)).stdout);
    const summary = JSON.parse((await runExine(['summary', join(dir, 'tm1-020cm.jsonl'), '--json'], dir)).stdout) as { taxa: { taxon: string; percent: number | null }[] };
    // Gramineae has no grain at 20 cm and is merged into Poaceae: every other taxon is as summary has it.
    for (const t of summary.taxa.filter((x) => x.taxon !== 'Gramineae')) expect(Number(rows[1]![t.taxon]), t.taxon).toBeCloseTo(t.percent as number, 4);
    expect(Number(rows[1]!.Sphagnum)).toBeCloseTo((100 * 2) / 7, 4);
    expect(Number(rows[1]!['sum:Arboreal'])).toBeCloseTo(60, 4);
  });

  it('writes the taxa, their groups and the synonyms merged beside the matrix', async () => {
    const dir = core(TWO());
    const run = await runExine(['export', dir, '--out', 'core.csv'], dir);
    expect(run.code).toBe(0);
    const taxa = csv(readFileSync(join(dir, 'core.taxa.csv'), 'utf8'));
    expect(taxa.find((t) => t.taxon === 'Poaceae')).toEqual({ taxon: 'Poaceae', group: 'herbs', in_sum: 'yes', merged_from: 'Gramineae', levels: '2', grains: '5' });
    expect(taxa.find((t) => t.taxon === 'Sphagnum')).toMatchObject({ group: 'spores', in_sum: 'no' });
    expect(taxa.find((t) => t.taxon === 'Gramineae')).toBeUndefined();
    expect(csv((await runExine(['export', dir, '--format', 'taxa'], dir)).stdout)).toEqual(taxa);
    // Neither file is replaced without --force.
    const again = await runExine(['export', dir, '--out', 'core.csv'], dir);
    expect(oneLine(again)).toMatch(/core\.csv already exists; add --force/);
    writeFileSync(join(dir, 'other.taxa.csv'), 'keep');
    expect(oneLine(await runExine(['export', dir, '--out', 'other.csv'], dir))).toMatch(/other\.taxa\.csv already exists; add --force/);
    expect(existsSync(join(dir, 'other.csv'))).toBe(false);
  });

  it('knows each slide: the matrix, the long rows and the notes', async () => {
    const dir = core([{ depth: 10, grains: [['Alnus', 3], ['Betula', 1]], slideB: [['Alnus', 2], ['Corylus', 1]], notes: true }]);
    const wide = csv((await runExine(['export', dir], dir)).stdout);
    expect(wide[0]).toMatchObject({ slides: 'A;B', grains_by_slide: 'A=4;B=3', Alnus: '5' });
    const long = csv((await runExine(['export', dir, '--format', 'long'], dir)).stdout);
    expect(long.find((r) => r.taxon === 'Alnus')).toMatchObject({ slide: 'A;B', count: '5', count_by_slide: 'A=3;B=2' });
    const notes = csv((await runExine(['export', dir, '--format', 'notes'], dir)).stdout);
    expect(notes.map((n) => [n.slide, n.text])).toEqual([['A', 'folded'], ['B', 'on B']]);
  });
});

describe('the guards of a core export', () => {
  const refused = async (dir: string, args: string[] = []) => {
    const run = await runExine(['export', dir, '--out', 'x.csv', ...args], dir);
    expect(run.code).toBe(1);
    expect(existsSync(join(dir, 'x.csv'))).toBe(false);
    return oneLine(run);
  };

  it('refuses a level not finished, or finished without meeting its rules, unless --include-unfinished', async () => {
    const dir = core([...TWO(), { depth: 30, grains: [['Alnus', 2]], finish: false, met: false }, { depth: 40, grains: [['Alnus', 2]], met: false }]);
    expect(await refused(dir)).toBe(
      'exine export: tm1-030cm.jsonl (not finished) and tm1-040cm.jsonl (rules not met): only finished levels that met their stop rules go into a core export; finish them, or add --include-unfinished',
    );
    const run = await runExine(['export', dir, '--include-unfinished'], dir);
    expect(csv(run.stdout).map((r) => r.status)).toEqual(['finished', 'finished', 'in progress', 'finished']);
  });

  it('refuses a level of another core, unless --mixed-cores', async () => {
    const dir = core(TWO());
    level(dir, { depth: 30, grains: [['Alnus', 5]], core: 'TM-9' });
    expect(await refused(dir)).toMatch(/^exine export: tm9-030cm\.jsonl \(Test Mere TM-9\) is not of core Test Mere TM-1; export one core at a time, or add --mixed-cores$/);
    expect(csv((await runExine(['export', dir, '--mixed-cores'], dir)).stdout)).toHaveLength(3);
  });

  it('refuses the same session twice, whatever the flags', async () => {
    const dir = core(TWO());
    copyFileSync(join(dir, 'tm1-010cm.jsonl'), join(dir, 'copy-of-10.jsonl'));
    expect(await refused(dir, ['--include-unfinished', '--mixed-cores'])).toMatch(/^exine export: copy-of-10\.jsonl and tm1-010cm\.jsonl are the same session \(one file copied\?\); its grains would count twice/);
  });

  it('refuses a damaged level, naming it', async () => {
    const dir = core(TWO());
    writeFileSync(join(dir, 'tm1-030cm.jsonl'), 'garbage\n');
    expect(await refused(dir)).toMatch(/^exine export: tm1-030cm\.jsonl cannot be read \(.*line 1.*\); exine verify shows why, and nothing was exported$/);
  });

  it('refuses files of two cores named one by one, and the same file twice', async () => {
    const dir = core(TWO());
    level(dir, { depth: 30, grains: [['Alnus', 5]], core: 'TM-9' });
    const two = await runExine(['export', 'tm1-010cm.jsonl', 'tm9-030cm.jsonl'], dir);
    expect(oneLine(two)).toMatch(/tm9-030cm\.jsonl \(Test Mere TM-9\) is not of core Test Mere TM-1; export one core at a time, or add --mixed-cores/);
    expect((await runExine(['export', 'tm1-010cm.jsonl', 'tm9-030cm.jsonl', '--mixed-cores'], dir)).code).toBe(0);
    expect(oneLine(await runExine(['export', 'tm1-010cm.jsonl', 'tm1-010cm.jsonl'], dir))).toMatch(/tm1-010cm\.jsonl and tm1-010cm\.jsonl are the same session/);
    expect(readdirSync(dir).filter((f) => f.endsWith('.csv'))).toEqual([]);
  });
});
