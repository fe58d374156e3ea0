import type { Group } from '../keymap/groups.js';
import type { Keymap } from '../keymap/keymap.js';
import type { RuleName, RuleSet } from '../rules/rule-set.js';
import type { Spike } from '../stats/concentration.js';

/**
 * The session-file format this version writes; files with a higher number are refused.
 * 2 added the full rule set, marker spike data and the rules-met / rules-unmet events;
 * format 1 files read as format 2 with a target-sum rule and no spike.
 * 3: the keymap copy holds its groups with their roles and its key order, and a
 * type added while counting may be in a group of the keymap's own; a format-2
 * copy reads with the built-in groups, its "sum", and the key order of its object.
 * 3 also added the slide event (a level counted on more than one slide) and the open
 * line's fromCore; format 2 files read as format 3 on one slide.
 * 3 also added cf. grains, the reopen of a finished level and the undo of a traverse change.
 */
export const FORMAT_VERSION = 3;

/** What the first line of every session file records about the level. */
export interface LevelInfo {
  readonly level: string;
  /** Depth of the level in the core, in the core's own unit (usually cm). */
  readonly depth: number | null;
  readonly site: string | null;
  readonly core: string | null;
  readonly slide: string | null;
  readonly analyst: string | null;
}

/** The fields every line carries, added by the log writer. */
export interface Stamp {
  readonly seq: number;
  /** ISO 8601 UTC with milliseconds. */
  readonly at: string;
}

export interface OpenPayload extends LevelInfo {
  readonly type: 'open';
  readonly format: number;
  /** Random id: lines of another session never chain into this one. */
  readonly session: string;
  readonly keymap: Keymap;
  readonly rules: RuleSet;
  /** Exotic marker spike added to the sample, or null. */
  readonly spike: Spike | null;
  /** Present when the level was created in a core folder from its core.json: the flags that overrode it. */
  readonly fromCore?: { readonly overrides: readonly string[] } | undefined;
}

export interface GrainPayload {
  readonly type: 'grain';
  readonly taxon: string;
  readonly traverse: number;
  /** The key that was pressed, for the audit. */
  readonly key: string;
  /** A "cf." grain: probably this taxon, not certain. It counts with its taxon. Absent before format 3. */
  readonly cf?: true;
}

export interface UndoPayload {
  readonly type: 'undo';
  /** seq of the grain this cancels. */
  readonly of: number;
}

export interface TraversePayload {
  readonly type: 'traverse';
  /** Number of the traverse that starts here. */
  readonly traverse: number;
}

/** A traverse change taken back (an undo right after it): counting goes on in the traverse before. */
export interface TraverseUndoPayload {
  readonly type: 'traverse-undo';
  /** seq of the traverse event taken back. */
  readonly of: number;
  /** The traverse counting goes back to. */
  readonly traverse: number;
}

/** A finished level opened for counting again, with the analyst's reason. */
export interface ReopenPayload {
  readonly type: 'reopen';
  readonly reason: string;
}

/** A note, tied to a grain (or to the level), with the stage position where that grain can be found again. */
export interface NotePayload {
  readonly type: 'note';
  readonly text: string;
  readonly grain: number | null;
  readonly stage: { readonly x: number; readonly y: number } | null;
}

/** A type not in the keymap, given a free key while counting. */
export interface TaxonPayload {
  readonly type: 'taxon';
  readonly taxon: string;
  readonly group: Group;
  readonly key: string;
}

export interface SittingPayload {
  readonly type: 'sitting';
  /** Which sitting this is: 1 when the level is created, then 2, 3 … at each resume. */
  readonly sitting: number;
}

/** The rules or the spike data changed (on resume); both are given whole. */
export interface RulesPayload {
  readonly type: 'rules';
  readonly rules: RuleSet;
  readonly spike: Spike | null;
}

/** The rule set became met: the count could have stopped here. */
export interface RulesMetPayload {
  readonly type: 'rules-met';
  /** Pollen sum and all grains at that moment. */
  readonly sum: number;
  readonly grains: number;
  /** The rules that were met. */
  readonly met: readonly RuleName[];
}

/** The rule set is no longer met (an undo, or the rules changed). */
export interface RulesUnmetPayload {
  readonly type: 'rules-unmet';
  readonly sum: number;
  readonly grains: number;
}

export interface RepairPayload {
  readonly type: 'repair';
  /** What was wrong at the tail. */
  readonly damage: string;
  /** Line number where the cut began. */
  readonly line: number;
  readonly cutBytes: number;
  /** File name (beside the session) holding the bytes that were cut. */
  readonly backup: string;
}

/**
 * A correction made in the audit: one grain, or every grain of one traverse,
 * no longer counts. The grains stay in the file; a restore undoes the void.
 */
export interface VoidPayload {
  readonly type: 'void';
  /** seq of the grain voided, or null when a whole traverse is. */
  readonly grain: number | null;
  /** The traverse voided, or null when one grain is. */
  readonly traverse: number | null;
  readonly reason: string;
}

/** A void taken back: its grains count again. */
export interface RestorePayload {
  readonly type: 'restore';
  /** seq of the void event. */
  readonly of: number;
  readonly reason: string;
}

/**
 * Counting goes on on another slide of the same level (the last one was used up).
 * Traverse numbers go on across slides: `traverse` is the first one on this slide.
 */
export interface SlidePayload {
  readonly type: 'slide';
  readonly slide: string;
  readonly traverse: number;
}

export interface ClosePayload {
  readonly type: 'close';
}

export interface FinishPayload {
  readonly type: 'finish';
}

export type EventPayload =
  | OpenPayload
  | GrainPayload
  | UndoPayload
  | TraversePayload
  | TraverseUndoPayload
  | ReopenPayload
  | NotePayload
  | TaxonPayload
  | SittingPayload
  | RulesPayload
  | RulesMetPayload
  | RulesUnmetPayload
  | RepairPayload
  | VoidPayload
  | RestorePayload
  | SlidePayload
  | ClosePayload
  | FinishPayload;

export type EventType = EventPayload['type'];

/** An event as read from or written to the session file. */
export type SessionEvent = EventPayload & Stamp;
export type OpenEvent = OpenPayload & Stamp;
export type GrainEvent = GrainPayload & Stamp;
