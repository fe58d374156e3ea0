import { randomBytes } from 'node:crypto';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { ExineError } from '../errors.js';
import { withSessionFile } from '../io/session-file-source.js';
import type { Keymap } from '../keymap/keymap.js';
import { isBackupOf, repairTail } from '../log/repair-tail.js';
import { scanInParallel } from '../log/parallel-scan.js';
import type { LogScan } from '../log/scan-log.js';
import { SessionLock } from '../log/session-lock.js';
import { SessionWriter, type WriterOptions } from '../log/session-writer.js';
import { clearUnconfirmed, readUnconfirmed, unconfirmedPathOf } from '../log/unconfirmed.js';
import { describeRules, sameRules, type RuleSet } from '../rules/rule-set.js';
import type { Spike } from '../stats/concentration.js';
import { rulesSignal } from '../model/rules-signal.js';
import { FORMAT_VERSION, type EventPayload, type LevelInfo, type OpenEvent, type RestorePayload, type SessionEvent, type VoidPayload } from '../model/events.js';
import { applyEvent, applyEvents, foldEvents, startFold, type Folding } from '../model/fold.js';
import type { CountedGrain, LevelState } from '../model/level-state.js';
import { localDate } from '../text/local-time.js';
import { ViewOnly, type LevelWriter } from './view-only.js';

export interface OpenedLevel {
  /** The session writer, or a finished level's read-only view (nothing written). */
  readonly writer: LevelWriter;
  readonly state: LevelState;
  /** What the analyst should be told on opening: repairs, an unclean last exit, a lock taken over. */
  readonly notices: readonly string[];
  /** Grains written while a sync to disk failed, which the analyst keeps or voids before counting on. */
  readonly unconfirmed?: UnconfirmedGrains | undefined;
}

export interface UnconfirmedGrains {
  readonly fromSeq: number;
  readonly toSeq: number;
  readonly grains: readonly CountedGrain[];
  /** Call once the answer is on disk: the marker is no longer needed. */
  readonly answered: () => void;
}

export interface NewLevel {
  readonly info: LevelInfo;
  readonly keymap: Keymap;
  readonly rules: RuleSet;
  readonly spike: Spike | null;
  /** Set when the level is made in a core folder from its core.json. */
  readonly fromCore?: { readonly overrides: readonly string[] } | undefined;
}

/** Backups beside the session that no repair event names. */
function unrecordedBackups(path: string, state: LevelState): { name: string; bytes: number }[] {
  const named = new Set(state.repairBackups);
  return readdirSync(dirname(path))
    .filter((name) => isBackupOf(path, name) && !named.has(name))
    .sort()
    .map((name) => ({ name, bytes: statSync(join(dirname(path), name)).size }));
}

/** Scan a session file and fold its valid events as they are read, keeping none of them. */
function scanAndFold(path: string): { scan: LogScan; state: LevelState | null } {
  let folding: Folding | null = null;
  const scan = withSessionFile(path, (source) =>
    scanInParallel(source, () => {
      folding = null;
      return (event, keymap) => {
        folding ??= startFold(event as OpenEvent, keymap);
        folding.add(event);
      };
    }),
  );
  return { scan, state: (folding as Folding | null)?.state() ?? null };
}

/** Read a level without locking or changing it: for summary, export, audit. */
export function readLevel(path: string): { scan: LogScan; state: LevelState; warnings: string[] } {
  const { scan, state } = scanAndFold(path);
  if (scan.corruption || !state) {
    throw new ExineError(`${path}: ${scan.corruption?.message}; nothing was read (exine verify ${path} shows the details)`);
  }
  const warnings = scan.tail ? [`${path}: ${scan.tail.message}; that line is left out (exine count repairs it)`] : [];
  return { scan, state, warnings };
}

/** Create a new level file, holding its lock; the first sitting starts. */
export function createLevel(path: string, level: NewLevel, options: WriterOptions = {}): OpenedLevel {
  if (existsSync(path)) throw new ExineError(`${path} already exists`);
  if (!existsSync(dirname(path))) throw new ExineError(`cannot create ${path}: the folder ${dirname(path)} does not exist`);
  const lock = SessionLock.acquire(path);
  try {
    const { writer, event } = SessionWriter.create(
      path,
      {
        type: 'open',
        format: FORMAT_VERSION,
        session: randomBytes(16).toString('hex'),
        ...level.info,
        keymap: level.keymap,
        rules: level.rules,
        spike: level.spike,
        ...(level.fromCore ? { fromCore: level.fromCore } : {}),
      },
      lock,
      options,
    );
    try {
      // No rule set is met by an empty count, so there is no verdict to record yet.
      const state = applyEvent(foldEvents(event as OpenEvent, level.keymap, []), writer.append({ type: 'sitting', sitting: 1 }));
      return { writer, state, notices: [] };
    } catch (error) {
      writer.close();
      throw error;
    }
  } catch (error) {
    lock.release();
    throw error;
  }
}

