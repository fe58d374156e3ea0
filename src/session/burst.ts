import type { EventPayload, SessionEvent } from '../model/events.js';
import { applyEvents } from '../model/fold.js';
import type { LevelState } from '../model/level-state.js';
import { rulesSignal } from '../model/rules-signal.js';
import type { InputMode } from './input-mode.js';

export type Tone = 'info' | 'warning' | 'error' | 'miss';
export interface Message {
  readonly text: string;
  readonly tone: Tone;
}

/** What a key handler returns: the burst goes on, or the analyst quits. */
export type Outcome = 'go-on' | 'quit';

/**
 * A burst being planned: the events staged so far, the message and the mode.
 * Key handlers stage events here and read the state those events would make;
 * nothing is recorded until the whole plan is written.
 */
export class Burst {
  readonly payloads: EventPayload[] = [];
  message: Message | null | undefined = undefined;
  /** Keys in this burst that counted nothing (not in the keymap): each rings. */
  misses = 0;
  private draft: LevelState;
  private applied = 0;

  constructor(
    start: LevelState,
    public mode: InputMode | null,
  ) {
    this.draft = start;
  }

  stage(payload: EventPayload): void {
    this.payloads.push(payload);
    this.message = null;
  }

  /** The state after the staged events, with seq numbers predicted; caught up only when a key needs it, so a lone key costs no extra fold. */
  state(): LevelState {
    if (this.applied < this.payloads.length) {
      const d = this.draft;
      const provisional = this.payloads.slice(this.applied).map((p, i) => ({ ...p, seq: d.lastSeq + 1 + i, at: d.lastAt }) as SessionEvent);
      this.draft = applyEvents(d, provisional);
      this.applied = this.payloads.length;
    }
    return this.draft;
  }

  /** Stage the rule verdict when it changed: judged grain by grain, so a burst that crosses the line records the sum where it crossed. */
  judge(): void {
    const signal = rulesSignal(this.state());
    if (signal) this.stage(signal);
  }

  say(text: string, tone: Tone = 'info'): void {
    this.message = { text, tone };
  }

  /** A key that counted nothing: said in the flash tone, and rung. */
  miss(text: string): void {
    this.misses++;
    this.message = { text, tone: 'miss' };
  }
}
