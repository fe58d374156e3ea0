import type { OpenEvent, SessionEvent } from './events.js';
import { RECENT_EVENTS, type GrainStack, type LevelState } from './level-state.js';
import type { Keymap } from '../keymap/keymap.js';

export function initialState(open: OpenEvent, keymap: Keymap): LevelState {
  return {
    header: open,
    keymap,
    rules: open.rules,
    lastSeq: open.seq,
    lastAt: open.at,
    traverse: 1,
    counts: {},
    grains: 0,
    stack: null,
    undos: 0,
    recent: [open],
    sitting: 0,
    sittingStartedAt: open.at,
    closed: false,
    finished: false,
    repairs: 0,
    ignored: [],
  };
}

/** The stack without grain `seq`, or undefined when that grain is not counted. */
function withoutGrain(stack: GrainStack | null, seq: number): GrainStack | null | undefined {
  const above: GrainStack[] = [];
  let s = stack;
  while (s && s.grain.seq !== seq) {
    above.push(s);
    s = s.below;
  }
  if (!s) return undefined;
  let rebuilt = s.below;
  for (let i = above.length - 1; i >= 0; i--) rebuilt = { grain: (above[i] as GrainStack).grain, below: rebuilt };
  return rebuilt;
}

function bump(counts: Readonly<Record<string, number>>, taxon: string, by: number): Record<string, number> {
  const next = { ...counts, [taxon]: (counts[taxon] ?? 0) + by };
  if (next[taxon] === 0) delete next[taxon];
  return next;
}

/** The state after one more event. Pure: `state` is not changed. */
export function applyEvent(state: LevelState, event: SessionEvent): LevelState {
  const recent = state.recent.length >= RECENT_EVENTS ? [...state.recent.slice(1), event] : [...state.recent, event];
  const base = { ...state, lastSeq: event.seq, lastAt: event.at, recent, closed: false };
  switch (event.type) {
    case 'open':
      // Only line 1 is an open event; the log reader refuses any other.
      return { ...base, ignored: [...state.ignored, event.seq] };
    case 'grain':
      return {
        ...base,
        counts: bump(state.counts, event.taxon, 1),
        grains: state.grains + 1,
        stack: { grain: { seq: event.seq, taxon: event.taxon, traverse: event.traverse }, below: state.stack },
      };
    case 'undo': {
      const stack = withoutGrain(state.stack, event.of);
      if (stack === undefined) return { ...base, ignored: [...state.ignored, event.seq] };
      const taxon = findTaxon(state.stack, event.of) as string;
      return { ...base, counts: bump(state.counts, taxon, -1), grains: state.grains - 1, stack, undos: state.undos + 1 };
    }
    case 'traverse':
      return { ...base, traverse: event.traverse };
    case 'note':
      return base;
    case 'sitting':
      return { ...base, sitting: event.sitting, sittingStartedAt: event.at };
    case 'rules':
      return { ...base, rules: event.rules };
    case 'repair':
      return { ...base, repairs: state.repairs + 1 };
    case 'close':
      return { ...base, closed: true };
    case 'finish':
      return { ...base, closed: true, finished: true };
    default:
      return event satisfies never;
  }
}

function findTaxon(stack: GrainStack | null, seq: number): string | undefined {
  for (let s = stack; s; s = s.below) if (s.grain.seq === seq) return s.grain.taxon;
  return undefined;
}

/** The state of a level from its events; the first must be its open event. */
export function foldEvents(open: OpenEvent, keymap: Keymap, events: Iterable<SessionEvent>): LevelState {
  let state = initialState(open, keymap);
  for (const event of events) if (event.seq !== open.seq) state = applyEvent(state, event);
  return state;
}
