import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { NO_RULES } from '../../src/rules/rule-set.js';
import { GIRDLED } from '../helpers/reference-data.js';
import { grainsFor, keymapOf, openPayload, sessionText } from '../helpers/levels.js';
import { runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

function levelFile(text: string) {
  const dir = tempDir();
  writeFileSync(join(dir, 'level.jsonl'), text);
  return dir;
}

describe('exine summary --json on data laid out as the published examples', () => {
  // The Girdled stand of the iNEXT spider data as one level: 26 types of the pollen sum.
  const girdled = () =>
    levelFile(sessionText([openPayload(keymapOf(26), { rules: { ...NO_RULES, coverage: 0.95, targetSum: 200, mode: 'any' } }), ...grainsFor(GIRDLED)]));

  it('rarefaction, coverage and Chao1 agree with vegan and iNEXT on the spider data, stand Girdled', async () => {
    const run = await runExine(['summary', 'level.jsonl', '--json', '--rarefy', '10', '--rarefy', '50', '--rarefy', '100'], girdled());
    expect(run.code).toBe(0);
    const s = JSON.parse(run.stdout);
    expect([s.pollenSum, s.types]).toEqual([168, 26]);
    // vegan 2.6-4 rarefy(..., se = TRUE); iNEXT agrees. [ref]
    const expected = [
      [10, 6.478617, 1.218025],
      [50, 15.030098, 1.842237],
      [100, 20.459426, 1.771384],
    ];
    s.rarefaction.forEach((r: { n: number; expected: number; se: number }, i: number) => {
      expect(r.n).toBe(expected[i]![0]);
      expect(r.expected).toBeCloseTo(expected[i]![1]!, 6);
      expect(r.se).toBeCloseTo(expected[i]![2]!, 6);
    });
    // iNEXT DataInfo (SC) and ChaoRichness on Girdled. [ref]
    expect(s.coverage).toBeCloseTo(0.9289, 4);
    expect(s.goodTuring).toBeCloseTo(0.928571, 6);
    expect(s.chao1.estimate).toBeCloseTo(43.893, 3);
    expect(s.chao1.se).toBeCloseTo(14.306, 3);
    expect(s.chao1.variant).toMatch(/iNEXT/);
    expect(s.concentration).toBeNull();
  });

  it('reports each rule with value, target, met and grains needed, and the set', async () => {
    const s = JSON.parse((await runExine(['summary', 'level.jsonl', '--json'], girdled())).stdout);
    expect(s.rules.map((r: { rule: string }) => r.rule)).toEqual(['target', 'coverage']);
    expect(s.rules[0]).toMatchObject({ met: false, value: 168, target: 200, grainsNeeded: 32 });
    expect(s.rules[1]).toMatchObject({ met: false, target: 0.95 });
    expect(s.rules[1].value).toBeCloseTo(0.9289, 4);
    expect(s.rules[1].grainsNeeded).toBeGreaterThan(0);
    expect(s.met).toBe(false);
    expect(s.ruleMode).toBe('any');
    const t01 = s.taxa.find((t: { taxon: string }) => t.taxon === 'T01');
    expect(t01).toMatchObject({ count: 46, group: 'trees' });
    expect(t01.percent).toBeCloseTo((100 * 46) / 168, 10);
    expect(t01.exactLow).toBeLessThan(t01.percent);
    expect(t01.exactHigh).toBeGreaterThan(t01.percent);
    // All 26 types held to 95% together: for a minor type far wider than its single interval.
    const t06 = s.taxa.find((t: { taxon: string }) => t.taxon === 'T06');
    expect(t06.count).toBe(9);
    expect(t06.simultaneousHigh - t06.simultaneousLow).toBeGreaterThan(1.5 * (t06.ciHigh - t06.ciLow));
  });

  it('a rarefaction size above the sum gives null, not a made-up number', async () => {
    const s = JSON.parse((await runExine(['summary', 'level.jsonl', '--json', '--rarefy', '500'], girdled())).stdout);
    expect(s.rarefaction).toEqual([{ n: 500, expected: null, se: null }]);
  });

  // FIELD section 5 worked example [computed from Stockmarr 1971 / Maher 1981 / Regal & Cushing 1979]:
  // p 400, m 80, two tablets of 20,000 ± 800, 1 cm³, 0.1 cm/yr.
  const spiked = () =>
    levelFile(
      sessionText([
        openPayload(keymapOf(4), { spike: { tablets: 2, perTablet: 20000, perTabletSd: 800, volume: 1, mass: null, accumulationRate: 0.1 } }),
        ...grainsFor([100, 100, 100, 100], 80),
      ]),
    );

  it('concentration, its error, exact interval and influx match the marker worked example', async () => {
    const s = JSON.parse((await runExine(['summary', 'level.jsonl', '--json'], spiked())).stdout);
    expect(s.markers).toBe(80);
    expect(s.concentration.value).toBe(200000);
    expect(s.concentration.unit).toBe('grains/cm3');
    expect(s.concentration.relativeError).toBeCloseTo(0.1257, 4);
    expect(s.concentration.low).toBeCloseTo(156968, -1);
    expect(s.concentration.high).toBeCloseTo(257564, -1);
    expect(s.concentration.influx).toBe(20000);
  });

  it('the text summary says the same in words', async () => {
    const run = await runExine(['summary', 'level.jsonl'], spiked());
    expect(run.stdout).toMatch(/concentration 200000 grains\/cm³ \(±12\.6%, 95% 156968–257564\) from 80 markers · influx 20000 grains\/cm²\/yr/);
    expect(run.stdout).toMatch(/stop rules: pollen sum 500 — not met \(about 100 more grains\)/);
  });

  it('the long export carries exact limits and, with spike data, each taxon’s concentration', async () => {
    const run = await runExine(['export', 'level.jsonl'], spiked());
    const rows = parse(run.stdout, { columns: true }) as Record<string, string>[];
    const t01 = rows.find((r) => r.taxon === 'T01')!;
    // 100 of the 400-grain sum with 80 markers: (100/80)·40,000 = 50,000 per cm³.
    expect(Number(t01.concentration)).toBe(50000);
    expect(t01.conc_unit).toBe('grains/cm3');
    expect(Number(t01.influx)).toBe(5000);
    expect(Number(t01.exact_low)).toBeLessThan(Number(t01.percent));
    expect(Number(t01.exact_high)).toBeGreaterThan(Number(t01.percent));
    expect(Number(t01.markers)).toBe(80);
    const marker = rows.find((r) => r.taxon === 'Marker')!;
    expect(marker.concentration).toBe('');
    // Without spike data the same columns are there, empty.
    const plain = parse((await runExine(['export', 'level.jsonl'], levelFile(sessionText([openPayload(keymapOf(2)), ...grainsFor([3, 4])])))).stdout, { columns: true }) as Record<string, string>[];
    expect(plain[0]).toHaveProperty('concentration', '');
    expect(Object.keys(plain[0]!)).toEqual(Object.keys(t01));
  });

  it('a file written in format 1 (target alone, no spike field) reads as format 2', async () => {
    const open = { ...openPayload(keymapOf(2)), format: 1, rules: { targetSum: 300 } } as Record<string, unknown>;
    delete open.spike;
    const dir = levelFile(sessionText([open as never, ...grainsFor([3, 4])]));
    const s = JSON.parse((await runExine(['summary', 'level.jsonl', '--json'], dir)).stdout);
    expect(s.ruleSet).toBe('pollen sum 300');
    expect(s.rules).toEqual([{ rule: 'target', label: 'pollen sum', value: 7, target: 300, met: false, grainsNeeded: 293, note: null }]);
    expect(s.spike).toBeNull();
    expect((await runExine(['verify', 'level.jsonl'], dir)).code).toBe(0);
  });

  it('a note that looks like a spreadsheet formula is exported as text, not run', async () => {
    const dir = levelFile(sessionText([openPayload(keymapOf(2)), ...grainsFor([3]), { type: 'note', text: '=HYPERLINK("http://x","y")', grain: 2, stage: null }]));
    const rows = parse((await runExine(['export', 'level.jsonl', '--format', 'notes'], dir)).stdout, { columns: true }) as Record<string, string>[];
    expect(rows[0]!.text).toBe(`'=HYPERLINK("http://x","y")`);
    expect(rows[0]).toMatchObject({ taxon: 'T01', grain_seq: '2', stage_x: '' });
  });
});
