import type { RuleSet } from '../rules/rule-set.js';
import type { LevelCounts } from '../stats/level-counts.js';
import type { OpenEvent, SessionEvent } from './events.js';

export interface CountedGrain {
  readonly seq: number;
  readonly taxon: string;
  readonly traverse: number;
  /** A cf. grain (the identification is probable, not certain). */
  readonly cf?: true;
}

/** A traverse change that stands (not taken back), with the traverse it left. */
export interface TraverseChange {
  readonly seq: number;
  readonly from: number;
  readonly to: number;
}

/** Grains still counted, newest first: undo pops in O(1) and nothing is copied. */
export interface GrainStack extends CountedGrain {
  readonly below: GrainStack | null;
}

/**
 * Everything the screen, the summary and the export know about a level: a fold of
 * its events. The counts the statistics read (keymap, counts, grains, first
 * appearances, plateau, spike, stack) are declared once, in LevelCounts.
 */
export interface LevelState extends LevelCounts {
  readonly header: OpenEvent;
  readonly rules: RuleSet;
  /** As the last rules-met / rules-unmet event says. */
  readonly rulesMet: boolean;
  /** The first and the latest rules-met events, or null. */
  readonly firstRulesMet: { readonly seq: number; readonly at: string; readonly sum: number } | null;
  readonly lastRulesMet: { readonly seq: number; readonly at: string; readonly sum: number } | null;
  readonly lastSeq: number;
  readonly lastAt: string;
  readonly traverse: number;
  /** Traverse changes that stand, oldest first: an undo right after one takes it back. */
  readonly traverseChanges: readonly TraverseChange[];
  /** cf. grains still counted, by taxon (they count in `counts` too). */
  readonly cf: Readonly<Record<string, number>>;
  /** How often a finished level was opened again for counting. */
  readonly reopens: number;
  /** The grains still counted, with their traverses. */
  readonly stack: GrainStack | null;
  readonly undos: number;
  /** The grains each standing void took out, by the void's seq: a restore puts them back. */
  readonly voids: Readonly<Record<number, readonly CountedGrain[]>>;
  /** The last few events, oldest first. */
  readonly recent: readonly SessionEvent[];
  readonly sitting: number;
  readonly sittingStartedAt: string;
  /** True when the last event is a close or finish: the previous run ended cleanly. */
  readonly closed: boolean;
  /** When the analyst marked the level finished (the latest time), or null; a reopen makes it null again. */
  readonly finishedAt: string | null;
  readonly repairs: number;
  /** The backups the repair events name. */
  readonly repairBackups: readonly string[];
  /** Every note, in order. */
  readonly notes: readonly NoteRecord[];
  /** Types added while counting, in order (their keys are in `keymap`). */
  readonly addedTypes: readonly string[];
  /** The slide being counted now, and every slide of the level in order, from the open line's on. */
  readonly slide: string | null;
  readonly slides: readonly SlideSpan[];
  /** Time spent counting, as the audit measures it: intervals between events of counting inside sittings, pauses over five minutes and corrections left out. */
  readonly countingMs: number;
  /** What countingMs needs of the events before: the last event of counting, a sitting seen, a correction under way. */
  readonly countingClock: { readonly at: string; readonly inSitting: boolean; readonly correcting: boolean };
  /** Events the fold could not apply (an undo of a grain that is not counted): kept, reported. */
  readonly ignored: readonly number[];
}

/** A slide of the level: the grains from `seq` on (until the next slide) are on it. */
export interface SlideSpan {
  readonly slide: string | null;
  /** seq of the event that started it (1 for the open line's slide). */
  readonly seq: number;
  readonly at: string;
  /** The first traverse on it: numbers go on from slide to slide. */
  readonly traverse: number;
}

export interface NoteRecord {
  readonly seq: number;
  readonly at: string;
  readonly grain: number | null;
  /** The taxon and traverse of the grain noted, when there is one. */
  readonly taxon: string | null;
  readonly traverse: number | null;
  readonly text: string;
  readonly stage: { readonly x: number; readonly y: number } | null;
}

export const RECENT_EVENTS = 20;
