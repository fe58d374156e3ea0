import { isTypeRole, type Group } from '../keymap/groups.js';
import { inPollenSum, roleOf } from '../keymap/keymap.js';
import type { SessionEvent } from '../model/events.js';
import type { LevelState } from '../model/level-state.js';
import { slideOfTraverse } from '../model/slides.js';
import { byCodeUnits } from '../text/by-code-units.js';
import { correctionsOf, type Correction } from './corrections.js';
import { evennessAcrossTraverses, type Evenness } from './evenness.js';
import { indexGrains, type GrainIndex } from './grain-index.js';
import { walkSittings, type AuditOptions, type Flag, type SittingSpan, type SittingWalk } from './sitting-walk.js';

export type { AuditOptions, Correction, Flag, SittingSpan };
export type { FlagKind, Pause } from './sitting-walk.js';

/**
 * 120 ms: quicker than a deliberate second press of one key, slower than most
 * key bounce; a value from common practice, not from a study.
 */
export const DEFAULT_DOUBLE_PRESS_MS = 120;
/** Five minutes without an event inside a sitting is a pause (our choice). */
export const DEFAULT_GAP_MS = 5 * 60_000;

export interface TraverseRow {
  readonly traverse: number;
  /** The slide it was counted on. */
  readonly slide: string | null;
  /** Time of its first event; null for a traverse with no event yet. */
  readonly start: string | null;
  /** Start of the sitting it began in (its start shows a date when that is another day). */
  readonly sittingStart: string | null;
  /** No grain was ever recorded in it; `takenBack` is the undo that took the change to it back, if one did. */
  readonly empty: boolean;
  readonly takenBack: number | null;
  /** Time spent in it: intervals between its events, pauses left out. */
  readonly activeMs: number;
  /** Grains that count now, and grains recorded (undone and voided ones included). */
  readonly grains: number;
  readonly recorded: number;
  /** Pollen and spore types that count in it (the screen's rule: no markers, indeterminables or other). */
  readonly types: number;
  readonly perMinute: number | null;
  /** Types whose first grain that counts is in this traverse (the same rule). */
  readonly newTypes: readonly string[];
  /** Markers, indeterminables and other taxa first counted here: listed apart, they are not discoveries. */
  readonly newOthers: readonly string[];
  /** cf. grains that count in it, by taxon. */
  readonly cf: readonly (readonly [string, number])[];
  readonly undos: number;
  readonly voided: number;
  /** The standing void of this whole traverse, if any. */
  readonly voidedWhole: { readonly seq: number; readonly at: string; readonly reason: string } | null;
  readonly notes: number;
  /** Grains that count now, by taxon, most first. */
  readonly byTaxon: readonly (readonly [string, number])[];
  /** Its events in order: grains, undos, notes, and the corrections aimed at it. */
  readonly events: readonly SessionEvent[];
}

export interface LevelAudit {
  readonly traverses: readonly TraverseRow[];
  /** seq of every grain that counts now, and of every grain undone at the eyepiece. */
  readonly counting: ReadonlySet<number>;
  readonly undone: ReadonlySet<number>;
  readonly sittings: readonly SittingSpan[];
  readonly countingMs: number;
  readonly grains: number;
  readonly perMinute: number | null;
  readonly flags: readonly Flag[];
  readonly corrections: readonly Correction[];
  readonly evenness: Evenness;
  readonly firstAt: string;
  /** The last event of counting (corrections made later are not counting). */
  readonly lastAt: string;
}

const minutes = (ms: number) => ms / 60_000;
// Under a second of recorded time gives no meaningful rate (a burst, a single event).
const rate = (grains: number, ms: number) => (ms >= 1000 ? grains / minutes(ms) : null);

/**
 * The traverse-by-traverse story of a level, from all its events and the state
 * they fold to (which knows what counts now, after undos and voids).
 */
export function auditLevel(events: readonly SessionEvent[], state: LevelState, options: AuditOptions): LevelAudit {
  const grains = indexGrains(events, state);
  const firstAt = events[0]?.at ?? state.header.at;
  const walk = walkSittings(events, grains, options, firstAt);
  const countsBy = countsByTraverse(grains);
  const countingMs = walk.sittings.reduce((a, s) => a + s.countingMs, 0);
  return {
    traverses: traverseRows(walk, countsBy, grains, state, events),
    counting: new Set(grains.counted.keys()),
    undone: grains.undone,
    sittings: walk.sittings,
    countingMs,
    grains: state.grains,
    perMinute: rate(state.grains, countingMs),
    flags: walk.flags,
    corrections: correctionsOf(events, state, grains),
    evenness: evennessAcrossTraverses(pollenSumTable(countsBy, state)),
    firstAt,
    lastAt: walk.lastCountingAt,
  };
}

