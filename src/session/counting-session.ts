import type { KeyPress } from '../input/key-press.js';
import { resolveKey } from '../keymap/resolve-key.js';
import { AppendError, type SessionWriter } from '../log/session-writer.js';
import { decide } from './command-event.js';
import type { EventPayload } from './events.js';
import { applyEvent } from './fold.js';
import type { LevelState } from './level-state.js';

export type Tone = 'info' | 'warning' | 'error';

export interface Snapshot {
  readonly state: LevelState;
  /** The latest message for the analyst, if any; cleared by the next recorded event. */
  readonly message: { readonly text: string; readonly tone: Tone } | null;
  /** What opening the file found (a repair, an unclean exit): shown for the whole sitting. */
  readonly notice: string | null;
  readonly readOnly: string | null;
  readonly closed: boolean;
  /** Set while the screen asks "finish this level?": the next key answers. */
  readonly confirmingFinish: boolean;
}

/**
 * The live counting session: keys become events, each event is on disk before
 * the state moves, and the screen renders the snapshot. Nothing else holds counts.
 */
export class CountingSession {
  private snapshot: Snapshot;
  private readonly listeners = new Set<() => void>();

  constructor(
    private readonly writer: SessionWriter,
    state: LevelState,
    notices: readonly string[] = [],
  ) {
    this.snapshot = {
      state,
      message: null,
      notice: notices.length ? notices.join(' · ') : null,
      readOnly: writer.readOnly,
      closed: false,
      confirmingFinish: false,
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

  /** Handle keys in order. Returns 'quit' when one of them asked to leave (the rest are not applied). */
  pressAll(keys: readonly KeyPress[]): 'quit' | undefined {
    for (const key of keys) if (this.press(key) === 'quit') return 'quit';
    return undefined;
  }

  press(key: KeyPress): 'quit' | undefined {
    if (this.snapshot.confirmingFinish) return this.answerFinish(key);
    const decision = decide(this.snapshot.state, resolveKey(this.snapshot.state.keymap, key));
    switch (decision.kind) {
      case 'record':
        this.record(decision.payload);
        return undefined;
      case 'say':
        this.publish({ message: { text: decision.message, tone: 'info' } });
        return undefined;
      case 'quit':
        return 'quit';
      case 'confirm-finish':
        this.publish({ confirmingFinish: true, message: { text: 'Finish this level? y = finish and quit, any other key = go on counting', tone: 'warning' } });
        return undefined;
      case 'nothing':
        return undefined;
    }
  }

  /** The key after Ctrl-F: "y" finishes the level and quits; any other key only cancels (and counts nothing). */
  private answerFinish(key: KeyPress): 'quit' | undefined {
    if (key.kind === 'interrupt') return 'quit';
    if (key.kind === 'char' && (key.char === 'y' || key.char === 'Y')) {
      this.publish({ confirmingFinish: false });
      return this.record({ type: 'finish' }) ? 'quit' : undefined;
    }
    this.publish({ confirmingFinish: false, message: { text: 'not finished: counting goes on (that key counted nothing)', tone: 'info' } });
    return undefined;
  }

  /** Append one event and, only once it is on disk, move the state. */
  record(payload: EventPayload): boolean {
    if (this.snapshot.closed) return false;
    try {
      const event = this.writer.append(payload);
      this.publish({ state: applyEvent(this.snapshot.state, event), message: null });
      return true;
    } catch (error) {
      if (!(error instanceof AppendError)) throw error;
      this.publish({ message: { text: error.message, tone: 'error' } });
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
