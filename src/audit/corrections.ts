import type { SessionEvent } from '../model/events.js';
import type { LevelState } from '../model/level-state.js';
import type { GrainIndex } from './grain-index.js';

export interface Correction {
  readonly seq: number;
  readonly at: string;
  readonly what: string;
  readonly reason: string;
  /** Still in force (a void not restored, or a restore). */
  readonly standing: boolean;
  readonly restoredBy: number | null;
}

/** Every void and restore in order, and which still stand. */
export function correctionsOf(events: readonly SessionEvent[], state: LevelState, grains: GrainIndex): Correction[] {
  const restoredBy = new Map<number, number>();
  for (const e of events) if (e.type === 'restore') restoredBy.set(e.of, e.seq);
  const corrections: Correction[] = [];
  for (const e of events) {
    if (e.type === 'void') {
      const grain = e.grain !== null ? grains.recorded.get(e.grain) : undefined;
      const what = e.grain !== null ? `void of grain #${e.grain}${grain ? ` (${grain.taxon}, traverse ${grain.traverse})` : ''}` : `void of traverse ${e.traverse}`;
      const by = restoredBy.get(e.seq) ?? null;
      corrections.push({ seq: e.seq, at: e.at, what, reason: e.reason, standing: by === null && state.voids[e.seq] !== undefined, restoredBy: by });
    }
    if (e.type === 'restore') corrections.push({ seq: e.seq, at: e.at, what: `restore of void #${e.of}`, reason: e.reason, standing: true, restoredBy: null });
  }
  return corrections;
}

/** 'void of traverse 4: "stage slipped" (restored by #626)'. */
export function describeCorrection(c: Correction): string {
  return `${c.what}: "${c.reason}"${c.restoredBy ? ` (restored by #${c.restoredBy})` : ''}`;
}
