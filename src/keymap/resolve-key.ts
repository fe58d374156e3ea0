import type { KeyPress } from '../input/key-press.js';
import type { ActionName, Keymap, KeyName } from './keymap.js';

export type Command =
  | { readonly kind: 'tally'; readonly key: string; readonly taxon: string }
  | { readonly kind: 'action'; readonly action: ActionName }
  | { readonly kind: 'quit' }
  | { readonly kind: 'finish' }
  | { readonly kind: 'unmapped'; readonly label: string }
  | { readonly kind: 'none' };

function keyNameOf(press: KeyPress): KeyName | null {
  switch (press.kind) {
    case 'char':
      return press.char === ' ' ? 'space' : press.char;
    case 'backspace':
      return 'backspace';
    case 'tab':
      return 'tab';
    case 'enter':
      return 'enter';
    case 'escape':
      return 'escape';
    default:
      return null;
  }
}

/** What a key means under a keymap. Ctrl-C (quit) and Ctrl-F (finish the level) cannot be mapped. */
export function resolveKey(keymap: Keymap, press: KeyPress): Command {
  if (press.kind === 'interrupt') return { kind: 'quit' };
  if (press.kind === 'finish') return { kind: 'finish' };
  const name = keyNameOf(press);
  if (name === null) return { kind: 'none' };
  for (const [action, key] of Object.entries(keymap.actions)) {
    if (key === name) return { kind: 'action', action: action as ActionName };
  }
  if (press.kind === 'char') {
    const binding = keymap.keys[press.char];
    if (binding) return { kind: 'tally', key: press.char, taxon: binding.taxon };
    return { kind: 'unmapped', label: press.char === ' ' ? 'Space' : press.char };
  }
  return { kind: 'none' };
}
