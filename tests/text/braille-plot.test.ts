import { describe, expect, it } from 'vitest';
import { braillePlot } from '../../src/text/braille-plot.js';

describe('braille plot', () => {
  it('a flat line at the bottom fills the lowest dot row of every cell', () => {
    expect(braillePlot(3, 1, 10, 1, [{ points: [[0, 0], [10, 0]], style: 'line' }])).toEqual(['⣀⣀⣀']);
  });

  it('a rising step reaches the top row, joined by a vertical run', () => {
    const rows = braillePlot(2, 2, 3, 7, [{ points: [[0, 0], [3, 7]], style: 'line' }]);
    expect(rows).toHaveLength(2);
    // The top-right cell holds the top of the rise; the bottom-left the start.
    expect((rows[0]!.codePointAt(1)! - 0x2800) & 0x08).toBeTruthy();
    expect((rows[1]!.codePointAt(0)! - 0x2800) & 0x40).toBeTruthy();
  });

  it('marks show as "·" only where no line passes', () => {
    const rows = braillePlot(4, 1, 3, 1, [
      { points: [[0, 1], [3, 1]], style: 'marks' },
      { points: [[0, 0], [1, 0]], style: 'line' },
    ]);
    expect(rows[0]).toMatch(/^[⠀-⣿]{1,2}[ ·]*·$/);
  });

  it('is exactly width × height cells', () => {
    const rows = braillePlot(17, 5, 100, 30, [{ points: [[0, 0], [50, 20], [100, 30]], style: 'line' }]);
    expect(rows.map((r) => [...r].length)).toEqual([17, 17, 17, 17, 17]);
  });
});
