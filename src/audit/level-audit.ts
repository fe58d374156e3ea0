import { inPollenSum } from '../keymap/keymap.js';
import { closedAfter, correctingAfter } from '../model/event-kinds.js';
import type { SessionEvent } from '../model/events.js';
import type { LevelState } from '../model/level-state.js';
import { evennessAcrossTraverses, type Evenness } from './evenness.js';

export interface AuditOptions {
  /** The same key twice within this many ms is flagged as a possible double press. */
  readonly doublePressMs: number;
  /** A gap longer than this is a pause; inside a traverse it is flagged as a possible interruption. */
  readonly gapMs: number;
}

/**
 * 120 ms: quicker than a deliberate second press of one key, slower than most
 * key bounce; a value from common practice, not from a study.
 */
export const DEFAULT_DOUBLE_PRESS_MS = 120;
/** Five minutes without an event inside a sitting is a pause (our choice). */
export const DEFAULT_GAP_MS = 5 * 60_000;

export interface TraverseRow {
  readonly traverse: number;
  /** Time of its first event; null for a traverse with no event yet. */
  readonly start: string | null;
  /** Time spent in it: intervals between its events, pauses left out. */
  readonly activeMs: number;
  /** Grains that count now, and grains recorded (undone and voided ones included). */
  readonly grains: number;
  readonly recorded: number;
  readonly types: number;
  readonly perMinute: number | null;
  /** Types whose first grain that counts is in this traverse. */
  readonly newTypes: readonly string[];
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

export interface Pause {
  readonly afterSeq: number;
  readonly from: string;
  readonly to: string;
  readonly ms: number;
  readonly traverse: number;
}

export interface SittingSpan {
  readonly sitting: number;
  readonly start: string;
  readonly end: string;
  /** From start to end, and the same with pauses left out. */
  readonly spanMs: number;
  readonly countingMs: number;
  readonly grains: number;
  readonly closedCleanly: boolean;
  readonly pauses: readonly Pause[];
}

export type FlagKind = 'double-press' | 'interruption' | 'clock';

export interface Flag {
  readonly kind: FlagKind;
  readonly seq: number;
  readonly traverse: number;
  readonly text: string;
}

export interface Correction {
  readonly seq: number;
  readonly at: string;
  readonly what: string;
  readonly reason: string;
  /** Still in force (a void not restored, or a restore). */
  readonly standing: boolean;
  readonly restoredBy: number | null;
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

function formatGap(ms: number): string {
  const s = Math.round(ms / 1000);
  return s < 120 ? `${s} s` : `${Math.round(s / 60)} min`;
}

/**
 * The traverse-by-traverse story of a level, from all its events and the state
 * they fold to (which knows what counts now, after undos and voids).
 */
export function auditLevel(events: readonly SessionEvent[], state: LevelState, options: AuditOptions): LevelAudit {
  const counted = new Map<number, { taxon: string; traverse: number }>();
  for (let s = state.stack; s; s = s.below) counted.set(s.seq, { taxon: s.taxon, traverse: s.traverse });
  const undone = new Set<number>();
  for (const e of events) if (e.type === 'undo') undone.add(e.of);
  const grainTraverse = new Map<number, number>();
  const grainOf = new Map<number, SessionEvent & { type: 'grain' }>();
  for (const e of events) {
    if (e.type === 'grain') {
      grainTraverse.set(e.seq, e.traverse);
      grainOf.set(e.seq, e);
    }
  }

  // Walk the events once: traverse times, sittings, pauses, flags.
  const traverseEvents = new Map<number, SessionEvent[]>();
  const activeMs = new Map<number, number>();
  const firstAt = new Map<number, string>();
  const undos = new Map<number, number>();
  const notes = new Map<number, number>();
  const sittings: SittingSpan[] = [];
  const flags: Flag[] = [];
  let sitting: { sitting: number; start: string; end: string; countingMs: number; grains: number; pauses: Pause[]; closed: boolean } | null = null;
  let current = 1;
  let previous: SessionEvent | null = null;
  let previousGrain: (SessionEvent & { type: 'grain' }) | null = null;
  const into = (t: number, e: SessionEvent) => {
    if (!traverseEvents.has(t)) traverseEvents.set(t, []);
    (traverseEvents.get(t) as SessionEvent[]).push(e);
    if (!firstAt.has(t)) firstAt.set(t, e.at);
  };
  const closeSitting = () => {
    if (!sitting) return;
    const { closed, ...rest } = sitting;
    sittings.push({ ...rest, spanMs: Date.parse(rest.end) - Date.parse(rest.start), closedCleanly: closed });
  };

  // Corrections are made later, in the audit: they and the rule verdicts they cause are no part of the counting time.
  let correcting = false;
  const voidTraverse = new Map<number, number>();
  let lastCounting = events[0]?.at ?? state.header.at;
  for (const e of events) {
    if (e.type === 'open') {
      previous = e;
      continue;
    }
    correcting = correctingAfter(correcting, e.type);
    if (correcting) {
      if (e.type === 'void') {
        const t = e.grain !== null ? (grainTraverse.get(e.grain) ?? current) : (e.traverse as number);
        voidTraverse.set(e.seq, t);
        into(t, e);
      }
      continue;
    }
    lastCounting = e.at;
    const dt = previous ? Date.parse(e.at) - Date.parse(previous.at) : 0;
    if (dt < 0 && previous) {
      flags.push({ kind: 'clock', seq: e.seq, traverse: current, text: `#${e.seq} is ${formatGap(-dt)} earlier than the event before it: the computer's clock was changed` });
    }
    if (e.type === 'sitting') {
      closeSitting();
      sitting = { sitting: e.sitting, start: e.at, end: e.at, countingMs: 0, grains: 0, pauses: [], closed: false };
      previous = e;
      previousGrain = null;
      continue;
    }
    // The interval up to this event belongs to the traverse in progress before it.
    if (sitting && dt > 0) {
      if (dt > options.gapMs) {
        sitting.pauses.push({ afterSeq: (previous as SessionEvent).seq, from: (previous as SessionEvent).at, to: e.at, ms: dt, traverse: current });
        const inside = e.type === 'grain' && (previous?.type === 'grain' || previous?.type === 'undo') && e.traverse === current;
        if (inside) {
          flags.push({ kind: 'interruption', seq: e.seq, traverse: current, text: `${formatGap(dt)} without a grain inside traverse ${current}, before #${e.seq}: an interruption? (the stage may have moved)` });
        }
      } else {
        sitting.countingMs += dt;
        activeMs.set(current, (activeMs.get(current) ?? 0) + dt);
      }
    }
    if (sitting) {
      sitting.end = e.at;
      sitting.closed = closedAfter(sitting.closed, e.type);
    }
    switch (e.type) {
      case 'grain': {
        into(e.traverse, e);
        if (sitting) sitting.grains++;
        const last = previousGrain;
        // An undo at the eyepiece settles it; a void made later in the audit is shown beside the flag.
        if (last && last.key === e.key && Date.parse(e.at) - Date.parse(last.at) < options.doublePressMs && !undone.has(e.seq) && !undone.has(last.seq)) {
          const ms = Date.parse(e.at) - Date.parse(last.at);
          const settled = !counted.has(e.seq) || !counted.has(last.seq) ? 'one of them is voided' : 'both count';
          flags.push({ kind: 'double-press', seq: e.seq, traverse: e.traverse, text: `#${last.seq} and #${e.seq}: key "${e.key}" (${e.taxon}) twice within ${ms} ms, a double press? ${settled}` });
        }
        previousGrain = e;
        break;
      }
      case 'undo': {
        const t = grainTraverse.get(e.of) ?? current;
        into(t, e);
        undos.set(t, (undos.get(t) ?? 0) + 1);
        previousGrain = null;
        break;
      }
      case 'taxon':
        into(current, e);
        break;
      case 'note':
        into(current, e);
        notes.set(current, (notes.get(current) ?? 0) + 1);
        break;
      case 'traverse':
        current = e.traverse;
        if (!firstAt.has(current)) firstAt.set(current, e.at);
        previousGrain = null;
        break;
      default:
        break;
    }
    previous = e;
  }
  closeSitting();

  // Corrections, and which are still standing.
  const restoredBy = new Map<number, number>();
  for (const e of events) if (e.type === 'restore') restoredBy.set(e.of, e.seq);
  const corrections: Correction[] = [];
  for (const e of events) {
    if (e.type === 'void') {
      const grain = e.grain !== null ? grainOf.get(e.grain) : undefined;
      const what = e.grain !== null ? `void of grain #${e.grain}${grain ? ` (${grain.taxon}, traverse ${grain.traverse})` : ''}` : `void of traverse ${e.traverse}`;
      const by = restoredBy.get(e.seq) ?? null;
      corrections.push({ seq: e.seq, at: e.at, what, reason: e.reason, standing: by === null && state.voids[e.seq] !== undefined, restoredBy: by });
    }
    if (e.type === 'restore') corrections.push({ seq: e.seq, at: e.at, what: `restore of void #${e.of}`, reason: e.reason, standing: true, restoredBy: null });
  }
  // A restore is listed under the traverse of the void it takes back.
  for (const e of events) {
    const t = e.type === 'restore' ? voidTraverse.get(e.of) : undefined;
    if (t !== undefined) into(t, e);
  }

  // What counts now, by traverse.
  const countsBy = new Map<number, Map<string, number>>();
  for (const { taxon, traverse } of counted.values()) {
    if (!countsBy.has(traverse)) countsBy.set(traverse, new Map());
    const m = countsBy.get(traverse) as Map<string, number>;
    m.set(taxon, (m.get(taxon) ?? 0) + 1);
  }
  const firstTraverseOf = new Map<string, number>();
  for (const [taxon, seq] of Object.entries(state.firstSeen)) firstTraverseOf.set(taxon, counted.get(seq)?.traverse ?? 0);
  const voidedIn = new Map<number, number>();
  for (const grains of Object.values(state.voids)) for (const g of grains) voidedIn.set(g.traverse, (voidedIn.get(g.traverse) ?? 0) + 1);
  const standingTraverseVoid = new Map<number, { seq: number; at: string; reason: string }>();
  for (const e of events) if (e.type === 'void' && e.traverse !== null && state.voids[e.seq]) standingTraverseVoid.set(e.traverse, { seq: e.seq, at: e.at, reason: e.reason });

  const numbers = new Set<number>([...traverseEvents.keys(), ...firstAt.keys()]);
  for (let t = 1; t <= state.traverse; t++) numbers.add(t);
  const traverses: TraverseRow[] = [...numbers]
    .sort((a, b) => a - b)
    .map((t) => {
      const byTaxon = [...(countsBy.get(t) ?? new Map<string, number>()).entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]));
      const grains = byTaxon.reduce((a, [, c]) => a + c, 0);
      const list = traverseEvents.get(t) ?? [];
      const ms = activeMs.get(t) ?? 0;
      return {
        traverse: t,
        start: firstAt.get(t) ?? null,
        activeMs: ms,
        grains,
        recorded: list.filter((e) => e.type === 'grain').length,
        types: byTaxon.length,
        perMinute: rate(grains, ms),
        newTypes: [...firstTraverseOf.entries()].filter(([, ft]) => ft === t).map(([taxon]) => taxon),
        undos: undos.get(t) ?? 0,
        voided: voidedIn.get(t) ?? 0,
        voidedWhole: standingTraverseVoid.get(t) ?? null,
        notes: notes.get(t) ?? 0,
        byTaxon,
        events: list,
      };
    });

  // Evenness of the pollen-sum types across traverses: the same counts, taxon by taxon.
  const table = new Map<string, Map<number, number>>();
  for (const [traverse, byTaxon] of countsBy) {
    for (const [taxon, n] of byTaxon) {
      if (!inPollenSum(state.keymap, taxon)) continue;
      if (!table.has(taxon)) table.set(taxon, new Map());
      (table.get(taxon) as Map<number, number>).set(traverse, n);
    }
  }
  const countingMs = sittings.reduce((a, s) => a + s.countingMs, 0);
  return {
    traverses,
    counting: new Set(counted.keys()),
    undone,
    sittings,
    countingMs,
    grains: state.grains,
    perMinute: rate(state.grains, countingMs),
    flags,
    corrections,
    evenness: evennessAcrossTraverses(table),
    firstAt: events[0]?.at ?? state.header.at,
    lastAt: lastCounting,
  };
}

/** 'void of traverse 4: "stage slipped" (restored by #626)'. */
export function describeCorrection(c: Correction): string {
  return `${c.what}: "${c.reason}"${c.restoredBy ? ` (restored by #${c.restoredBy})` : ''}`;
}

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
