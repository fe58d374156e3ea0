import type { Command } from '../keymap/resolve-key.js';
import type { EventPayload } from '../model/events.js';
import type { InputMode } from './input-mode.js';
import type { LevelState } from '../model/level-state.js';

export type Decision =
  | { readonly kind: 'record'; readonly payload: EventPayload }
  | { readonly kind: 'say'; readonly message: string }
  | { readonly kind: 'quit' }
  | { readonly kind: 'confirm-finish' }
  | { readonly kind: 'open'; readonly mode: InputMode; readonly message: string | null }
  | { readonly kind: 'nothing' };

/** The event a command should record in the current state, or why it records nothing. */
export function decide(state: LevelState, command: Command): Decision {
  switch (command.kind) {
    case 'tally':
      return { kind: 'record', payload: { type: 'grain', taxon: command.taxon, traverse: state.traverse, key: command.key } };
    case 'action':
      switch (command.action) {
        case 'undo':
          return state.stack
            ? { kind: 'record', payload: { type: 'undo', of: state.stack.seq } }
            : { kind: 'say', message: 'nothing to undo' };
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
      return { kind: 'say', message: `key "${command.label}" is not in the keymap: nothing counted` };
    case 'none':
      return { kind: 'nothing' };
    default:
      return command satisfies never;
  }
}
