import type { SaturationCurve } from '../stats/accumulation.js';
import { braillePlot } from '../text/braille-plot.js';
import { fit, right } from '../text/cells.js';

/**
 * The step line's points that the plot can tell apart: the first and last point of each dot
 * column. `observed` never falls, so a column's run of points draws the same dots as its two
 * ends; a curve of 100,000 grains costs a few hundred points instead of 100,000.
 */
export function stepPoints(observed: readonly number[], grains: number, plotWidth: number): (readonly [number, number])[] {
  const columns = 2 * plotWidth - 1;
  const column = (n: number) => Math.min(columns, Math.max(0, Math.round((n / Math.max(grains, 1e-9)) * columns)));
  const out: (readonly [number, number])[] = [];
  for (let n = 0; n < observed.length; n++) {
    const c = column(n);
    // Keep n when it starts a column or ends one (the next point falls in another column).
    if (n === 0 || n === observed.length - 1 || column(n - 1) !== c || column(n + 1) !== c) out.push([n, observed[n] as number]);
  }
  return out;
}

/** Lines of the saturation panel: title, `plotRows` rows of plot with a y scale, the x scale, and a legend if room. */
export function saturationLines(curve: SaturationCurve, width: number, plotRows: number, legend: boolean): string[] {
  // observed never falls: its last value is its largest (and a spread of 100,000 arguments would overflow the stack).
  const yMax = Math.max(1, curve.observed.at(-1) ?? 0, ...curve.expected.map((e) => Math.ceil(e)));
  const label = String(yMax).length;
  const plotWidth = Math.max(4, width - label - 1);
  const title = fit(`Types found: ${curve.observed.at(-1) ?? 0}`, width);
  if (curve.grains === 0) return [title, fit('(the curve starts with the first grain of the sum)', width)];
  const rows = braillePlot(plotWidth, plotRows, curve.grains, yMax, [
    { points: curve.at.map((n, i) => [n, curve.expected[i] as number] as const), style: 'marks' },
    { points: stepPoints(curve.observed, curve.grains, plotWidth), style: 'line' },
  ]);
  const plot = rows.map((row, i) => `${right(i === 0 ? String(yMax) : i === rows.length - 1 ? '0' : '', label)}│${row}`);
  // The x scale carries the plateau in the middle: grains since the last new type.
  const since = ` ${curve.sinceNewType} since new `;
  const room = plotWidth - String(curve.grains).length;
  const middle = room > since.length + 1 ? `${' '.repeat(Math.floor((room - since.length) / 2))}${since}` : '';
  const axis = `${' '.repeat(label)}0${middle}${right(String(curve.grains), plotWidth - middle.length)}`;
  const key = legend ? legendFor(width) : null;
  return [title, ...plot, fit(axis, width), ...(key === null ? [] : [fit(key, width)])];
}

// The longest legend that fits whole: a key cut short explains nothing.
const LEGENDS = ['⣀ types found · E(Sₙ) rarefied', '⣀ found · E(Sₙ) rarefied', '⣀ found · E(Sₙ)'];
export function legendFor(width: number): string | null {
  return LEGENDS.find((l) => [...l].length <= width) ?? null;
}

export function saturationHeight(plotRows: number, legend: boolean): number {
  return 2 + plotRows + (legend ? 1 : 0);
}
