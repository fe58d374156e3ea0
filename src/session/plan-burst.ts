import type { KeyPress } from '../input/key-press.js';
import { resolveKey } from '../keymap/resolve-key.js';
import type { EventPayload } from '../model/events.js';
import type { LevelState } from '../model/level-state.js';
import { Burst, type Message, type Outcome, type Tone } from './burst.js';
import { decide } from './command-event.js';
import type { InputMode } from './input-mode.js';
import { modeKey } from './mode-keys.js';

export type { Message, Tone };

export interface BurstPlan {
  /** Events to record, in order, with one write. */
  readonly payloads: readonly EventPayload[];
  /** The message to show afterwards; undefined leaves the current one. */
  readonly message: Message | null | undefined;
  /** The mode the next burst starts in (a question, a line being typed, the help), or null. */
  readonly mode: InputMode | null;
  readonly quit: boolean;
  /** Keys that counted nothing, for the miss-key bell. */
  readonly misses: number;
}

export const FINISH_PROMPT = 'Finish this level? y = finish and quit, any other key = go on counting';

/** A key while counting: through the keymap to a command, and the command to an event, a message or a mode. */
function countingKey(b: Burst, key: KeyPress): Outcome {
  const state = b.state();
  const decision = decide(state, resolveKey(state.keymap, key));
  switch (decision.kind) {
    case 'record':
      b.stage(decision.payload);
      if (decision.payload.type === 'grain' || decision.payload.type === 'undo') b.judge();
      if (decision.message) b.say(decision.message);
      return 'go-on';
    case 'say':
      b.say(decision.message);
      return 'go-on';
    case 'miss':
      b.miss(decision.message);
      return 'go-on';
    case 'confirm-finish':
      b.mode = { kind: 'confirm-finish' };
      b.say(FINISH_PROMPT, 'warning');
      return 'go-on';
    case 'open':
      b.mode = decision.mode;
      b.message = decision.message === null ? null : { text: decision.message, tone: 'info' };
      return 'go-on';
    case 'quit':
      return 'quit';
    case 'nothing':
      return 'go-on';
    default:
      return decision satisfies never;
  }
}

/**
 * What a burst of keys means, in order. Each key is decided on the state as it
 * would be after the keys before it (an undo in the burst cancels the grain just
 * typed), with seq numbers predicted from the state; nothing is recorded here.
 * While a note or a new type is typed, keys are text and count nothing.
 */
export function planBurst(start: LevelState, startMode: InputMode | null, keys: readonly KeyPress[]): BurstPlan {
  const b = new Burst(start, startMode);
  let quit = false;
  for (const key of keys) {
    if ((b.mode ? modeKey(b, b.mode, key) : countingKey(b, key)) === 'quit') {
      quit = true;
      break;
    }
  }
  return { payloads: b.payloads, message: b.message, mode: b.mode, quit, misses: b.misses };
}
