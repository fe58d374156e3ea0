import { squaredChord } from '../stats/squared-chord.js';
import type { OverviewRow } from './overview.js';

/** The squared-chord distance between two neighbouring counted levels (by depth). */
export interface NeighbourDistance {
  readonly upper: number;
  readonly lower: number;
  readonly distance: number;
}

/**
 * A level is "worth a second look" when both its distances exceed this many
 * times the core's median neighbour distance, and its two neighbours are more
 * alike than either is to it. The median is the core's own yardstick (a core of
 * slow change and one of fast change are judged each by itself) and does not
 * move when one odd level adds two large distances. 2× is our choice, not a
 * published value.
 */
export const ODD_FACTOR = 2;
/**
 * Levels with a smaller pollen sum are left out of the comparison: the first
 * grains of a level just started would make it the most dissimilar of all by
 * counting noise alone (our choice).
 */
export const MIN_COMPARED_SUM = 100;
/** Fewer neighbour distances than this give no yardstick: nothing is flagged. */
export const MIN_DISTANCES = 3;

export interface OddLevel {
  readonly depth: number;
  readonly above: number;
  readonly below: number;
  /** The distance between its two neighbours, which are alike. */
  readonly across: number;
}

export type Suggestion =
  /** The planned depth nearest the middle of the two most dissimilar neighbours. */
  | { readonly kind: 'planned'; readonly depth: number; readonly between: NeighbourDistance }
  /** No planned depth lies between them: the midpoint. */
  | { readonly kind: 'midpoint'; readonly depth: number; readonly between: NeighbourDistance }
  | { readonly kind: 'none'; readonly reason: string };

export interface NextLevel {
  readonly distances: readonly NeighbourDistance[];
  /** The median neighbour distance and the flag threshold; null with too few distances. */
  readonly median: number | null;
  readonly threshold: number | null;
  readonly odd: readonly OddLevel[];
  readonly suggestion: Suggestion;
}

function median(values: readonly number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

const tidy = (n: number) => Number(n.toFixed(6));

/**
 * What to count next. Levels with a depth and a pollen sum of at least
 * MIN_COMPARED_SUM are compared with the next such level down; planned depths are those rows with status "planned".
 * Pairs that touch a level flagged as odd are passed over for the suggestion
 * while another pair is left: an odd level is checked first, not refined around.
 */
export function nextLevel(rows: readonly OverviewRow[]): NextLevel {
  const counted = rows.filter((r): r is OverviewRow & { depth: number; shares: Record<string, number> } => r.depth !== null && r.shares !== null && r.pollenSum >= MIN_COMPARED_SUM);
  const distances: NeighbourDistance[] = [];
  for (let i = 1; i < counted.length; i++) {
    const a = counted[i - 1] as (typeof counted)[number];
    const b = counted[i] as (typeof counted)[number];
    distances.push({ upper: a.depth, lower: b.depth, distance: squaredChord(a.shares, b.shares) });
  }
  const enough = distances.length >= MIN_DISTANCES;
  const mid = enough ? median(distances.map((d) => d.distance)) : null;
  const threshold = mid === null ? null : ODD_FACTOR * mid;
  const odd: OddLevel[] = [];
  if (threshold !== null) {
    for (let i = 1; i + 1 < counted.length; i++) {
      const above = (distances[i - 1] as NeighbourDistance).distance;
      const below = (distances[i] as NeighbourDistance).distance;
      const across = squaredChord((counted[i - 1] as (typeof counted)[number]).shares, (counted[i + 1] as (typeof counted)[number]).shares);
      if (above > threshold && below > threshold && across < Math.min(above, below)) odd.push({ depth: (counted[i] as (typeof counted)[number]).depth, above, below, across });
    }
  }
  return { distances, median: mid, threshold, odd, suggestion: suggest(rows, distances, odd) };
}

function suggest(rows: readonly OverviewRow[], distances: readonly NeighbourDistance[], odd: readonly OddLevel[]): Suggestion {
  if (distances.length === 0) {
    const first = rows.find((r) => r.status === 'planned' && r.depth !== null);
    const reason = `two levels with a pollen sum of ${MIN_COMPARED_SUM} or more are needed to compare`;
    return first ? { kind: 'none', reason: `${reason}; the first planned depth is ${first.depth} cm` } : { kind: 'none', reason };
  }
  const flagged = new Set(odd.map((o) => o.depth));
  const clean = distances.filter((d) => !flagged.has(d.upper) && !flagged.has(d.lower));
  const pool = clean.length > 0 ? clean : distances;
  // The largest distance; on a tie the upper pair, so the answer does not depend on anything but the core.
  const top = pool.reduce((best, d) => (d.distance > best.distance ? d : best));
  const middle = (top.upper + top.lower) / 2;
  const inside = rows
    .filter((r) => r.status === 'planned' && r.depth !== null && r.depth > top.upper && r.depth < top.lower)
    .map((r) => r.depth as number)
    .sort((a, b) => Math.abs(a - middle) - Math.abs(b - middle) || a - b);
  const best = inside[0];
  if (best !== undefined) return { kind: 'planned', depth: best, between: top };
  if (top.lower - top.upper <= 0) return { kind: 'none', reason: `the most dissimilar levels share depth ${top.upper} cm` };
  return { kind: 'midpoint', depth: tidy(middle), between: top };
}
