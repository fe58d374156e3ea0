import { render } from 'ink-testing-library';
import { describe, expect, it } from 'vitest';
import { openForCounting } from '../../src/cli/commands/count.js';
import { fileCoreSource } from '../../src/core/core-source.js';
import type { OverviewRow } from '../../src/core/overview.js';
import { readLevel } from '../../src/session/session-files.js';
import { CoreScreen } from '../../src/screens/core-screen.js';
import { writeCore } from '../helpers/core-json.js';
import { writeCoreLevel } from '../helpers/core-levels.js';
import { driveScreen } from '../helpers/ink-screen.js';
import { tempDir } from '../helpers/temp-dir.js';

const RULES = { targetSum: 100, precision: null, coverage: null, plateau: null, markers: null, concError: null, mode: 'all' as const, minSum: null };

/** A core of each status: 10 finished, 20 rules met, 30 in progress, 40 planned; 50 cannot be read. */
function core() {
  const dir = tempDir();
  const config = writeCore(dir, { depths: [10, 20, 30, 40], rules: RULES });
  writeCoreLevel(dir, 10, { Alnus: 70, Betula: 40 }, { config, finish: true });
  writeCoreLevel(dir, 20, { Alnus: 60, Betula: 45 }, { config });
  writeCoreLevel(dir, 30, { Alnus: 20, Corylus: 10 }, { config, close: false });
  return { dir, config };
}

async function screen(dir: string, columns: number, rows: number) {
  const openLevel = (row: OverviewRow) => (row.path ? openForCounting(row.path, {}) : openForCounting(dir, { depth: String(row.depth) }));
  return driveScreen(render(<CoreScreen source={fileCoreSource(dir)} openLevel={openLevel} columns={columns} rows={rows} pollMs={20} count={{ bell: false }} />));
}

/** Every line of the frame fits the width, and the frame the height. */
function fits(frame: string, columns: number, rows: number) {
  const lines = frame.split('\n');
  expect(lines.length).toBeLessThanOrEqual(rows);
  for (const l of lines) expect([...l].length, l).toBeLessThanOrEqual(columns);
}

describe('the core screen', () => {
  it.each([
    [80, 24],
    [140, 45],
  ])('shows every status at %sx%s and fits', async (columns, rows) => {
    const { dir } = core();
    const s = await screen(dir, columns, rows);
    const frame = await s.shows(/40cm\s+planned/);
    for (const part of [/10cm\s+finished\s+110\/100/, /20cm\s+rules met\s+105\/100\s+0/, /30cm\s+in progress\s+30\/100\s+\+70/, /40cm\s+planned\s+–\/100/, /Test Mere · core TM-1 · 4 levels: 1 finished, 1 rules met, 1 in progress, 1 pla/, /↑↓ select · Enter count this level · q quit/]) {
      expect(frame).toMatch(part);
    }
    // The strips: the commonest taxa, and the core's summary group first.
    expect(frame).toMatch(/Arboreal/);
    expect(frame).toMatch(/Alnus/);
    if (columns >= 140) expect(frame).toMatch(/analyst/);
    fits(frame, columns, rows);
  });

  it('opens a planned level with Enter, counts in it, and comes back to the core on quit', async () => {
    const { dir } = core();
    const s = await screen(dir, 80, 24);
    await s.shows(/40cm\s+planned/);
    s.type('\x1b[B\x1b[B\x1b[B');
    await s.shows(/40cm planned · no file yet · Enter creates tm1-040cm\.jsonl/);
    // Enter and the first grains in one chunk, as a fast typist's terminal sends them.
    s.type('\raa');
    await s.shows(/Pollen sum 2 \/ 100/);
    s.type('b');
    await s.shows(/Pollen sum 3 \/ 100/);
    s.type('\x03');
    const back = await s.shows(/saved tm1-040cm\.jsonl: 3 grains, pollen sum 3/);
    expect(back).toMatch(/40cm\s+in progress\s+3\/100/);
    fits(back, 80, 24);
    const { state } = readLevel(`${dir}/tm1-040cm.jsonl`);
    expect(state.counts).toEqual({ Alnus: 2, Betula: 1 });
    expect(state.header.fromCore).toEqual({ overrides: [] });
    // And the view goes on: q quits.
    s.type('q');
  });

  it('puts a level unlike both its neighbours first on the advice line', async () => {
    const dir = tempDir();
    const config = writeCore(dir, { depths: [10, 20, 30, 40, 50, 55, 60], rules: RULES });
    const steady = (i: number) => ({ Alnus: 50 + i, Betula: 30, Corylus: 20 - i });
    for (const [d, i] of [[10, 0], [20, 1], [40, 2], [50, 3], [60, 8]] as const) writeCoreLevel(dir, d, steady(i), { config, finish: true });
    writeCoreLevel(dir, 30, { Poaceae: 70, Alnus: 30 }, { config });
    const s = await screen(dir, 80, 24);
    const frame = await s.shows(/\? 30 cm is unlike both neighbours: worth a second look · next: 55 cm/);
    expect(frame).toMatch(/30cm\?\s+rules met/);
    expect(frame).toMatch(/55cm◂\s+planned/);
  });

  it('follows a file that changes while the view is open', async () => {
    const { dir, config } = core();
    const s = await screen(dir, 80, 24);
    await s.shows(/30cm\s+in progress\s+30\/100/);
    // Another exine counts on at 30 cm (the file is written again with more grains).
    writeCoreLevel(dir, 30, { Alnus: 60, Corylus: 50 }, { config, close: false });
    await s.shows(/30cm\s+rules met\s+110\/100/);
    // A new level appears: a planned depth becomes counted.
    writeCoreLevel(dir, 40, { Betula: 5 }, { config, close: false });
    await s.shows(/40cm\s+in progress\s+5\/100/);
  });
});