/** What counts now, taxon by taxon, in each traverse. */
function countsByTraverse(grains: GrainIndex): Map<number, Map<string, number>> {
  const countsBy = new Map<number, Map<string, number>>();
  for (const { taxon, traverse } of grains.counted.values()) {
    let m = countsBy.get(traverse);
    if (!m) countsBy.set(traverse, (m = new Map()));
    m.set(taxon, (m.get(taxon) ?? 0) + 1);
  }
  return countsBy;
}

/** The pollen-sum types × traverses table the evenness test reads: the same counts, taxon by taxon. */
function pollenSumTable(countsBy: ReadonlyMap<number, ReadonlyMap<string, number>>, state: LevelState): Map<string, Map<number, number>> {
  const table = new Map<string, Map<number, number>>();
  for (const [traverse, byTaxon] of countsBy) {
    for (const [taxon, n] of byTaxon) {
      if (!inPollenSum(state.keymap, taxon)) continue;
      let row = table.get(taxon);
      if (!row) table.set(taxon, (row = new Map()));
      row.set(traverse, n);
    }
  }
  return table;
}

/** One row per traverse, every number from 1 to the current one included. */
/** Rows for traverses with nothing in them, at most. */
const MAX_EMPTY_TRAVERSES = 10_000;

function traverseRows(walk: SittingWalk, countsBy: ReadonlyMap<number, ReadonlyMap<string, number>>, grains: GrainIndex, state: LevelState, events: readonly SessionEvent[]): TraverseRow[] {
  const groupOf = new Map<string, Group>(Object.values(state.keymap.keys).map((b) => [b.taxon, b.group]));
  const isType = (taxon: string) => isTypeRole(roleOf(state.keymap, groupOf.get(taxon) ?? 'other'));
  const newTypesIn = new Map<number, string[]>();
  const newOthersIn = new Map<number, string[]>();
  for (const [taxon, seq] of Object.entries(state.firstSeen)) {
    const t = grains.counted.get(seq)?.traverse ?? 0;
    const into = isType(taxon) ? newTypesIn : newOthersIn;
    const list = into.get(t);
    if (list) list.push(taxon);
    else into.set(t, [taxon]);
  }
  const cfIn = new Map<number, Map<string, number>>();
  for (let g = state.stack; g; g = g.below) {
    if (!g.cf) continue;
    let m = cfIn.get(g.traverse);
    if (!m) cfIn.set(g.traverse, (m = new Map()));
    m.set(g.taxon, (m.get(g.taxon) ?? 0) + 1);
  }
  const voidedIn = new Map<number, number>();
  for (const taken of Object.values(state.voids)) for (const g of taken) voidedIn.set(g.traverse, (voidedIn.get(g.traverse) ?? 0) + 1);
  const standingTraverseVoid = new Map<number, { seq: number; at: string; reason: string }>();
  for (const e of events) if (e.type === 'void' && e.traverse !== null && state.voids[e.seq]) standingTraverseVoid.set(e.traverse, { seq: e.seq, at: e.at, reason: e.reason });

  const numbers = new Set<number>(walk.traverses.keys());
  // Empty traverses get rows too, but a crafted file may jump to traverse 10^15: only so many.
  const last = Math.min(state.traverse, numbers.size + MAX_EMPTY_TRAVERSES);
  for (let t = 1; t <= last; t++) numbers.add(t);
  return [...numbers]
    .sort((a, b) => a - b)
    .map((t) => {
      const byTaxon = [...(countsBy.get(t) ?? new Map<string, number>()).entries()].sort((a, b) => b[1] - a[1] || byCodeUnits(a[0], b[0]));
      const counted = byTaxon.reduce((a, [, c]) => a + c, 0);
      const log = walk.traverses.get(t);
      const list = log?.events ?? [];
      const ms = log?.activeMs ?? 0;
      const recorded = list.filter((e) => e.type === 'grain').length;
      return {
        traverse: t,
        slide: slideOfTraverse(state.slides, t),
        start: log?.firstAt ?? null,
        sittingStart: log?.sittingStart ?? null,
        empty: recorded === 0,
        takenBack: recorded === 0 ? (log?.takenBack ?? null) : null,
        activeMs: ms,
        grains: counted,
        recorded,
        types: byTaxon.filter(([taxon]) => isType(taxon)).length,
        perMinute: rate(counted, ms),
        newTypes: newTypesIn.get(t) ?? [],
        newOthers: newOthersIn.get(t) ?? [],
        cf: [...(cfIn.get(t) ?? new Map<string, number>()).entries()].sort((a, b) => b[1] - a[1] || byCodeUnits(a[0], b[0])),
        undos: log?.undos ?? 0,
        voided: voidedIn.get(t) ?? 0,
        voidedWhole: standingTraverseVoid.get(t) ?? null,
        notes: log?.notes ?? 0,
        byTaxon,
        events: list,
      };
    });
}

export { describeCorrection } from './corrections.js';
export { timelineBar } from './timeline.js';
