import { closedAfter, correctingAfter } from '../model/event-kinds.js';
import type { GrainEvent, SessionEvent } from '../model/events.js';
import type { GrainIndex } from './grain-index.js';

export interface AuditOptions {
  /** The same key twice within this many ms is flagged as a possible double press. */
  readonly doublePressMs: number;
  /** A gap longer than this is a pause; inside a traverse it is flagged as a possible interruption. */
  readonly gapMs: number;
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

/** What one traverse gathered on the walk. */
export interface TraverseLog {
  /** Its events in order: grains, undos, notes, types, and the voids aimed at it. */
  readonly events: SessionEvent[];
  firstAt: string | null;
  /** Start of the sitting the traverse began in: a traverse begun on another day shows its date. */
  sittingStart: string | null;
  /** seq of the undo that took the change to this traverse back, while it holds no grain. */
  takenBack: number | null;
  /** Intervals between its events, pauses left out. */
  activeMs: number;
  undos: number;
  notes: number;
}

export interface SittingWalk {
  readonly sittings: readonly SittingSpan[];
  readonly flags: readonly Flag[];
  readonly traverses: ReadonlyMap<number, TraverseLog>;
  /** The traverse each void was aimed at, by the void's seq. */
  readonly voidTraverse: ReadonlyMap<number, number>;
  /** The last event of counting (corrections made later are not counting). */
  readonly lastCountingAt: string;
}

interface OpenSitting {
  sitting: number;
  start: string;
  end: string;
  countingMs: number;
  grains: number;
  pauses: Pause[];
  closed: boolean;
}

function formatGap(ms: number): string {
  const s = Math.round(ms / 1000);
  return s < 120 ? `${s} s` : `${Math.round(s / 60)} min`;
}

/** The walk's working state; only `walkSittings` sees it. */
class Walker {
  readonly sittings: SittingSpan[] = [];
  readonly flags: Flag[] = [];
  readonly traverses = new Map<number, TraverseLog>();
  readonly voidTraverse = new Map<number, number>();
  sitting: OpenSitting | null = null;
  current = 1;
  previous: SessionEvent | null = null;
  previousGrain: GrainEvent | null = null;
  lastCountingAt: string;

  constructor(
    readonly grains: GrainIndex,
    readonly options: AuditOptions,
    start: string,
  ) {
    this.lastCountingAt = start;
  }

  log(t: number): TraverseLog {
    let log = this.traverses.get(t);
    if (!log) this.traverses.set(t, (log = { events: [], firstAt: null, sittingStart: null, takenBack: null, activeMs: 0, undos: 0, notes: 0 }));
    return log;
  }

  into(t: number, e: SessionEvent): TraverseLog {
    const log = this.log(t);
    log.events.push(e);
    this.started(log, e.at);
    return log;
  }

  started(log: TraverseLog, at: string): void {
    if (log.firstAt !== null) return;
    log.firstAt = at;
    log.sittingStart = this.sitting?.start ?? null;
  }

  closeSitting(): void {
    if (!this.sitting) return;
    const { closed, ...rest } = this.sitting;
    this.sittings.push({ ...rest, spanMs: Date.parse(rest.end) - Date.parse(rest.start), closedCleanly: closed });
  }

  /** A correction, made later in the audit: placed under its traverse, no part of the counting time. */
  correction(e: SessionEvent): void {
    if (e.type !== 'void') return;
    const t = e.grain !== null ? (this.grains.recorded.get(e.grain)?.traverse ?? this.current) : (e.traverse as number);
    this.voidTraverse.set(e.seq, t);
    this.into(t, e);
  }

