import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeCore } from '../helpers/core-json.js';
import { writeCoreLevel } from '../helpers/core-levels.js';
import { runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const RULES = { targetSum: 100, precision: null, coverage: null, plateau: null, markers: null, concError: null, mode: 'all' as const, minSum: null };

/** Six levels of a steady assemblage, one (30 cm) from another slide, planned depths between. */
function oddCore() {
  const dir = tempDir();
  const config = writeCore(dir, { depths: [10, 20, 25, 30, 35, 40, 50, 55, 60], rules: RULES });
  const steady = (i: number) => ({ Alnus: 50 + i, Betula: 30, Corylus: 20 - i });
  for (const [d, i] of [[10, 0], [20, 1], [40, 2], [50, 3], [60, 8]] as const) writeCoreLevel(dir, d, steady(i), { config, analyst: 'A. Tester', finish: true });
  writeCoreLevel(dir, 30, { Poaceae: 70, Alnus: 30 }, { config });
  return dir;
}

describe('exine core DIR --plain and --json', () => {
  it('prints every level, the flag and the suggestion as text', async () => {
    const dir = oddCore();
    const run = await runExine(['core', dir, '--plain']);
    expect(run).toMatchObject({ code: 0, stderr: '' });
    const out = run.stdout;
    expect(out).toMatch(/^Test Mere · core TM-1 · 9 levels: 5 finished, 1 rules met, 3 planned\n/);
    expect(out).toMatch(/depth\s+status\s+sum\/target\s+need\s+sq\.ch\s+mark\s+conc\s+sit\s+time\s+analyst\s+last\s+integrity/);
    expect(out).toMatch(/ {3}30cm\?\s+rules met\s+100\/100\s+0\s+\d\.\d\d/);
    expect(out).toMatch(/ {3}55cm◂\s+planned\s+–\/100/);
    expect(out).toMatch(/\nnext: 55 cm, planned between 50 cm and 60 cm, the most dissimilar neighbours \(squared chord \d\.\d\d; pairs with 30 cm set aside\)\n/);
    expect(out).toMatch(/\nworth a second look: 30 cm is unlike both neighbours/);
    expect(out).toMatch(/neighbour distances: 5, median \d\.\d\d; a level is flagged when both its distances exceed/);
    expect(out).toMatch(/Strips: % of the pollen sum/);
    expect(out).toMatch(/A\. Tester/);
  });

  it('gives the same as JSON, with every strip', async () => {
    const dir = oddCore();
    const run = await runExine(['core', dir, '--json']);
    expect(run.code).toBe(0);
    const j = JSON.parse(run.stdout);
    expect(j.levels.map((l: { depth: number; status: string }) => `${l.depth} ${l.status}`)).toEqual(['10 finished', '20 finished', '25 planned', '30 rules met', '35 planned', '40 finished', '50 finished', '55 planned', '60 finished']);
    expect(j.odd.map((o: { depth: number }) => o.depth)).toEqual([30]);
    expect(j.levels.find((l: { depth: number }) => l.depth === 30).odd).toBe(true);
    expect(j.suggestion).toMatchObject({ kind: 'planned', depth: 55, between: { upper: 50, lower: 60 } });
    expect(j.distances).toHaveLength(5);
    expect(j.strips[0]).toMatchObject({ name: 'Arboreal', group: true });
    // Arboreal (Alnus + Betula) at 10 cm: 80 of 100.
    expect(j.strips[0].percent[0]).toBeCloseTo(80, 10);
    expect(j.strips.map((s: { name: string }) => s.name)).toEqual(['Arboreal', 'Alnus', 'Betula', 'Corylus', 'Poaceae']);
  });

  it('refuses what is not a core folder in one line, and two output flags', async () => {
    const dir = tempDir();
    const run = await runExine(['core', dir, '--plain']);
    expect(run.code).toBe(1);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/is not a core folder: it has no core\.json/);
    writeFileSync(join(dir, 'core.json'), '{}');
    expect((await runExine(['core', dir, '--plain', '--json'])).code).toBe(2);
    expect((await runExine(['core', dir])).stderr).toMatch(/core\.json: line 1: "site" is missing/);
  });

  it('needs a terminal for the screen', async () => {
    const dir = oddCore();
    const run = await runExine(['core', dir]);
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/exine core: needs an interactive terminal/);
  });
});
