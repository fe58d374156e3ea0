import type { KeyPress } from '../input/key-press.js';
import { resolveKey } from '../keymap/resolve-key.js';
import { decide } from './command-event.js';
import type { EventPayload, SessionEvent } from './events.js';
import { applyEvents } from './fold.js';
import type { LevelState } from './level-state.js';
import { rulesSignal } from './rules-signal.js';

export type Tone = 'info' | 'warning' | 'error';
export interface Message {
  readonly text: string;
  readonly tone: Tone;
}

export interface BurstPlan {
  /** Events to record, in order, with one write. */
  readonly payloads: readonly EventPayload[];
  /** The message to show afterwards; undefined leaves the current one. */
  readonly message: Message | null | undefined;
  readonly confirmingFinish: boolean;
  readonly quit: boolean;
}

export const FINISH_PROMPT = 'Finish this level? y = finish and quit, any other key = go on counting';
const NOT_FINISHED = 'not finished: counting goes on (that key counted nothing)';

/**
 * What a burst of keys means, in order. Each key is decided on the state as it
 * would be after the keys before it (an undo in the burst cancels the grain just
 * typed), with seq numbers predicted from the state; nothing is recorded here.
 */
export function planBurst(start: LevelState, confirmingFinish: boolean, keys: readonly KeyPress[]): BurstPlan {
  const payloads: EventPayload[] = [];
  let draft = start;
  let applied = 0;
  let message: Message | null | undefined;
  let confirming = confirmingFinish;
  const stage = (payload: EventPayload) => {
    payloads.push(payload);
    message = null;
  };
  // The draft catches up with staged events only when a later key needs it, so a lone key costs no extra fold.
  const current = () => {
    if (applied < payloads.length) {
      const provisional = payloads.slice(applied).map((p, i) => ({ ...p, seq: draft.lastSeq + 1 + i, at: draft.lastAt }) as SessionEvent);
      draft = applyEvents(draft, provisional);
      applied = payloads.length;
    }
    return draft;
  };
  const plan = (quit: boolean): BurstPlan => ({ payloads, message, confirmingFinish: confirming, quit });

  for (const key of keys) {
    if (confirming) {
      confirming = false;
      if (key.kind === 'char' && (key.char === 'y' || key.char === 'Y')) {
        stage({ type: 'finish' });
        return plan(true);
      }
      if (key.kind === 'interrupt') return plan(true);
      message = { text: NOT_FINISHED, tone: 'info' };
      continue;
    }
    const state = current();
    const decision = decide(state, resolveKey(state.keymap, key));
    switch (decision.kind) {
      case 'record': {
        stage(decision.payload);
        // Judged grain by grain, so a burst that crosses the line records the sum where it crossed.
        const signal = decision.payload.type === 'grain' || decision.payload.type === 'undo' ? rulesSignal(current()) : null;
        if (signal) stage(signal);
        break;
      }
      case 'say':
        message = { text: decision.message, tone: 'info' };
        break;
      case 'confirm-finish':
        confirming = true;
        message = { text: FINISH_PROMPT, tone: 'warning' };
        break;
      case 'quit':
        return plan(true);
      case 'nothing':
        break;
      default:
        decision satisfies never;
    }
  }
  return plan(false);
}
