import { inPollenSum, withKey, type Keymap } from '../keymap/keymap.js';
import { normalRules } from '../rules/rule-set.js';
import { closedAfter, correctingAfter } from './event-kinds.js';
import type { OpenEvent, SessionEvent } from './events.js';
import { RECENT_EVENTS, type CountedGrain, type GrainStack, type LevelState } from './level-state.js';

export function initialState(open: OpenEvent, keymap: Keymap): LevelState {
  return {
    header: open,
    keymap,
    rules: normalRules(open.rules),
    spike: open.spike ?? null,
    rulesMet: false,
    firstRulesMet: null,
    lastRulesMet: null,
    lastSeq: open.seq,
    lastAt: open.at,
    traverse: 1,
    traverseChanges: [],
    cf: {},
    reopens: 0,
    counts: {},
    grains: 0,
    firstSeen: {},
    sinceNewType: 0,
    stack: null,
    undos: 0,
    voids: {},
    recent: [open],
    sitting: 0,
    sittingStartedAt: open.at,
    closed: false,
    finishedAt: null,
    repairs: 0,
    repairBackups: [],
    notes: [],
    addedTypes: [],
    slide: open.slide,
    slides: [{ slide: open.slide, seq: open.seq, at: open.at, traverse: 1 }],
    ignored: [],
    countingMs: 0,
    countingClock: { at: open.at, inSitting: false, correcting: false },
  };
}

/** A gap longer than this inside a sitting is a pause, not counting: the audit's DEFAULT_GAP_MS (a test holds them equal). */
export const COUNTING_GAP_MS = 5 * 60_000;

/**
 * Milliseconds from `from` to `to`, two times as exine stamps them (ISO, UTC, ms).
 * Most neighbours share their date and hour: then the minutes, seconds and
 * milliseconds are read from the digits, as replaying a long file parses no date.
 */
function msBetween(from: string, to: string): number {
  if (from.length === 24 && to.length === 24 && from.startsWith(to.slice(0, 14))) {
    const at = (t: string, i: number) => t.charCodeAt(i) - 48;
    const ms = (t: string) => (at(t, 14) * 10 + at(t, 15)) * 60_000 + (at(t, 17) * 10 + at(t, 18)) * 1000 + at(t, 20) * 100 + at(t, 21) * 10 + at(t, 22);
    return ms(to) - ms(from);
  }
  return Date.parse(to) - Date.parse(from);
}

/** Counting time as the audit's sitting walk measures it, one event at a time. */
function timeCounting(d: Draft, event: SessionEvent): void {
  const clock = d.countingClock;
  const correcting = correctingAfter(clock.correcting, event.type);
  if (correcting) {
    if (!clock.correcting) d.countingClock = { ...clock, correcting };
    return;
  }
  const inSitting = clock.inSitting || event.type === 'sitting';
  if (clock.inSitting && event.type !== 'sitting') {
    const dt = msBetween(clock.at, event.at);
    if (dt > 0 && dt <= COUNTING_GAP_MS) d.countingMs += dt;
  }
  // The clock object is replaced only when a flag changes: one object per sitting, not per event.
  if (inSitting !== clock.inSitting || clock.correcting) d.countingClock = { at: event.at, inSitting, correcting: false };
  else (d.countingClock as { at: string }).at = event.at;
}

/**
 * A private, writable copy of a state. The fold changes only drafts it made
 * itself, so a replay of 100,000 events copies the counts once, not per event,
 * while every state handed out stays untouched.
 */
type Draft = { -readonly [K in keyof LevelState]: LevelState[K] } & {
  counts: Record<string, number>;
  firstSeen: Record<string, number>;
  recent: SessionEvent[];
  ignored: number[];
};

function draftOf(state: LevelState): Draft {
  return { ...state, counts: { ...state.counts }, firstSeen: { ...state.firstSeen }, recent: [...state.recent], ignored: [...state.ignored], countingClock: { ...state.countingClock } };
}

/**
 * The stack without grain `seq`, or undefined when that grain is not counted.
 * The stack is ordered by seq, newest first, so the search stops below `seq`.
 */
function withoutGrain(stack: GrainStack | null, seq: number): GrainStack | null | undefined {
  const above: GrainStack[] = [];
  let s = stack;
  while (s && s.seq > seq) {
    above.push(s);
    s = s.below;
  }
  if (!s || s.seq !== seq) return undefined;
  let rebuilt = s.below;
  for (let i = above.length - 1; i >= 0; i--) rebuilt = { ...(above[i] as GrainStack), below: rebuilt };
  return rebuilt;
}

function findGrain(stack: GrainStack | null, seq: number): GrainStack | undefined {
  for (let s = stack; s && s.seq >= seq; s = s.below) if (s.seq === seq) return s;
  return undefined;
}

/** The lowest seq of `taxon` still in the stack (the stack is newest first). */
function firstOf(stack: GrainStack | null, taxon: string): number | undefined {
  let first: number | undefined;
  for (let s = stack; s; s = s.below) if (s.taxon === taxon) first = s.seq;
  return first;
}

