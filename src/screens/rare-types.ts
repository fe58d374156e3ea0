import type { LevelState, NoteRecord } from '../model/level-state.js';
import { fit } from '../text/cells.js';

export interface RareType {
  readonly taxon: string;
  readonly count: number;
  readonly notes: readonly NoteRecord[];
}

/** Types with at most `threshold` grains counted, rarest and earliest first, with their notes. */
export function rareTypes(state: LevelState, threshold: number): RareType[] {
  return Object.entries(state.counts)
    .filter(([, c]) => c > 0 && c <= threshold)
    .sort(([a, ca], [b, cb]) => ca - cb || (state.firstSeen[a] ?? 0) - (state.firstSeen[b] ?? 0))
    .map(([taxon, count]) => ({ taxon, count, notes: state.notes.filter((n) => n.taxon === taxon) }));
}

function noteWords(n: NoteRecord): string {
  return `${n.traverse === null ? '' : `t${n.traverse} `}${n.stage ? `@${n.stage.x},${n.stage.y} ` : ''}${n.text}`.trim();
}

/** Lines the panel takes in full: its title, a line per type and one per note (or "none yet"). */
export function rareLineCount(rare: readonly RareType[]): number {
  return 1 + Math.max(1, rare.reduce((n, r) => n + 1 + r.notes.length, 0));
}

export function rareLines(rare: readonly RareType[], threshold: number, width: number, room: number): string[] {
  const lines = [fit(`Rare types (≤${threshold})`, width)];
  if (rare.length === 0) return [...lines, fit('none yet', width)];
  // A note goes on its own line under its type: the stage position must be readable whole.
  for (const r of rare) {
    lines.push(fit(`${r.count} ${r.taxon}`, width));
    for (const n of r.notes) lines.push(fit(`  ${noteWords(n)}`, width));
  }
  return lines.length > room ? [...lines.slice(0, room - 1), fit(`… ${lines.length - room + 1} more`, width)] : lines;
}
