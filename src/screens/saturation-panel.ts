import type { SaturationCurve } from '../stats/accumulation.js';
import { braillePlot } from '../text/braille-plot.js';
import { fit, right } from '../text/cells.js';

/** Lines of the saturation panel: title, `plotRows` rows of plot with a y scale, the x scale, and a legend if room. */
export function saturationLines(curve: SaturationCurve, width: number, plotRows: number, legend: boolean): string[] {
  const yMax = Math.max(1, ...curve.observed, ...curve.expected.map((e) => Math.ceil(e)));
  const label = String(yMax).length;
  const plotWidth = Math.max(4, width - label - 1);
  const title = fit(`Types found: ${curve.observed.at(-1) ?? 0}`, width);
  if (curve.grains === 0) return [title, fit('(the curve starts with the first grain of the sum)', width)];
  const rows = braillePlot(plotWidth, plotRows, curve.grains, yMax, [
    { points: curve.at.map((n, i) => [n, curve.expected[i] as number] as const), style: 'marks' },
    { points: curve.observed.map((s, n) => [n, s] as const), style: 'line' },
  ]);
  const plot = rows.map((row, i) => `${right(i === 0 ? String(yMax) : i === rows.length - 1 ? '0' : '', label)}│${row}`);
  // The x scale carries the plateau in the middle: grains since the last new type.
  const since = ` ${curve.sinceNewType} since new `;
  const room = plotWidth - String(curve.grains).length;
  const middle = room > since.length + 1 ? `${' '.repeat(Math.floor((room - since.length) / 2))}${since}` : '';
  const axis = `${' '.repeat(label)}0${middle}${right(String(curve.grains), plotWidth - middle.length)}`;
  return [title, ...plot, fit(axis, width), ...(legend ? [fit('⣀ types found · E(Sₙ) rarefied', width)] : [])];
}

export function saturationHeight(plotRows: number, legend: boolean): number {
  return 2 + plotRows + (legend ? 1 : 0);
}