/** Whether this grain brought its type into the pollen sum (it is that type's first grain still counted). */
const opensType = (d: Draft, s: GrainStack): boolean => d.firstSeen[s.taxon] === s.seq && inPollenSum(d.keymap, s.taxon);

/**
 * Whether a type of the sum has its first grain above grain `seq`: every grain counted after
 * `seq` lies above it in the stack, so an undo of the last grain looks at no grain at all.
 */
function newTypeAbove(d: Draft, seq: number): boolean {
  for (let s = d.stack; s && s.seq > seq; s = s.below) if (opensType(d, s)) return true;
  return false;
}

/**
 * The plateau worked out from the stack, for an undo that moved a type's first grain: the
 * grains of the sum above the topmost grain that opened a type, which is the newest type's.
 */
function plateauOf(d: Draft): number {
  let since = 0;
  for (let s = d.stack; s && !opensType(d, s); s = s.below) if (inPollenSum(d.keymap, s.taxon)) since++;
  return since;
}

/** The stack as an array, newest first. */
function stackArray(stack: GrainStack | null): CountedGrain[] {
  const out: CountedGrain[] = [];
  for (let s = stack; s; s = s.below) out.push(s.cf ? { seq: s.seq, taxon: s.taxon, traverse: s.traverse, cf: true } : { seq: s.seq, taxon: s.taxon, traverse: s.traverse });
  return out;
}

function stackOf(grains: readonly CountedGrain[]): GrainStack | null {
  let stack: GrainStack | null = null;
  for (let i = grains.length - 1; i >= 0; i--) stack = { ...(grains[i] as CountedGrain), below: stack };
  return stack;
}

/**
 * Counts, first appearances and the plateau worked out again from the grains
 * still counted: after a void or a restore, which are rare and may touch any grain.
 */
function recount(d: Draft, grains: readonly CountedGrain[]): void {
  d.stack = stackOf(grains);
  d.counts = {};
  d.firstSeen = {};
  const cf: Record<string, number> = {};
  for (let i = grains.length - 1; i >= 0; i--) {
    const g = grains[i] as CountedGrain;
    d.counts[g.taxon] = (d.counts[g.taxon] ?? 0) + 1;
    if (g.cf) cf[g.taxon] = (cf[g.taxon] ?? 0) + 1;
    d.firstSeen[g.taxon] ??= g.seq;
  }
  d.cf = cf;
  d.grains = grains.length;
  d.sinceNewType = plateauOf(d);
}

/** cf. grains of `taxon` up or down by one; a taxon with none left drops out. */
function addCf(d: Draft, taxon: string, by: 1 | -1): void {
  const n = (d.cf[taxon] ?? 0) + by;
  const { [taxon]: _old, ...rest } = d.cf;
  d.cf = n > 0 ? { ...rest, [taxon]: n } : rest;
}

function voidGrains(d: Draft, event: SessionEvent & { type: 'void' }): void {
  const all = stackArray(d.stack);
  const hit = (g: CountedGrain) => (event.grain !== null ? g.seq === event.grain : g.traverse === event.traverse && g.seq < event.seq);
  const taken = all.filter(hit);
  if (taken.length === 0) {
    d.ignored.push(event.seq);
    return;
  }
  d.voids = { ...d.voids, [event.seq]: taken };
  recount(d, all.filter((g) => !hit(g)));
}

function restoreGrains(d: Draft, event: SessionEvent & { type: 'restore' }): void {
  const taken = d.voids[event.of];
  if (!taken) {
    d.ignored.push(event.seq);
    return;
  }
  const { [event.of]: _restored, ...rest } = d.voids;
  d.voids = rest;
  recount(d, [...stackArray(d.stack), ...taken].sort((a, b) => b.seq - a.seq));
}

