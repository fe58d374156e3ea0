import type { KeyPress } from '../input/key-press.js';
import { AppendError } from '../log/session-writer.js';
import type { EventPayload } from '../model/events.js';
import { applyEvents } from '../model/fold.js';
import type { LevelState } from '../model/level-state.js';
import type { InputMode } from './input-mode.js';
import { unconfirmedQuestion } from './mode-keys.js';
import { planBurst, type Message } from './plan-burst.js';
import type { UnconfirmedGrains } from './session-files.js';
import type { LevelWriter } from './view-only.js';

export interface Snapshot {
  readonly state: LevelState;
  /** The latest message for the analyst, if any; cleared by the next recorded event. */
  readonly message: Message | null;
  /** What opening the file found (a repair, an unclean exit): shown for the whole sitting. */
  readonly notice: string | null;
  readonly readOnly: string | null;
  readonly closed: boolean;
  /** Set while the screen asks a question, shows the help, or takes a typed line. */
  readonly mode: InputMode | null;
  /** Keys so far that counted nothing (not in the keymap): the screen rings when it rises. */
  readonly misses: number;
}

/**
 * The live counting session: keys become events, each event is on disk before
 * the state moves, and the screen renders the snapshot. Nothing else holds counts.
 */
export class CountingSession {
  private snapshot: Snapshot;
  private readonly listeners = new Set<() => void>();

  constructor(
    private readonly writer: LevelWriter,
    state: LevelState,
    notices: readonly string[] = [],
    private readonly unconfirmed?: UnconfirmedGrains,
  ) {
    const mode: InputMode | null = unconfirmed ? { kind: 'unconfirmed', fromSeq: unconfirmed.fromSeq, toSeq: unconfirmed.toSeq, grains: unconfirmed.grains } : null;
    this.snapshot = {
      state,
      message: mode?.kind === 'unconfirmed' ? { text: unconfirmedQuestion(mode), tone: 'warning' } : null,
      notice: notices.length ? notices.join(' · ') : null,
      readOnly: writer.readOnly,
      closed: false,
      mode,
      misses: 0,
    };
  }

  readonly subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  readonly getSnapshot = (): Snapshot => this.snapshot;

  get path(): string {
    return this.writer.path;
  }

  private publish(next: Partial<Snapshot>): void {
    this.snapshot = { ...this.snapshot, ...next, readOnly: this.writer.readOnly };
    for (const listener of this.listeners) listener();
  }

  press(key: KeyPress): 'quit' | undefined {
    return this.pressAll([key]);
  }

  /**
   * Handle a burst of keys (see planBurst): its events go to disk with one write
   * and one fsync, and only then does the state move. So a paste or key repeat
   * costs one flush, not one per key, and still nothing shows before it is on
   * disk. Returns 'quit' when a key asked to leave (keys after it are dropped).
   */
  pressAll(keys: readonly KeyPress[]): 'quit' | undefined {
    if (this.snapshot.closed) return undefined;
    if (this.writer.viewOnly) return this.look(keys);
    const asked = this.snapshot.mode?.kind === 'unconfirmed';
    const plan = planBurst(this.snapshot.state, this.snapshot.mode, keys);
    if (plan.payloads.length > 0 && !this.commit(plan.payloads)) return undefined;
    // The answer about grains of a failed sync is on disk: the marker beside the file has done its work.
    if (asked && plan.mode?.kind !== 'unconfirmed') this.unconfirmed?.answered();
    this.publish({ mode: plan.mode, misses: this.snapshot.misses + plan.misses, ...(plan.message === undefined ? {} : { message: plan.message }) });
    return plan.quit ? 'quit' : undefined;
  }

  /** A finished level being looked at: Ctrl-C quits, every other key counts nothing and says so. */
  private look(keys: readonly KeyPress[]): 'quit' | undefined {
    if (keys.some((k) => k.kind === 'interrupt')) return 'quit';
    this.publish({ message: { text: 'nothing counted: this level is finished and open read-only (Ctrl-C quits; exine count FILE --reopen "reason" counts on)', tone: 'warning' } });
    return undefined;
  }

  /** Append events and, only once they are on disk, move the state. On failure nothing moves and the screen says why. */
  private commit(payloads: readonly EventPayload[]): boolean {
    // Keys were decided on seq numbers predicted from the state; the writer must agree.
    if (this.writer.lastSeq !== this.snapshot.state.lastSeq) {
      throw new Error(`writer at seq ${this.writer.lastSeq} but state at ${this.snapshot.state.lastSeq}`);
    }
    try {
      const events = this.writer.appendAll(payloads);
      this.snapshot = { ...this.snapshot, state: applyEvents(this.snapshot.state, events) };
      return true;
    } catch (error) {
      if (!(error instanceof AppendError)) throw error;
      this.publish({ message: { text: error.message, tone: 'error' }, mode: null });
      return false;
    }
  }

  /** Record the end of the sitting and release the file. Synchronous and safe to call twice. */
  shutdown(): void {
    if (this.snapshot.closed) return;
    try {
      // A finish event already ends the sitting cleanly.
      const ended = this.snapshot.state.recent.at(-1)?.type === 'finish';
      if (!this.writer.readOnly && !ended) this.writer.append({ type: 'close' });
    } catch {
      // A missing close is reported at the next resume as "not closed cleanly"; no grain depends on it.
    } finally {
      this.writer.close();
      this.snapshot = { ...this.snapshot, closed: true };
    }
  }
}