/**
 * Reopen a level for counting: verify every line, cut a damaged tail (keeping
 * a backup), refuse a file with damage in the middle, and start a new sitting.
 */
export interface RuleChange {
  readonly rules?: RuleSet | undefined;
  readonly spike?: Spike | null | undefined;
  /** Counting goes on on this slide: a slide event is recorded when it is not the current one. */
  readonly slide?: string | undefined;
}

export interface ResumeOptions extends WriterOptions {
  /** Rules and spike data given again on resume: a change is recorded. */
  readonly rules?: RuleSet | undefined;
  readonly spike?: Spike | undefined;
  /**
   * Called with the level as read, before anything is written; throwing leaves the
   * file untouched. It may return rules and spike data worked out from the level.
   */
  readonly beforeWrite?: (state: LevelState) => RuleChange | void;
  /** Count on in a finished level, for this reason (recorded); without it a finished level opens read-only. */
  readonly reopen?: string | undefined;
}

/** A finished level opened to look at: the checks run, but nothing is written, repaired or locked. */
function viewFinished(path: string, state: LevelState, scan: LogScan, change: RuleChange): OpenedLevel {
  const rules = change.rules ?? state.rules;
  const spike = change.spike === undefined ? state.spike : change.spike;
  if (!sameRules(rules, state.rules) || JSON.stringify(spike) !== JSON.stringify(state.spike)) {
    throw new ExineError(`${path}: this level is finished; its rules and spike data change only when it is reopened (add --reopen "reason")`);
  }
  const finished = `finished ${localDate(state.finishedAt as string)}`;
  const notices = [`this level is ${finished}: open read-only, nothing is counted (exine count FILE --reopen "reason" counts on)`];
  if (scan.tail) notices.push(`${scan.tail.message}; left as it is (--reopen repairs it)`);
  return { writer: new ViewOnly(path, state.lastSeq, `this level is ${finished}; Ctrl-C quits, --reopen "reason" counts on`), state, notices };
}

export function resumeLevel(path: string, options: ResumeOptions = {}): OpenedLevel {
  const lock = SessionLock.acquire(path);
  try {
    const notices: string[] = [];
    if (lock.tookOverFrom) notices.push(`took over a stale lock (${lock.tookOverFrom})`);
    const { scan, state: folded } = scanAndFold(path);
    if (scan.corruption || !folded) {
      throw new ExineError(
        `${path}: ${scan.corruption?.message}; it was not opened for counting and nothing was changed (exine verify ${path} for details)`,
      );
    }
    const change = { rules: options.rules, spike: options.spike, ...(options.beforeWrite?.(folded) ?? {}) };
    const reopen = options.reopen?.trim();
    if (options.reopen !== undefined && !reopen) throw new ExineError('--reopen needs a reason: say why the finished level is counted on, in a few words');
    if (reopen && !folded.finishedAt) throw new ExineError(`${path}: this level is not finished, so there is nothing to reopen (leave out --reopen)`);
    if (folded.finishedAt && !reopen) {
      const view = viewFinished(path, folded, scan, change);
      lock.release();
      return view;
    }
    let repaired = null;
    if (scan.tail) {
      repaired = repairTail(path, scan.tail, (options.clock ?? (() => new Date()))());
      notices.push(
        `${scan.tail.message}: ${repaired.cutBytes} bytes cut off and kept in ${repaired.backup}`,
      );
    }
    let state = folded;
    const unconfirmed = unconfirmedAtOpen(path, scan.goodBytes, state, notices);
    if (state.finishedAt) {
      notices.push(`this level was finished ${localDate(state.finishedAt)} and is reopened: "${reopen}" is recorded`);
    } else if (!repaired && !state.closed) {
      notices.push('the last sitting was not closed cleanly (the program was stopped); every grain it showed is on disk');
    }
    // Everything this open records goes to disk in one write: a failed open leaves no sitting line behind.
    const staged: EventPayload[] = [];
    let trial = state;
    const record = (payload: EventPayload) => {
      staged.push(payload);
      trial = applyEvent(trial, { ...payload, seq: trial.lastSeq + 1, at: trial.lastAt } as SessionEvent);
    };
    if (repaired) {
      const { damage, cutBytes, backup } = repaired;
      record({ type: 'repair', damage: damage.message, line: damage.line, cutBytes, backup });
    }
    // A repair stopped between its cut and its record left a backup that no repair event names.
    for (const orphan of unrecordedBackups(path, trial)) {
      record({ type: 'repair', damage: 'a repair was stopped before it was recorded; its backup was found at this open', line: trial.lastSeq + 1, cutBytes: orphan.bytes, backup: orphan.name });
      notices.push(`found ${orphan.name} (${orphan.bytes} bytes cut off by a repair that was stopped before it was recorded); it is recorded now and kept`);
    }
    record({ type: 'sitting', sitting: trial.sitting + 1 });
    if (reopen) record({ type: 'reopen', reason: reopen });
    const before = trial;
    const rules = change.rules ?? before.rules;
    const spike = change.spike === undefined ? before.spike : change.spike;
    const rulesChanged = !sameRules(rules, before.rules);
    if (rulesChanged || JSON.stringify(spike) !== JSON.stringify(before.spike)) {
      record({ type: 'rules', rules, spike });
      if (rulesChanged) notices.push(`stop rules changed from ${describeRules(before.rules)} to ${describeRules(rules)}`);
      else notices.push('marker spike data changed');
    }
    if (change.slide !== undefined && change.slide !== trial.slide) {
      // Traverse numbers go on across slides; a traverse with no grain yet is the new slide's first.
      const traverse = trial.stack?.traverse === trial.traverse ? trial.traverse + 1 : trial.traverse;
      record({ type: 'slide', slide: change.slide, traverse });
      notices.push(`counting on slide ${change.slide} from traverse ${traverse} (slide ${trial.slides.at(-2)?.slide ?? '–'} before)`);
    }
    const signal = rulesSignal(trial);
    if (signal) record(signal);
    const writer = SessionWriter.resume(path, scan.goodBytes, state.lastSeq, scan.lastHash, lock, options);
    try {
      state = applyEvents(state, writer.appendAll(staged));
    } catch (error) {
      writer.close();
      throw error;
    }
    return { writer, state, notices, unconfirmed };
  } catch (error) {
    lock.release();
    throw error;
  }
}

