import { AppendError } from '../log/session-writer.js';
import type { EventPayload, SessionEvent } from '../model/events.js';

/** What the counting session needs of a writer: the session writer, or a finished level's view. */
export interface LevelWriter {
  readonly path: string;
  readonly readOnly: string | null;
  readonly lastSeq: number;
  /** True for a level opened only to be looked at: keys count nothing and nothing is written, not even a close. */
  readonly viewOnly?: boolean;
  append(payload: EventPayload): SessionEvent;
  appendAll(payloads: readonly EventPayload[]): SessionEvent[];
  close(): void;
}

/** A finished level opened without --reopen: no lock held, no byte written. */
export class ViewOnly implements LevelWriter {
  readonly viewOnly = true;

  constructor(
    readonly path: string,
    readonly lastSeq: number,
    readonly readOnly: string,
  ) {}

  append(): SessionEvent {
    throw new AppendError(`not recorded: ${this.readOnly}`, true);
  }

  appendAll(): SessionEvent[] {
    throw new AppendError(`not recorded: ${this.readOnly}`, true);
  }

  close(): void {}
}
