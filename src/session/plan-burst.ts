import { GROUPS } from '../keymap/groups.js';
import type { KeyPress } from '../input/key-press.js';
import { editLine } from '../input/line-edit.js';
import { resolveKey } from '../keymap/resolve-key.js';
import { decide } from './command-event.js';
import type { EventPayload, SessionEvent } from '../model/events.js';
import { applyEvents } from '../model/fold.js';
import { parseNewType, parseNote, type InputMode } from './input-mode.js';
import type { LevelState } from '../model/level-state.js';
import { nextFreeKey } from './free-key.js';
import { rulesSignal } from '../model/rules-signal.js';

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
  /** The mode the next burst starts in (a question, a line being typed, the help), or null. */
  readonly mode: InputMode | null;
  readonly quit: boolean;
}

export const FINISH_PROMPT = 'Finish this level? y = finish and quit, any other key = go on counting';
const NOT_FINISHED = 'not finished: counting goes on (that key counted nothing)';

/**
 * What a burst of keys means, in order. Each key is decided on the state as it
 * would be after the keys before it (an undo in the burst cancels the grain just
 * typed), with seq numbers predicted from the state; nothing is recorded here.
 * While a note or a new type is typed, keys are text and count nothing.
 */
export function planBurst(start: LevelState, startMode: InputMode | null, keys: readonly KeyPress[]): BurstPlan {
  const payloads: EventPayload[] = [];
  let draft = start;
  let applied = 0;
  let message: Message | null | undefined;
  let mode = startMode;
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
  // Judged grain by grain, so a burst that crosses the line records the sum where it crossed.
  const judge = () => {
    const signal = rulesSignal(current());
    if (signal) stage(signal);
  };
  const plan = (quit: boolean): BurstPlan => ({ payloads, message, mode, quit });
  const say = (text: string, tone: Tone = 'info') => {
    message = { text, tone };
  };

  for (const key of keys) {
    if (mode) {
      switch (mode.kind) {
        case 'confirm-finish':
          mode = null;
          if (key.kind === 'char' && (key.char === 'y' || key.char === 'Y')) {
            stage({ type: 'finish' });
            return plan(true);
          }
          if (key.kind === 'interrupt') return plan(true);
          say(NOT_FINISHED);
          continue;
        case 'help':
          // Any key closes the help and counts nothing; Ctrl-C still quits.
          mode = null;
          if (key.kind === 'interrupt') return plan(true);
          say('help closed: that key counted nothing');
          continue;
        case 'note': {
          const next = editLine(mode.text, key);
          if (next === 'quit') return plan(true);
          if (next === 'cancel') {
            mode = null;
            say('note cancelled: nothing recorded');
          } else if (next === 'enter') {
            const { text, stage: where } = parseNote(mode.text);
            if (!text && !where) {
              mode = null;
              say('empty note: nothing recorded');
            } else {
              stage({ type: 'note', text, grain: mode.grain, stage: where });
              say(`note recorded${mode.grain === null ? ' for the level' : ` on #${mode.grain} ${mode.taxon ?? ''}`}`.trimEnd());
              mode = null;
            }
          } else mode = { ...mode, text: next };
          continue;
        }
        case 'new-type': {
          const next = editLine(mode.text, key);
          if (next === 'quit') return plan(true);
          if (next === 'cancel') {
            mode = null;
            say('new type cancelled: nothing counted');
            continue;
          }
          if (next !== 'enter') {
            mode = { ...mode, text: next };
            continue;
          }
          const parsed = parseNewType(mode.text, GROUPS);
          if (!parsed.ok) {
            say(parsed.message, 'warning');
            continue;
          }
          const state = current();
          const known = Object.entries(state.keymap.keys).find(([, b]) => b.taxon === parsed.taxon);
          mode = null;
          if (known) {
            stage({ type: 'grain', taxon: parsed.taxon, traverse: state.traverse, key: known[0] });
            judge();
            say(`${parsed.taxon} is on key ${known[0]} already: one grain counted`);
            continue;
          }
          const freeKey = nextFreeKey(state.keymap);
          if (freeKey === null) {
            say('no free key left for a new type: add it to a keymap of your own', 'warning');
            continue;
          }
          stage({ type: 'taxon', taxon: parsed.taxon, group: parsed.group, key: freeKey });
          stage({ type: 'grain', taxon: parsed.taxon, traverse: state.traverse, key: freeKey });
          judge();
          say(`new type ${parsed.taxon} (${parsed.group}) on key ${freeKey}: one grain counted`);
          continue;
        }
        default:
          mode satisfies never;
      }
    }
    const state = current();
    const decision = decide(state, resolveKey(state.keymap, key));
    switch (decision.kind) {
      case 'record':
        stage(decision.payload);
        if (decision.payload.type === 'grain' || decision.payload.type === 'undo') judge();
        break;
      case 'say':
        say(decision.message);
        break;
      case 'confirm-finish':
        mode = { kind: 'confirm-finish' };
        say(FINISH_PROMPT, 'warning');
        break;
      case 'open':
        mode = decision.mode;
        message = decision.message === null ? null : { text: decision.message, tone: 'info' };
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
