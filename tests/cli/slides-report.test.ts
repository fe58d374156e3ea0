import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { EventPayload } from '../../src/model/events.js';
import { grain, openPayload, timedSessionText } from '../helpers/levels.js';
import { runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

/** Slide A: traverse 1 (3 grains); slide B from traverse 2 (2 grains, one a spore) and traverse 3 (1 grain). */
function twoSlides(): string {
  const dir = tempDir();
  const events: EventPayload[] = [
    openPayload(undefined, { slide: 'A' }),
    { type: 'sitting', sitting: 1 },
    grain('Alnus'),
    grain('Betula'),
    grain('Alnus'),
    { type: 'close' },
    { type: 'sitting', sitting: 2 },
    { type: 'slide', slide: 'B', traverse: 2 },
    grain('Corylus', 2),
    grain('Sphagnum', 2),
    { type: 'traverse', traverse: 3 },
    grain('Alnus', 3),
    { type: 'close' },
  ];
  writeFileSync(join(dir, 'level.jsonl'), timedSessionText(events.map((e, i) => [e, i * 20_000] as const)));
  return dir;
}

describe('summary and audit of a level on two slides', () => {
  it('summary says the slides and the grains from each', async () => {
    const dir = twoSlides();
    const text = (await runExine(['summary', 'level.jsonl'], dir)).stdout;
    expect(text).toMatch(/level T-1 \(depth 10\) · slides A, B\n/);
    expect(text).toMatch(/\nby slide: A 3 grains \(sum 3, from traverse 1\) · B 3 grains \(sum 2, from traverse 2\)\n/);
    const json = JSON.parse((await runExine(['summary', 'level.jsonl', '--json'], dir)).stdout);
    expect(json.slides).toEqual([
      { slide: 'A', firstTraverse: 1, grains: 3, pollenSum: 3 },
      { slide: 'B', firstTraverse: 2, grains: 3, pollenSum: 2 },
    ]);
  });

  it('audit --plain gives a slide column and the grains per slide', async () => {
    const dir = twoSlides();
    const text = (await runExine(['audit', 'level.jsonl', '--plain'], dir)).stdout;
    expect(text).toMatch(/level T-1 · depth 10 · slides A, B · analyst/);
    expect(text).toMatch(/\nSlides\n  A\s+from traverse\s+1  3 grains\n  B\s+from traverse\s+2  3 grains\n/);
    expect(text).toMatch(/\n\s+#  slide\s+start/);
    expect(text).toMatch(/\n\s+1  A\s+2026-11-02/);
    expect(text).toMatch(/\n\s+2  B\s+2026-11-02/);
    expect(text).toMatch(/\n\s+3  B\s+2026-11-02/);
  });
});
