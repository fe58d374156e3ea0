import type { NextLevel } from './next-level.js';

const cm = (d: number) => `${Number(d.toFixed(2))} cm`;
const sc = (d: number) => d.toFixed(2);

/** The suggestion in one line: where to count next, and why. */
export function suggestionText(next: NextLevel): string {
  const s = next.suggestion;
  if (s.kind === 'none') return `next: ${s.reason}`;
  // A flagged level is left out of the comparison: its distances may be an error, not a change.
  const aside = next.odd.length ? `; pairs with ${next.odd.map((o) => cm(o.depth)).join(', ')} set aside` : '';
  const pair = `${cm(s.between.upper)} and ${cm(s.between.lower)}, the most dissimilar neighbours (squared chord ${sc(s.between.distance)}${aside})`;
  if (s.kind === 'planned') return `next: ${cm(s.depth)}, planned between ${pair}`;
  return `next: no planned depth lies between ${pair}; the midpoint is ${cm(s.depth)}`;
}

/** One line per level unlike both its neighbours. */
export function oddTexts(next: NextLevel): string[] {
  return next.odd.map(
    (o) => `worth a second look: ${cm(o.depth)} is unlike both neighbours (${sc(o.above)} above, ${sc(o.below)} below; they are ${sc(o.across)} apart); a mislabelled slide or a misidentified type?`,
  );
}

/** The flags in a few words, for a screen line that also holds the suggestion. */
export function oddShort(next: NextLevel): string | null {
  if (next.odd.length === 0) return null;
  const depths = next.odd.map((o) => cm(o.depth)).join(', ');
  return `? ${depths} ${next.odd.length === 1 ? 'is' : 'are'} unlike both neighbours: worth a second look`;
}

/** How the flags are judged, for the plain report. */
export function yardstickText(next: NextLevel): string {
  if (next.median === null || next.threshold === null) return `neighbour distances: ${next.distances.length}; too few to judge an odd level (at least 3)`;
  return `neighbour distances: ${next.distances.length}, median ${sc(next.median)}; a level is flagged when both its distances exceed ${sc(next.threshold)} and its neighbours are closer to each other`;
}
