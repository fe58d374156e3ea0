import type { KeyPress } from '../input/key-press.js';
import type { CoreUi } from './core-view.js';

export type CoreAction = { readonly kind: 'open'; readonly index: number } | { readonly kind: 'quit' } | null;

/** One key on the core view: ↑↓ (or k j) move the selection, Enter opens the level, q, Esc or Ctrl-C quit. */
export function coreKey(ui: CoreUi, key: KeyPress, rowCount: number): { ui: CoreUi; action: CoreAction } {
  const move = (by: number) => ({ ui: { ...ui, selected: Math.max(0, Math.min(rowCount - 1, ui.selected + by)) }, action: null });
  switch (key.kind) {
    case 'up':
      return move(-1);
    case 'down':
      return move(1);
    case 'enter':
      return rowCount > 0 ? { ui, action: { kind: 'open', index: Math.min(ui.selected, rowCount - 1) } } : { ui, action: null };
    case 'escape':
    case 'interrupt':
      return { ui, action: { kind: 'quit' } };
    case 'char':
      if (key.char === 'q') return { ui, action: { kind: 'quit' } };
      if (key.char === 'k') return move(-1);
      if (key.char === 'j') return move(1);
      return { ui, action: null };
    default:
      return { ui, action: null };
  }
}