function step(d: Draft, event: SessionEvent): void {
  d.lastSeq = event.seq;
  d.lastAt = event.at;
  d.recent.push(event);
  if (d.recent.length > RECENT_EVENTS) d.recent.shift();
  d.closed = closedAfter(d.closed, event.type);
  timeCounting(d, event);
  switch (event.type) {
    case 'open':
      // Only line 1 opens a level; the log reader refuses any other.
      d.ignored.push(event.seq);
      return;
    case 'grain':
      d.counts[event.taxon] = (d.counts[event.taxon] ?? 0) + 1;
      if (inPollenSum(d.keymap, event.taxon)) d.sinceNewType = d.firstSeen[event.taxon] === undefined ? 0 : d.sinceNewType + 1;
      d.firstSeen[event.taxon] ??= event.seq;
      d.grains++;
      if (event.cf) {
        d.stack = { seq: event.seq, taxon: event.taxon, traverse: event.traverse, cf: true, below: d.stack };
        addCf(d, event.taxon, 1);
      } else d.stack = { seq: event.seq, taxon: event.taxon, traverse: event.traverse, below: d.stack };
      return;
    case 'undo': {
      const undone = findGrain(d.stack, event.of);
      const taxon = undone?.taxon;
      const stack = withoutGrain(d.stack, event.of);
      if (stack === undefined || taxon === undefined) {
        d.ignored.push(event.seq);
        return;
      }
      const wasFirst = d.firstSeen[taxon] === event.of;
      // A fully undone taxon reads as never counted.
      if (d.counts[taxon] === 1) {
        delete d.counts[taxon];
        delete d.firstSeen[taxon];
      } else {
        d.counts[taxon] = (d.counts[taxon] ?? 0) - 1;
        // Undoing a type's first grain moves its first appearance to its next grain.
        if (d.firstSeen[taxon] === event.of) d.firstSeen[taxon] = firstOf(stack, taxon) as number;
      }
      d.grains--;
      d.stack = stack;
      d.undos++;
      if (undone?.cf) addCf(d, taxon, -1);
      // Only undoing a type's first grain can move the newest type; that rare case walks the stack.
      if (inPollenSum(d.keymap, taxon)) {
        if (wasFirst) d.sinceNewType = plateauOf(d);
        else if (!newTypeAbove(d, event.of)) d.sinceNewType--;
      }
      return;
    }
    case 'traverse':
      d.traverseChanges = [...d.traverseChanges, { seq: event.seq, from: d.traverse, to: event.traverse }];
      d.traverse = event.traverse;
      return;
    case 'traverse-undo': {
      // Only the latest change that stands can be taken back, and only to where it came from.
      const last = d.traverseChanges.at(-1);
      if (!last || last.seq !== event.of || last.from !== event.traverse) {
        d.ignored.push(event.seq);
        return;
      }
      d.traverseChanges = d.traverseChanges.slice(0, -1);
      d.traverse = event.traverse;
      return;
    }
    case 'reopen':
      d.finishedAt = null;
      d.reopens++;
      return;
    case 'note': {
      const noted = event.grain === null ? undefined : findGrain(d.stack, event.grain);
      d.notes = [
        ...d.notes,
        { seq: event.seq, at: event.at, grain: event.grain, taxon: noted?.taxon ?? null, traverse: noted?.traverse ?? null, text: event.text, stage: event.stage },
      ];
      return;
    }
    case 'taxon': {
      const taken = d.keymap.keys[event.key] || Object.values(d.keymap.actions).includes(event.key) || Object.values(d.keymap.keys).some((b) => b.taxon === event.taxon);
      if (taken) {
        d.ignored.push(event.seq);
        return;
      }
      d.keymap = withKey(d.keymap, event.key, { taxon: event.taxon, group: event.group });
      d.addedTypes = [...d.addedTypes, event.taxon];
      return;
    }
    case 'sitting':
      d.sitting = event.sitting;
      d.sittingStartedAt = event.at;
      return;
    case 'rules':
      d.rules = normalRules(event.rules);
      d.spike = event.spike ?? null;
      return;
    case 'rules-met':
      d.rulesMet = true;
      d.lastRulesMet = { seq: event.seq, at: event.at, sum: event.sum };
      d.firstRulesMet ??= d.lastRulesMet;
      return;
    case 'rules-unmet':
      d.rulesMet = false;
      return;
    case 'repair':
      d.repairs++;
      d.repairBackups = [...d.repairBackups, event.backup];
      return;
    case 'void':
      voidGrains(d, event);
      return;
    case 'restore':
      restoreGrains(d, event);
      return;
    case 'slide':
      d.slide = event.slide;
      d.traverse = event.traverse;
      d.slides = [...d.slides, { slide: event.slide, seq: event.seq, at: event.at, traverse: event.traverse }];
      return;
    case 'close':
      return;
    case 'finish':
      d.finishedAt = event.at;
      return;
    default:
      event satisfies never;
  }
}

/** The state after one more event. Pure: `state` is not changed. */
export function applyEvent(state: LevelState, event: SessionEvent): LevelState {
  const d = draftOf(state);
  step(d, event);
  return d;
}

/** The state after several more events, with one copy of the state for all of them. */
export function applyEvents(state: LevelState, events: readonly SessionEvent[]): LevelState {
  const d = draftOf(state);
  for (const event of events) step(d, event);
  return d;
}

/** A fold fed one event at a time, for events streamed from a file. */
export interface Folding {
  add(event: SessionEvent): void;
  /** The state so far; the fold can go on after it. */
  state(): LevelState;
}

export function startFold(open: OpenEvent, keymap: Keymap): Folding {
  const d = draftOf(initialState(open, keymap));
  return {
    add: (event) => {
      if (event.seq !== open.seq) step(d, event);
    },
    state: () => draftOf(d),
  };
}

/** The state of a level from its events (the open event itself is skipped). */
export function foldEvents(open: OpenEvent, keymap: Keymap, events: Iterable<SessionEvent>): LevelState {
  const folding = startFold(open, keymap);
  for (const event of events) folding.add(event);
  return folding.state();
}
