import { copyFileSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { oneLine, runExine, spawnExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const DEMO = join(import.meta.dirname, '../../demo-sessions');

function demoCopy() {
  const dir = tempDir();
  for (const f of readdirSync(DEMO)) copyFileSync(join(DEMO, f), join(dir, f));
  return dir;
}

describe('the read-only commands on the demo core', () => {
  it('verify: every demo level is intact; an edit is caught with its line number', async () => {
    const dir = demoCopy();
    for (const f of readdirSync(dir).filter((name) => name.endsWith('.jsonl'))) {
      const run = await runExine(['verify', f], dir);
      expect(run.code, f).toBe(0);
      expect(run.stdout).toMatch(/intact, \d+ lines, chain verified/);
    }
    const text = readFileSync(join(dir, 'km1-060cm.jsonl'), 'utf8').split('\n');
    text[40] = (text[40] as string).replace(/"traverse":(\d+)/, (_, n) => `"traverse":${Number(n) + 1}`);
    writeFileSync(join(dir, 'km1-060cm.jsonl'), text.join('\n'));
    const run = await runExine(['verify', 'km1-060cm.jsonl'], dir);
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/km1-060cm\.jsonl: line 41 does not match its hash.*\(40 lines before it are intact\)/);
  });

  it('summary --json gives the pollen sum and each taxon with its interval', async () => {
    const run = await runExine(['summary', 'km1-084cm.jsonl', '--json'], demoCopy());
    expect(run.code).toBe(0);
    const s = JSON.parse(run.stdout);
    expect(s.pollenSum).toBeGreaterThan(200);
    expect(s.pollenSum).toBeLessThan(500);
    const corylus = s.taxa.find((t: { taxon: string }) => t.taxon === 'Corylus');
    expect(corylus.percent).toBeCloseTo((100 * corylus.count) / s.pollenSum, 10);
    expect(corylus.ciLow).toBeLessThan(corylus.percent);
  });

  it('summary as text: header, progress, group totals (outside the sum starred) and the taxa', async () => {
    const run = await runExine(['summary', 'km1-084cm.jsonl'], demoCopy());
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/^Kestrel Mere KM-1 · level KM1-84 \(depth 84\)/);
    expect(run.stdout).toMatch(/not finished yet/);
    expect(run.stdout).toMatch(/pollen sum 236 · 267 grains · 15 types in the sum · 6 traverses · 1 sitting\n/);
    expect(run.stdout).toMatch(/groups: trees 143 · shrubs 73 · herbs 20 · spores 11\* · markers 17\* · indeterminable 3\*/);
    expect(run.stdout).toMatch(/stop rules: ±4 points for taxa ≥ 10% and coverage 0\.98 and 40 markers, with a pollen sum of at least 300 — not met/);
    expect(run.stdout).toMatch(/coverage\s+0\.9831 of 0\.9800\s+met/);
    expect(run.stdout).toMatch(/concentration 173529 grains\/cm³ \(±25\.3%, 95% 106090–302942\) from 17 markers/);
    expect(run.stdout).toMatch(/\n4 notes \(exine export --format notes lists them\) · added while counting: Ilex aquifolium\n/);
    expect(run.stdout).toMatch(/Corylus\s+shrubs\s+65\s+27\.5\s+22\.2–33\.6\s+21\.9–33\.7/);
  });

  it('export --format wide: one row per level in depth order, one column per taxon', async () => {
    const dir = demoCopy();
    const run = await runExine(['export', ...readdirSync(dir).filter((f) => f.endsWith('.jsonl')).reverse(), '--format', 'wide'], dir);
    expect(run.code).toBe(0);
    const rows = parse(run.stdout, { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.depth)).toEqual(['12', '36', '48', '60', '84', '108']);
    expect(Number(rows[0]!.pollen_sum)).toBeGreaterThanOrEqual(500);
    const taxa = Object.keys(rows[0]!).slice(12);
    expect(taxa.slice(0, 3)).toEqual(['Quercus', 'Betula', 'Alnus']);
    // The demo's spike data: concentration and influx of the pollen sum for each level.
    expect(rows[0]).toMatchObject({ conc_unit: 'grains/cm3' });
    expect(Number(rows[0]!.concentration)).toBeCloseTo((Number(rows[0]!.pollen_sum) / Number(rows[0]!.markers)) * 12500, 0);
    expect(Number(rows[0]!.influx)).toBeCloseTo(Number(rows[0]!.concentration) * 0.05, 1);
  });

  it('the demo is a core folder: planned depths, a level on two slides, a finished core export refused for the half-counted level', async () => {
    const dir = demoCopy();
    const { readCoreFolder } = await import('../../src/core/read-core.js');
    const core = readCoreFolder(dir);
    expect(core.config).toMatchObject({ site: 'Kestrel Mere', core: 'KM-1' });
    expect(core.planned).toEqual([24, 72, 96]);
    expect(core.levels.map((l) => [l.depth, l.outside, l.state?.slides.length])).toEqual([[12, false, 1], [36, false, 1], [48, false, 1], [60, false, 2], [84, false, 1], [108, false, 1]]);
    expect(core.levels[4]?.overrides).toContain('precision');
    const refused = await runExine(['export', '.'], dir);
    expect(refused.stderr).toMatch(/km1-084cm\.jsonl \(not finished\)/);
    const rows = parse((await runExine(['export', '.', '--include-unfinished', '--values', 'percent'], dir)).stdout, { columns: true }) as Record<string, string>[];
    // 48 cm is the mislabelled slide: pine, birch and steppe herbs where its neighbours are oak forest.
    expect(rows.map((r) => Math.round(Number(r['sum:Mixed oak forest'])))).toEqual([9, 30, 0, 38, 24, 0]);
    expect(rows[3]).toMatchObject({ slides: 'KM1-060-A;KM1-060-B' });
  });

  it('keys draws the layout of a bundled keymap', async () => {
    const run = await runExine(['keys', 'keypad']);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/laid out on the numeric keypad/);
    expect(run.stdout).toMatch(/7 T\s+8 T\s+9 T\s+\+ M/);
    expect(run.stdout).toMatch(/0\s+\.\s*\n\(undo\)\s+\(note\)/);
  });

  it('help for every command, exit 0', async () => {
    for (const c of ['count', 'demo', 'summary', 'export', 'verify', 'keys']) {
      const run = await runExine([c, '--help']);
      expect(run.code, c).toBe(0);
      expect(run.stdout).toMatch(/^Usage/);
    }
    expect((await runExine(['--help'])).stdout).toMatch(/Commands/);
  });
});

describe('the real program, bin/exine.cjs', () => {
  // The other CLI tests call main() in-process: here the launcher and a real process give the same.
  it.each([
    [['keys', 'keypad'], 0],
    // Without a terminal: in-process the test says there is none; here the process finds none.
    [['count', 'new.jsonl'], 1],
    [['count', 'new.jsonl', '--traget', '300'], 2],
  ])('exine %j: exit %i, with the output of main() in-process', async (args, code) => {
    const dir = tempDir();
    const real = spawnExine(args, dir);
    expect(real.code).toBe(code);
    if (code !== 0) expect(oneLine(real)).toMatch(/^exine/);
    expect(await runExine(args, dir)).toEqual(real);
    expect(readdirSync(dir)).toEqual([]);
  });
});
