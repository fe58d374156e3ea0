import type { KeyPress } from './key-press.js';

/**
 * One key of a line being typed (a note, a new type, a reason): the text so far,
 * or what the key asked for. Tab types a space; other special keys change nothing.
 */
export function editLine(text: string, key: KeyPress): string | 'enter' | 'cancel' | 'quit' {
  switch (key.kind) {
    case 'char':
      return text + key.char;
    case 'backspace':
      return [...text].slice(0, -1).join('');
    case 'tab':
      return `${text} `;
    case 'enter':
      return 'enter';
    case 'escape':
      return 'cancel';
    case 'interrupt':
      return 'quit';
    default:
      return text;
  }
}
