import type { Command } from '../keymap/resolve-key.js';
import type { EventPayload } from '../model/events.js';
import type { InputMode } from './input-mode.js';
import type { LevelState } from '../model/level-state.js';

export type Decision =
  | { readonly kind: 'record'; readonly payload: EventPayload; readonly message?: string }
  | { readonly kind: 'say'; readonly message: string }
  /** A key that counts nothing: rung and flashed, so a miss-key is noticed without a look. */
  | { readonly kind: 'miss'; readonly message: string }
  | { readonly kind: 'quit' }
  | { readonly kind: 'confirm-finish' }
  | { readonly kind: 'open'; readonly mode: InputMode; readonly message: string | null }
  | { readonly kind: 'nothing' };

export const CF_PROMPT = 'cf.: the next taxon key counts a cf. grain of that taxon (the cf. key again cancels)';

/**
 * Undo takes back the last thing done at the eyepiece: the last grain that
 * counts, or a traverse change made after it (a mistaken Tab). Both stay in the file.
 */
function undoDecision(state: LevelState): Decision {
  const grain = state.stack;
  const change = state.traverseChanges.at(-1);
  if (change && (!grain || change.seq > grain.seq)) {
    return {
      kind: 'record',
      payload: { type: 'traverse-undo', of: change.seq, traverse: change.from },
      message: `undid the change to traverse ${change.to} (#${change.seq}): counting goes on in traverse ${change.from}`,
    };
  }
  if (!grain) return { kind: 'say', message: 'nothing to undo' };
  return {
    kind: 'record',
    payload: { type: 'undo', of: grain.seq },
    message: `undid #${grain.seq} ${grain.cf ? 'cf. ' : ''}${grain.taxon}, traverse ${grain.traverse}`,
  };
}

/** The event a command should record in the current state, or why it records nothing. */
export function decide(state: LevelState, command: Command): Decision {
  switch (command.kind) {
    case 'tally':
      return { kind: 'record', payload: { type: 'grain', taxon: command.taxon, traverse: state.traverse, key: command.key } };
    case 'action':
      switch (command.action) {
        case 'undo':
          return undoDecision(state);
        case 'cf':
          return { kind: 'open', mode: { kind: 'cf' }, message: CF_PROMPT };
        case 'traverse':
          return { kind: 'record', payload: { type: 'traverse', traverse: state.traverse + 1 } };
        case 'note': {
          const last = state.stack;
          return { kind: 'open', mode: { kind: 'note', grain: last?.seq ?? null, taxon: last?.taxon ?? null, text: '' }, message: null };
        }
        case 'help':
          return { kind: 'open', mode: { kind: 'help' }, message: null };
        case 'newType':
          return { kind: 'open', mode: { kind: 'new-type', text: '' }, message: null };
        default:
          return command.action satisfies never;
      }
    case 'quit':
      return { kind: 'quit' };
    case 'finish':
      return { kind: 'confirm-finish' };
    case 'unmapped':
      return { kind: 'miss', message: `key "${command.label}" is not in the keymap: nothing counted` };
    case 'none':
      return { kind: 'nothing' };
    default:
      return command satisfies never;
  }
}
