import type { GrainEvent, SessionEvent } from '../model/events.js';
import type { LevelState } from '../model/level-state.js';

/** Every grain of a level looked up by seq: what it was, and whether it counts now. */
export interface GrainIndex {
  /** Grains that count now (the fold's stack), with their taxon and traverse. */
  readonly counted: ReadonlyMap<number, { readonly taxon: string; readonly traverse: number }>;
  /** Grains undone at the eyepiece. */
  readonly undone: ReadonlySet<number>;
  /** Every grain recorded, undone and voided ones included. */
  readonly recorded: ReadonlyMap<number, GrainEvent>;
}

export function indexGrains(events: readonly SessionEvent[], state: LevelState): GrainIndex {
  const counted = new Map<number, { taxon: string; traverse: number }>();
  for (let s = state.stack; s; s = s.below) counted.set(s.seq, { taxon: s.taxon, traverse: s.traverse });
  const undone = new Set<number>();
  const recorded = new Map<number, GrainEvent>();
  for (const e of events) {
    if (e.type === 'undo') undone.add(e.of);
    else if (e.type === 'grain') recorded.set(e.seq, e);
  }
  return { counted, undone, recorded };
}
