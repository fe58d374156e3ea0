import { readFileSync, writeFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { neutraliseText, toCsv } from '../../src/export/csv-text.js';
import { LONG_COLUMNS, longRows, wideTable } from '../../src/export/level-export.js';
import { writeFileAtomic } from '../../src/io/write-atomic.js';
import { foldEvents } from '../../src/model/fold.js';
import type { OpenEvent, SessionEvent, EventPayload } from '../../src/model/events.js';
import { withKey, type Keymap } from '../../src/keymap/keymap.js';
import { TINY_KEYMAP, grain, openPayload } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

function level(depth: number | null, payloads: EventPayload[], keymap: Keymap = TINY_KEYMAP, label = `L${depth}`) {
  const open = { ...openPayload(keymap, { depth, level: label }), seq: 1, at: '2026-11-02T09:00:00.000Z' } as OpenEvent;
  const events = payloads.map((p, i) => ({ ...p, seq: i + 2, at: '2026-11-02T09:00:01.000Z' }) as SessionEvent);
  return { state: foldEvents(open, keymap, events), source: `${label}.jsonl` };
}

const times = (n: number, taxon: string) => Array.from({ length: n }, () => grain(taxon));

describe('CSV text', () => {
  it('quotes per RFC 4180: commas, quotes and line breaks; CRLF line ends', () => {
    const csv = toCsv(['a', 'b'], [['x, y', 'say "hi"'], ['two\nlines', 3]]);
    expect(csv).toBe('a,b\r\n"x, y","say ""hi"""\r\n"two\nlines",3\r\n');
  });

  it('neutralises text cells that a spreadsheet would run as a formula, and leaves numbers alone', () => {
    for (const bad of ['=HYPERLINK("x")', '+1', '-2+3', '@SUM(A1)', '\tx', '\rx']) expect(neutraliseText(bad).startsWith("'")).toBe(true);
    expect(neutraliseText('Quercus')).toBe('Quercus');
    const csv = toCsv(['taxon', 'value'], [['=cmd|calc', -4.5], ['-Pinus', 0]]);
    const rows = parse(csv) as string[][];
    expect(rows[1]).toEqual(["'=cmd|calc", '-4.5']);
    expect(rows[2]).toEqual(["'-Pinus", '0']);
  });
});

describe('long export', () => {
  it('one row per level and taxon with percent of the pollen sum and Wilson limits; spores on sum + spores', () => {
    const l = level(10, [...times(81, 'Alnus'), ...times(182, 'Betula'), ...times(20, 'Sphagnum')]);
    const rows = parse(toCsv(LONG_COLUMNS, longRows([l])), { columns: true }) as Record<string, string>[];
    const alnus = rows.find((r) => r.taxon === 'Alnus')!;
    // 81 of a sum of 263: Newcombe (1998) Wilson interval 0.2553–0.3662. [pub]
    expect(alnus).toMatchObject({ level: 'L10', depth: '10', group: 'trees', in_sum: 'yes', count: '81', basis: '263', pollen_sum: '263' });
    expect(Number(alnus.percent)).toBeCloseTo(30.7985, 3);
    expect(Number(alnus.ci_low)).toBeCloseTo(25.53, 2);
    expect(Number(alnus.ci_high)).toBeCloseTo(36.62, 2);
    const sphagnum = rows.find((r) => r.taxon === 'Sphagnum')!;
    expect(sphagnum).toMatchObject({ in_sum: 'no', basis: '283' });
    expect(Number(sphagnum.percent)).toBeCloseTo((100 * 20) / 283, 3);
    expect(rows.find((r) => r.taxon === 'Corylus')).toMatchObject({ count: '0', percent: '0' });
  });

  it('a taxon named like a formula is neutralised in the file', () => {
    const keymap: Keymap = withKey(TINY_KEYMAP, 'f', { taxon: '=1+1', group: 'herbs' });
    const l = level(5, [grain('=1+1'), grain('Alnus')], keymap);
    const csv = toCsv(LONG_COLUMNS, longRows([l]));
    expect(csv).toMatch(/,'=1\+1,herbs,/);
    expect(csv).not.toMatch(/,=1\+1,/);
  });
});

describe('wide export', () => {
  it('many levels into one matrix: depth order, taxa in a stable order, zeros where absent', () => {
    const deep = level(120, [...times(3, 'Betula'), grain('Sphagnum')]);
    const top = level(20, [...times(2, 'Poaceae'), grain('Alnus')]);
    const mid = level(60, [grain('Corylus'), grain('Lycopodium')]);
    const a = wideTable([deep, top, mid]);
    const b = wideTable([mid, deep, top]);
    expect(a).toEqual(b);
    expect(a.columns).toEqual(['level', 'depth', 'site', 'core', 'slide', 'grains_by_slide', 'pollen_sum', 'grains', 'markers', 'concentration', 'conc_unit', 'influx', 'Alnus', 'Betula', 'Corylus', 'Poaceae', 'Sphagnum', 'Lycopodium']);
    const rows = parse(toCsv(a.columns, a.rows), { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.depth)).toEqual(['20', '60', '120']);
    expect(rows[0]).toMatchObject({ Poaceae: '2', Alnus: '1', Betula: '0', pollen_sum: '3' });
    expect(rows[2]).toMatchObject({ Betula: '3', Sphagnum: '1', pollen_sum: '3', grains: '4', concentration: '' });
  });
});

describe('writing a CSV file', () => {
  it('never overwrites without force, writes atomically, and leaves no temporary file', () => {
    const dir = tempDir();
    const out = join(dir, 'out.csv');
    writeFileSync(out, 'keep me');
    expect(() => writeFileAtomic(out, 'new', false)).toThrow(/already exists; add --force/);
    expect(readFileSync(out, 'utf8')).toBe('keep me');
    writeFileAtomic(out, 'new', true);
    expect(readFileSync(out, 'utf8')).toBe('new');
    writeFileAtomic(join(dir, 'fresh.csv'), 'x', false);
    expect(readdirSync(dir).sort()).toEqual(['fresh.csv', 'out.csv']);
  });
});