/** What a marker of a failed sync, left by an earlier sitting, means now. */
function unconfirmedAtOpen(path: string, goodBytes: number, state: LevelState, notices: string[]): UnconfirmedGrains | undefined {
  const marker = readUnconfirmed(path);
  if (!marker) return undefined;
  const name = unconfirmedPathOf(path).split('/').at(-1);
  if (marker.reason === 'unreadable marker') {
    notices.push(`${name} says a sync to disk failed at an earlier sitting, but it cannot be read; check the last lines with exine audit, then delete ${name}`);
    return undefined;
  }
  const range = marker.fromSeq === marker.toSeq ? `#${marker.fromSeq}` : `#${marker.fromSeq}–#${marker.toSeq}`;
  if (goodBytes <= marker.afterBytes) {
    notices.push(`a sync to disk failed at the last sitting; what it could not confirm (${range}) was cut back and is not in the file`);
    clearUnconfirmed(path);
    return undefined;
  }
  const grains: CountedGrain[] = [];
  for (let g = state.stack; g && g.seq >= marker.fromSeq; g = g.below) if (g.seq <= marker.toSeq) grains.unshift({ seq: g.seq, taxon: g.taxon, traverse: g.traverse });
  if (grains.length === 0) {
    notices.push(`a sync to disk failed at the last sitting; the lines it could not confirm (${range}) stayed in the file and hold no grain that counts`);
    clearUnconfirmed(path);
    return undefined;
  }
  return { fromSeq: marker.fromSeq, toSeq: marker.toSeq, grains, answered: () => clearUnconfirmed(path) };
}

/**
 * Record one correction made in the audit (a void or a restore), as a short
 * transaction: take the lock, check the file, append, let go. Refused while the
 * level is open for counting elsewhere, on a damaged file, or when the
 * correction has nothing to act on; nothing is written then.
 */
export function correctLevel(path: string, payload: VoidPayload | RestorePayload, options: WriterOptions = {}): LevelState {
  if (!payload.reason.trim()) throw new ExineError('a correction needs a reason: say why, in a few words');
  const lock = SessionLock.acquire(path);
  try {
    const { scan, state } = scanAndFold(path);
    if (scan.corruption || !state) {
      throw new ExineError(`${path}: ${scan.corruption?.message}; no correction was made (exine verify ${path} for details)`);
    }
    if (scan.tail) throw new ExineError(`${path}: ${scan.tail.message}; open it once with exine count to repair it, then correct`);
    // Try it on the state first: a void of nothing counted, or a restore of no standing void, writes nothing.
    const trial = applyEvent(state, { ...payload, seq: state.lastSeq + 1, at: state.lastAt } as SessionEvent);
    if (trial.ignored.includes(state.lastSeq + 1)) throw new ExineError(`${path}: ${whyNot(state, payload)}; nothing was changed`);
    const writer = SessionWriter.resume(path, scan.goodBytes, state.lastSeq, scan.lastHash, lock, options);
    try {
      // The correction and the verdict it brings go to disk in one write, as a burst of keys does.
      const signal = rulesSignal(trial);
      return applyEvents(state, writer.appendAll(signal ? [payload, signal] : [payload]));
    } finally {
      writer.close();
    }
  } catch (error) {
    lock.release();
    throw error;
  }
}

function whyNot(state: LevelState, payload: VoidPayload | RestorePayload): string {
  if (payload.type === 'restore') return `event #${payload.of} is not a void that still stands`;
  if (payload.grain !== null) return `grain #${payload.grain} does not count now (it was undone, voided, or is not a grain)`;
  return `traverse ${payload.traverse} has no grain that counts now`;
}
