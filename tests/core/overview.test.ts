import { appendFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { coreModel } from '../../src/core/core-model.js';
import { readCoreFolder } from '../../src/core/read-core.js';
import { writeCore } from '../helpers/core-json.js';
import { writeCoreLevel } from '../helpers/core-levels.js';
import { TINY_KEYMAP, openPayload, sessionText, grain } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

const read = (dir: string) => coreModel(readCoreFolder(dir));

describe('the core overview', () => {
  it('has a row per level and per planned depth, in depth order, with the status of each kind', () => {
    const dir = tempDir();
    const config = writeCore(dir, { depths: [10, 20, 30, 40], rules: { ...noRules(), targetSum: 100 } });
    writeCoreLevel(dir, 20, { Alnus: 60, Betula: 50 }, { analyst: 'A. Tester', config }); // sum 110 ≥ 100: rules met
    writeCoreLevel(dir, 30, { Alnus: 30, Corylus: 20 }, { close: false, config }); // sum 50: in progress, last sitting open
    writeCoreLevel(dir, 5, { Alnus: 100, Poaceae: 20 }, { finish: true, config }); // not planned, finished
    writeFileSync(join(dir, 'tm1-040cm.jsonl'), 'not a session\n');
    const m = read(dir);
    expect(m.rows.map((r) => [r.depth, r.status])).toEqual([
      [5, 'finished'],
      [10, 'planned'],
      [20, 'rules met'],
      [30, 'in progress'],
      [40, 'unreadable'],
    ]);
    const [five, ten, twenty, thirty, forty] = m.rows;
    expect(twenty).toMatchObject({ pollenSum: 110, targetSum: 100, grainsNeeded: 0, analyst: 'A. Tester', sittings: 1, integrity: { kind: 'intact', closed: true }, outside: [] });
    // sessionText stamps one line a second: 110 grains and the close after the sitting line.
    expect(twenty?.countingMs).toBe(111_000);
    expect(thirty).toMatchObject({ pollenSum: 50, grainsNeeded: 50, integrity: { kind: 'intact', closed: false } });
    expect(ten).toMatchObject({ file: null, pollenSum: 0, targetSum: 100, integrity: null });
    expect(forty?.integrity?.kind).toBe('damaged');
    expect(five?.shares).toEqual({ Alnus: 100 / 120, Poaceae: 20 / 120 });
  });

  it('merges synonyms before comparing and drawing, and names a level from elsewhere', () => {
    const dir = tempDir();
    writeCore(dir, { depths: [] });
    // Counted under an old name: the keymap has Gramineae, the core merges it into Poaceae.
    const old = { ...TINY_KEYMAP, keys: { ...TINY_KEYMAP.keys, g: { taxon: 'Gramineae', group: 'herbs' as const } } };
    const grains = [...Array(60).fill(grain('Alnus')), ...Array(60).fill(grain('Gramineae', 1, 'g'))];
    writeFileSync(join(dir, 'copied.jsonl'), sessionText([openPayload(old, { depth: 12, site: 'Other Mere', core: 'OM-2' }), ...grains]));
    writeCoreLevel(dir, 24, { Alnus: 60, Poaceae: 60 });
    const m = read(dir);
    expect(m.rows[0]?.shares).toEqual({ Alnus: 0.5, Poaceae: 0.5 });
    expect(m.rows[0]?.outside.join(', ')).toMatch(/core Other Mere OM-2/);
    expect(m.next.distances).toEqual([{ upper: 12, lower: 24, distance: 0 }]);
  });

  it('calls a torn last line torn, as verify would fail it and count repair it', () => {
    const dir = tempDir();
    writeCore(dir, { depths: [] });
    const path = writeCoreLevel(dir, 10, { Alnus: 3 });
    appendFileSync(path, '{"seq":7,"at":"2026-');
    expect(read(dir).rows[0]?.integrity?.kind).toBe('torn');
  });

  it('keeps the row of a level whose file did not change, and reads the one that did', () => {
    const dir = tempDir();
    writeCore(dir, { depths: [] });
    writeCoreLevel(dir, 10, { Alnus: 3 });
    writeCoreLevel(dir, 20, { Betula: 3 });
    const cache = new WeakMap();
    const first = readCoreFolder(dir);
    const a = coreModel(first, cache);
    writeCoreLevel(dir, 20, { Betula: 4 });
    const b = coreModel(readCoreFolder(dir, first), cache);
    expect(b.rows[0]).toBe(a.rows[0]);
    expect(b.rows[1]?.pollenSum).toBe(4);
  });
});

function noRules() {
  return { targetSum: null, precision: null, coverage: null, plateau: null, markers: null, concError: null, mode: 'all' as const, minSum: null };
}
