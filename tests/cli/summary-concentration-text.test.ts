import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { grainsFor, keymapOf, openPayload, sessionText } from '../helpers/levels.js';
import { runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const SPIKE = { tablets: 2, perTablet: 20000, perTabletSd: 800, volume: 1, mass: null, accumulationRate: null };

async function summaryOf(counts: number[], markers: number): Promise<string> {
  const dir = tempDir();
  writeFileSync(join(dir, 'level.jsonl'), sessionText([openPayload(keymapOf(2), { spike: SPIKE }), ...grainsFor(counts, markers)]));
  const run = await runExine(['summary', 'level.jsonl'], dir);
  expect(run.code).toBe(0);
  return run.stdout;
}

describe('exine summary: the concentration line', () => {
  // (σ_C/C)² ≈ 1/p + 1/m + (σ_M/M)² has no value at p = 0 (Maher 1981, as in FIELD section 5).
  it('says the relative error is undefined while no pollen is counted, not ±0.0%', async () => {
    const text = await summaryOf([0, 0], 12);
    expect(text).toMatch(/concentration 0 grains\/cm³ \(relative error undefined until pollen is counted, 95% 0–\d+\) from 12 markers/);
    expect(text).not.toMatch(/±0\.0%/);
  });

  // Same formula at p = 3, m = 12, two tablets of 20,000 ± 800: √(1/3 + 1/12 + 0.0008) = 64.6%.
  it('gives the relative error once pollen is counted', async () => {
    expect(await summaryOf([2, 1], 12)).toMatch(/concentration 10000 grains\/cm³ \(±64\.6%, 95% \d+–\d+\) from 12 markers/);
  });
});
