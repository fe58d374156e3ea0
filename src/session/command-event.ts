import type { Command } from '../keymap/resolve-key.js';
import type { EventPayload } from './events.js';
import type { LevelState } from './level-state.js';

export type Decision =
  | { readonly kind: 'record'; readonly payload: EventPayload }
  | { readonly kind: 'say'; readonly message: string }
  | { readonly kind: 'quit' }
  | { readonly kind: 'confirm-finish' }
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
        case 'note':
          return { kind: 'say', message: 'notes are not in this version yet: write it down for now' };
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
