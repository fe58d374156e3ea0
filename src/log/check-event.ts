import { checkKeymapValue } from '../keymap/parse-keymap.js';
import type { Keymap } from '../keymap/keymap.js';
import { FORMAT_VERSION } from '../model/events.js';
import { describeIssue } from '../validation/describe-issue.js';
import { eventSchemaModule } from './deferred-schema.js';
import type { ParsedEvent } from './event-schema.js';
import { passesHandCheck } from './hand-checks.js';

/** What is wrong with a line, from physical damage to an event that points at nothing. */
export type Problem =
  | 'torn'
  | 'nul-padding'
  | 'no-hash'
  | 'hash-mismatch'
  | 'not-json'
  | 'seq'
  | 'chain'
  | 'bad-event'
  | 'unknown-type'
  | 'not-open'
  | 'future-format'
  | 'bad-reference'
  | 'empty';

export type ContentCheck =
  | { readonly ok: true; readonly event: ParsedEvent; readonly keymap?: Keymap }
  | { readonly ok: false; readonly problem: Problem; readonly message: string };

/**
 * What a line holds, judged as the reader judges it: the kind of event, its fields,
 * and the keymap of line 1. The writer runs the same check before it appends, so a
 * line it writes is a line it can read.
 */
export function checkEventContent(record: Record<string, unknown>, lineNo: number): ContentCheck {
  const bad = (problem: Problem, message: string): ContentCheck => ({ ok: false, problem, message });
  if (lineNo === 1) {
    if (record.type !== 'open') return bad('not-open', `is of type ${JSON.stringify(record.type)}; a session file starts with an "open" line`);
    if (typeof record.format === 'number' && record.format > FORMAT_VERSION) {
      return bad('future-format', `is session format ${record.format}, written by a newer exine (this one reads format ${FORMAT_VERSION}); update exine to open it`);
    }
  } else if (record.type === 'open') {
    return bad('bad-event', 'is a second "open" line; only line 1 opens a level');
  }
  let event: ParsedEvent;
  if (passesHandCheck(record)) event = record as unknown as ParsedEvent;
  else {
    // Only now zod: to word what is wrong, or to check a kind that has no hand check.
    const { KNOWN_EVENT_TYPES, parseEventObject } = eventSchemaModule();
    if (typeof record.type === 'string' && !KNOWN_EVENT_TYPES.has(record.type)) {
      return bad('unknown-type', `has unknown event type ${JSON.stringify(record.type)}; it may come from a newer exine`);
    }
    const parsed = parseEventObject(record);
    if (!parsed.ok) return bad('bad-event', `is not a valid event: ${describeIssue(parsed.issue)}`);
    event = parsed.event;
  }
  if (event.type === 'open') {
    const keymap = checkKeymapValue(event.keymap, 'recorded in line 1');
    if (!keymap.ok) return bad('bad-event', `holds an invalid keymap: ${keymap.message}`);
    return { ok: true, event, keymap: keymap.keymap };
  }
  return { ok: true, event };
}

/**
 * The seqs that later lines may point at. exine only ever writes an undo of a
 * grain, a void of a grain, a restore of a void and a note on a grain that came
 * before; a line pointing anywhere else was written by hand.
 */
// What each line was, by seq: the reader sees seq 1, 2, 3 … in order, so one dense array of small
// integers holds them (a Set of 100,000 numbers costs more to fill than the fold itself).
const GRAIN = 1;
const TRAVERSE = 2;
const VOID = 3;
const OTHER = 0;

export class References {
  private readonly kinds: number[] = [];

  private is(seq: number, kind: number): boolean {
    return this.kinds[seq - 1] === kind;
  }

  /** What is wrong with the event's reference, or null; then remembers the event. */
  check(event: ParsedEvent): string | null {
    const points = (what: string, seq: number, kind: string) => `is ${what} #${seq}, which is not an earlier ${kind} line`;
    let wrong: string | null = null;
    let kind = OTHER;
    switch (event.type) {
      case 'grain':
        kind = GRAIN;
        break;
      case 'undo':
        if (!this.is(event.of, GRAIN)) wrong = points('an undo of', event.of, 'grain');
        break;
      case 'traverse':
        kind = TRAVERSE;
        break;
      case 'traverse-undo':
        if (!this.is(event.of, TRAVERSE)) wrong = points('a take-back of', event.of, 'traverse');
        break;
      case 'void':
        if (event.grain !== null && !this.is(event.grain, GRAIN)) wrong = points('a void of', event.grain, 'grain');
        kind = VOID;
        break;
      case 'restore':
        if (!this.is(event.of, VOID)) wrong = points('a restore of', event.of, 'void');
        break;
      case 'note':
        if (event.grain !== null && !this.is(event.grain, GRAIN)) wrong = points('a note on', event.grain, 'grain');
        break;
      default:
        break;
    }
    // Lines come in seq order (the reader checks seq before this), so the array stays dense.
    this.kinds[event.seq - 1] = kind;
    return wrong;
  }
}
