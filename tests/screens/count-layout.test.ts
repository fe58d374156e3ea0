import { describe, expect, it } from 'vitest';
import { countLayout, type LayoutNeeds } from '../../src/screens/count-layout.js';

// The demo level's panels: six groups (three lines compact), four rule lines and a title.
const needs = (width: number, height: number, over: Partial<LayoutNeeds> = {}): LayoutNeeds => ({
  width,
  height,
  statusLines: 1,
  banner: false,
  sumHeight: (compact) => 1 + (compact ? 3 : 6),
  rulesHeight: 5,
  rareLines: 8,
  ...over,
});

describe('the counting screen layout', () => {
  it('80x24: one side column, groups two to a line, no blank lines, a compact curve, recent events kept', () => {
    const l = countLayout(needs(80, 23));
    expect(l).toMatchObject({ wide: false, compactSum: true, gap: 0, sideWidth: 22, colWidth: 22, rareRoom: 0 });
    expect(l.plotRows).toBeGreaterThanOrEqual(2);
    expect(l.recentRoom).toBeGreaterThanOrEqual(3);
  });

  it('the stop banner and a long status take their lines from the panels', () => {
    const plain = countLayout(needs(80, 23));
    const busy = countLayout(needs(80, 23, { banner: true, statusLines: 3 }));
    expect(busy.mainHeight).toBe(plain.mainHeight - 3);
  });

  it('140x45: two side columns, whole group lines, blank lines between panels, a large curve with its legend, rare types', () => {
    const l = countLayout(needs(140, 44));
    expect(l).toMatchObject({ wide: true, compactSum: false, gap: 1, legend: true, rareRoom: 8 });
    expect(l.colWidth * 2 + 3).toBeLessThanOrEqual(l.sideWidth);
    expect(l.plotRows).toBeGreaterThanOrEqual(8);
  });

  it('a short terminal drops the curve before the recent events', () => {
    const l = countLayout(needs(80, 16));
    expect(l.plotRows).toBeLessThan(2);
    expect(l.recentRoom).toBeGreaterThanOrEqual(1);
  });
});

describe('the rare-types panel height', () => {
  it('is its title, a line per type and one per note, and two lines when empty', async () => {
    const { rareLineCount, rareLines } = await import('../../src/screens/rare-types.js');
    const note = { seq: 9, at: '', grain: 3, taxon: 'Tilia', traverse: 1, text: 'x', stage: null };
    const rare = [{ taxon: 'Tilia', count: 1, notes: [note, note] }, { taxon: 'Ulmus', count: 2, notes: [] }];
    expect(rareLineCount(rare)).toBe(rareLines(rare, 2, 30, Number.POSITIVE_INFINITY).length);
    expect(rareLineCount([])).toBe(rareLines([], 2, 30, Number.POSITIVE_INFINITY).length);
  });
});
