import { describe, expect, it } from 'vitest';
import { coreModel } from '../../src/core/core-model.js';
import { readCoreFolder } from '../../src/core/read-core.js';
import { columnsFor, shortTime, stripBar, stripScale, tableWidth } from '../../src/screens/core-lines.js';
import { coreScreenView, START_CORE_UI } from '../../src/screens/core-view.js';
import { textOf } from '../../src/screens/styled-line.js';
import { localDateTime, showTimesIn } from '../../src/text/local-time.js';
import { writeCore } from '../helpers/core-json.js';
import { writeCoreLevel } from '../helpers/core-levels.js';
import { tempDir } from '../helpers/temp-dir.js';

describe('the core view, as values', () => {
  it('draws a percentage in eighths of a cell, a trace as a dot, nothing as blank', () => {
    expect(stripBar(50, 100, 8)).toBe('████    ');
    expect(stripBar(100 / 64, 100, 8)).toBe('▏       ');
    expect(stripBar(0.1, 100, 8)).toBe('·       ');
    expect(stripBar(0, 100, 8)).toBe('        ');
    expect(stripBar(null, 100, 8)).toBe('        ');
    expect(stripBar(120, 100, 8)).toBe('████████');
  });

  it('scales a strip to its maximum, in steps of 5 up to 20% and of 10 above', () => {
    const strip = (max: number) => ({ name: 'x', group: false, values: [], max, mean: 0 });
    expect([0, 3, 17, 21, 38, 99].map((m) => stripScale(strip(m)))).toEqual([5, 5, 20, 30, 40, 100]);
  });

  it('keeps the columns that matter at 80 and shows all at 140', () => {
    expect(tableWidth(columnsFor(80, 18)) + 18).toBeLessThanOrEqual(80);
    expect(columnsFor(80, 18).map((c) => c.name)).toEqual(['depth', 'status', 'sum/target', 'need', 'sq.ch', 'time', 'integrity']);
    expect(columnsFor(140, 18).map((c) => c.name)).toContain('analyst');
    expect([shortTime(45 * 60_000), shortTime(185 * 60_000)]).toEqual(['45m', '3h05']);
  });

  it('fills the height exactly and scrolls to keep the selection in view', () => {
    const dir = tempDir();
    const config = writeCore(dir, { depths: Array.from({ length: 60 }, (_, i) => i * 2) });
    writeCoreLevel(dir, 2, { Alnus: 120, Betula: 30 }, { config });
    const model = coreModel(readCoreFolder(dir));
    for (const [columns, rows] of [
      [80, 24],
      [140, 45],
    ] as const) {
      const view = coreScreenView(model, { ...START_CORE_UI, selected: 50 }, { columns, rows });
      expect(view.heading.length + view.body.height + view.footer.length).toBe(rows);
      expect(view.body.lines).toHaveLength(view.body.height);
      const shown = view.body.lines.map(textOf);
      expect(shown.find((l) => l.startsWith('▶'))).toMatch(/100cm\s+planned/);
      for (const l of shown) expect([...l].length).toBeLessThanOrEqual(columns);
    }
  });

  it('never cuts a message mid-sentence at 80 columns: the footer wraps at word breaks (a rule of the counting screen too)', () => {
    const dir = tempDir();
    const config = writeCore(dir, { depths: [2, 4, 6] });
    writeCoreLevel(dir, 2, { Alnus: 12, Betula: 3 }, { config });
    const model = coreModel(readCoreFolder(dir));
    const view = coreScreenView(model, { ...START_CORE_UI, selected: 0 }, { columns: 80, rows: 24 });
    const footer = view.footer.map(textOf);
    expect(view.heading.length + view.body.height + view.footer.length).toBe(24);
    for (const l of footer) {
      expect([...l].length).toBeLessThanOrEqual(80);
      expect(l.endsWith('…')).toBe(false);
    }
    // The advice (too few levels to compare) reads whole, over more than one line.
    expect(footer.join(' ')).toMatch(/needed to compare/);
  });

  it('shows the last count in local time with its zone (the files keep UTC)', () => {
    const dir = tempDir();
    const config = writeCore(dir, { depths: [2] });
    writeCoreLevel(dir, 2, { Alnus: 12, Betula: 3 }, { config });
    const model = coreModel(readCoreFolder(dir));
    const lastAt = model.rows[0]?.lastAt as string;
    showTimesIn('Asia/Tokyo');
    try {
      const footer = coreScreenView(model, { ...START_CORE_UI, selected: 0 }, { columns: 140, rows: 45 }).footer.map(textOf).join(' ');
      expect(footer).toContain(`last ${localDateTime(lastAt, 'Asia/Tokyo')}`);
      expect(localDateTime(lastAt, 'Asia/Tokyo').slice(0, 16)).not.toBe(lastAt.slice(0, 16).replace('T', ' '));
    } finally {
      showTimesIn(undefined);
    }
  });

  it('says how to give the sample volume of a level made without one in a core with a marker batch', () => {
    const dir = tempDir();
    const config = writeCore(dir, { depths: [2] });
    expect(config.markerBatch).not.toBeNull();
    writeCoreLevel(dir, 2, { Alnus: 12, Betula: 3 }, { config });
    const model = coreModel(readCoreFolder(dir));
    const row = model.rows[0];
    const footer = coreScreenView(model, { ...START_CORE_UI, selected: 0 }, { columns: 140, rows: 45 }).footer.map(textOf).join(' ');
    expect(row?.concentration).toBeNull();
    expect(footer).toContain('no sample volume yet (exine count --volume or --mass adds it)');
  });
});
