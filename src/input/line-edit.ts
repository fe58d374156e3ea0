import type { KeyPress } from './key-press.js';

/** Longest line a person types (a note, a new type, a reason): a paste of megabytes stops here. */
export const TYPED_LINE_MAX = 2000;

/**
 * One key of a line being typed (a note, a new type, a reason): the text so far,
 * or what the key asked for. Tab types a space; other special keys change nothing.
 * Characters past TYPED_LINE_MAX are left out (`lineFull` says when to tell).
 */
export function editLine(text: string, key: KeyPress): string | 'enter' | 'cancel' | 'quit' {
  switch (key.kind) {
    case 'char':
      return text.length >= TYPED_LINE_MAX ? text : text + key.char;
    case 'backspace':
      return [...text].slice(0, -1).join('');
    case 'tab':
      return text.length >= TYPED_LINE_MAX ? text : `${text} `;
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

/** A key that typed nothing because the line is full. */
export const lineFull = (text: string, key: KeyPress): boolean => text.length >= TYPED_LINE_MAX && (key.kind === 'char' || key.kind === 'tab');

export const LINE_FULL_MESSAGE = `a typed line holds at most ${TYPED_LINE_MAX} characters: the rest was left out (Enter records what is there)`;