  /** The interval up to this event: counting time of the traverse in progress before it, or a pause. */
  time(e: SessionEvent): void {
    const previous = this.previous;
    const dt = previous ? Date.parse(e.at) - Date.parse(previous.at) : 0;
    if (dt < 0 && previous) {
      this.flags.push({ kind: 'clock', seq: e.seq, traverse: this.current, text: `#${e.seq} is ${formatGap(-dt)} earlier than the event before it: the computer's clock was changed` });
    }
    if (!this.sitting || !previous || dt <= 0 || e.type === 'sitting') return;
    if (dt > this.options.gapMs) {
      this.sitting.pauses.push({ afterSeq: previous.seq, from: previous.at, to: e.at, ms: dt, traverse: this.current });
      const inside = e.type === 'grain' && (previous.type === 'grain' || previous.type === 'undo') && e.traverse === this.current;
      if (inside) {
        this.flags.push({ kind: 'interruption', seq: e.seq, traverse: this.current, text: `${formatGap(dt)} without a grain inside traverse ${this.current}, before #${e.seq}: an interruption? (the stage may have moved)` });
      }
    } else {
      this.sitting.countingMs += dt;
      this.log(this.current).activeMs += dt;
    }
  }

  grain(e: GrainEvent): void {
    this.into(e.traverse, e);
    if (this.sitting) this.sitting.grains++;
    const last = this.previousGrain;
    const { undone, counted } = this.grains;
    // An undo at the eyepiece settles it; a void made later in the audit is shown beside the flag.
    if (last && last.key === e.key && Date.parse(e.at) - Date.parse(last.at) < this.options.doublePressMs && !undone.has(e.seq) && !undone.has(last.seq)) {
      const ms = Date.parse(e.at) - Date.parse(last.at);
      const settled = !counted.has(e.seq) || !counted.has(last.seq) ? 'one of them is voided' : 'both count';
      this.flags.push({ kind: 'double-press', seq: e.seq, traverse: e.traverse, text: `#${last.seq} and #${e.seq}: key "${e.key}" (${e.taxon}) twice within ${ms} ms, a double press? ${settled}` });
    }
    this.previousGrain = e;
  }

  /** An event of counting, in its sitting and its traverse. */
  counting(e: SessionEvent): void {
    this.lastCountingAt = e.at;
    this.time(e);
    if (e.type === 'sitting') {
      this.closeSitting();
      this.sitting = { sitting: e.sitting, start: e.at, end: e.at, countingMs: 0, grains: 0, pauses: [], closed: false };
      this.previousGrain = null;
    } else if (this.sitting) {
      this.sitting.end = e.at;
      this.sitting.closed = closedAfter(this.sitting.closed, e.type);
    }
    switch (e.type) {
      case 'grain':
        this.grain(e);
        break;
      case 'undo':
        this.into(this.grains.recorded.get(e.of)?.traverse ?? this.current, e).undos++;
        this.previousGrain = null;
        break;
      case 'taxon':
        this.into(this.current, e);
        break;
      case 'note':
        this.into(this.current, e).notes++;
        break;
      case 'traverse':
        this.current = e.traverse;
        this.log(this.current).takenBack = null;
        this.started(this.log(this.current), e.at);
        this.previousGrain = null;
        break;
      case 'traverse-undo': {
        const left = this.into(this.current, e);
        if (!left.events.some((x) => x.type === 'grain')) left.takenBack = e.seq;
        this.current = e.traverse;
        this.previousGrain = null;
        break;
      }
      case 'reopen':
        this.into(this.current, e);
        break;
      default:
        break;
    }
    this.previous = e;
  }
}

/** One walk over the events: sittings and their pauses, each traverse's events and time, and the flags. */
export function walkSittings(events: readonly SessionEvent[], grains: GrainIndex, options: AuditOptions, start: string): SittingWalk {
  const w = new Walker(grains, options, start);
  let correcting = false;
  for (const e of events) {
    if (e.type === 'open') {
      w.previous = e;
      continue;
    }
    correcting = correctingAfter(correcting, e.type);
    if (correcting) w.correction(e);
    else w.counting(e);
  }
  w.closeSitting();
  // A restore is listed under the traverse of the void it takes back.
  for (const e of events) {
    const t = e.type === 'restore' ? w.voidTraverse.get(e.of) : undefined;
    if (t !== undefined) w.into(t, e);
  }
  return { sittings: w.sittings, flags: w.flags, traverses: w.traverses, voidTraverse: w.voidTraverse, lastCountingAt: w.lastCountingAt };
}
