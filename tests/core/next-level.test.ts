import { describe, expect, it } from 'vitest';
import { nextLevel, ODD_FACTOR } from '../../src/core/next-level.js';
import { oddTexts, suggestionText } from '../../src/core/next-words.js';
import type { OverviewRow } from '../../src/core/overview.js';
import { proportions, squaredChord } from '../../src/stats/squared-chord.js';

/** A row with only what the comparison reads: depth, status and the pollen-sum shares. */
function row(depth: number, counts: Record<string, number> | null, pollenSum = 300): OverviewRow {
  return {
    depth,
    status: counts ? 'finished' : 'planned',
    pollenSum: counts ? pollenSum : 0,
    shares: counts ? proportions(counts) : null,
  } as OverviewRow;
}

// A slow change from Alnus to Betula, one step a level.
const step = (i: number) => ({ Alnus: 100 - 10 * i, Betula: 20 + 10 * i, Corylus: 30 });

describe('what to count next', () => {
  it('suggests the planned depth nearest the middle of the two most dissimilar neighbours', () => {
    const rows = [row(0, step(0)), row(8, step(1)), row(12, null), row(16, step(2)), row(24, step(3)), row(28, null), row(30, null), row(36, null), row(40, { Poaceae: 100, Alnus: 20 })];
    const n = nextLevel(rows);
    expect(n.distances.map((d) => [d.upper, d.lower])).toEqual([
      [0, 8],
      [8, 16],
      [16, 24],
      [24, 40],
    ]);
    // 24 → 40 is by far the largest step; its middle is 32, and 30 is the planned depth nearest it (28 and 36 are 4 away).
    expect(n.suggestion).toMatchObject({ kind: 'planned', depth: 30, between: { upper: 24, lower: 40 } });
    expect(suggestionText(n)).toMatch(/^next: 30 cm, planned between 24 cm and 40 cm, the most dissimilar neighbours \(squared chord \d\.\d\d\)$/);
    expect(n.odd).toEqual([]);
  });

  it('says when no planned depth lies between, and gives the midpoint', () => {
    const n = nextLevel([row(10, { Alnus: 9, Betula: 1 }), row(20, { Alnus: 1, Betula: 9 }), row(30, null)]);
    expect(n.suggestion).toMatchObject({ kind: 'midpoint', depth: 15, between: { upper: 10, lower: 20 } });
    expect(suggestionText(n)).toMatch(/no planned depth lies between 10 cm and 20 cm.*the midpoint is 15 cm/);
  });

  it('needs two counted levels', () => {
    expect(nextLevel([row(10, { Alnus: 1 }), row(20, null)]).suggestion).toEqual({ kind: 'none', reason: 'two levels with a pollen sum of 100 or more are needed to compare; the first planned depth is 20 cm' });
  });

  it('leaves out a level just started: its first grains are noise', () => {
    const n = nextLevel([row(10, { Alnus: 80, Betula: 20 }), row(20, { Poaceae: 11 }, 11), row(30, { Alnus: 70, Betula: 30 }), row(25, null)]);
    expect(n.distances.map((d) => [d.upper, d.lower])).toEqual([[10, 30]]);
    expect(n.suggestion).toMatchObject({ kind: 'planned', depth: 25 });
  });

  it('flags a level unlike both its neighbours, whose neighbours are alike, and passes over it for the suggestion', () => {
    // Five levels of a steady assemblage and one (at 30) counted from another slide.
    const steady = (i: number) => ({ Alnus: 50 + i, Betula: 30, Corylus: 20 - i });
    const rows = [row(10, steady(0)), row(20, steady(1)), row(25, null), row(30, { Poaceae: 70, Alnus: 30 }), row(35, null), row(40, steady(2)), row(50, steady(3)), row(55, null), row(60, steady(8))];
    const n = nextLevel(rows);
    expect(n.odd.map((o) => o.depth)).toEqual([30]);
    const [odd] = n.odd;
    expect(odd!.above).toBeGreaterThan(ODD_FACTOR * n.median!);
    expect(odd!.across).toBeCloseTo(squaredChord(proportions(steady(1))!, proportions(steady(2))!), 12);
    expect(oddTexts(n)[0]).toMatch(/worth a second look: 30 cm is unlike both neighbours/);
    // The largest distances touch 30 cm; the suggestion is between the largest of the others (50 → 60).
    expect(n.suggestion).toMatchObject({ kind: 'planned', depth: 55 });
  });

  it('does not flag the edge of a real change: a level like one of its neighbours', () => {
    const a = { Alnus: 80, Betula: 20 };
    const b = { Poaceae: 80, Betula: 20 };
    const n = nextLevel([row(10, a), row(20, a), row(30, a), row(40, b), row(50, b), row(60, b)]);
    expect(n.odd).toEqual([]);
    expect(n.suggestion).toMatchObject({ kind: 'midpoint', depth: 35 });
  });

  it('flags nothing with fewer than three distances: no yardstick', () => {
    const n = nextLevel([row(10, { Alnus: 1 }), row(20, { Betula: 1 }), row(30, { Alnus: 1 })]);
    expect(n.median).toBeNull();
    expect(n.odd).toEqual([]);
  });
});
