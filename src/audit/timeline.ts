import type { SittingSpan } from './sitting-walk.js';

/**
 * A sitting as a bar of `width` cells, start to end: "█" where counting went on,
 * "·" where a pause covers the whole cell. Readable in monochrome.
 */
export function timelineBar(s: SittingSpan, width: number): string {
  const start = Date.parse(s.start);
  const span = Math.max(1, Date.parse(s.end) - start);
  const cells: string[] = [];
  for (let i = 0; i < width; i++) {
    const from = start + (i * span) / width;
    const to = start + ((i + 1) * span) / width;
    const paused = s.pauses.some((p) => Date.parse(p.from) <= from && to <= Date.parse(p.to));
    cells.push(paused ? '·' : '█');
  }
  return cells.join('');
}
