import { ACTION_NAMES, type ActionName, type Keymap } from './keymap.js';

/** One key cap on a drawing, in key widths from the top left. */
export interface GridKey {
  readonly key: string;
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

export interface KeyGrid {
  readonly kind: 'keypad' | 'keyboard';
  readonly keys: readonly GridKey[];
  readonly width: number;
  readonly height: number;
  /** Taxon keys the drawing has no place for (Ä, a capital …), listed beside it. */
  readonly offGrid: readonly string[];
}

const KEYBOARD_ROWS: readonly (readonly [string, number])[] = [
  ['1234567890-=', 0],
  ['qwertyuiop[]', 0.5],
  ["asdfghjkl;'", 0.75],
  ['zxcvbnm,./', 1.25],
];

// A numeric keypad: + and Enter are two rows tall, 0 two columns wide.
const KEYPAD: readonly GridKey[] = [
  { key: '/', x: 1, y: 0, w: 1, h: 1 },
  { key: '*', x: 2, y: 0, w: 1, h: 1 },
  { key: '-', x: 3, y: 0, w: 1, h: 1 },
  { key: '7', x: 0, y: 1, w: 1, h: 1 },
  { key: '8', x: 1, y: 1, w: 1, h: 1 },
  { key: '9', x: 2, y: 1, w: 1, h: 1 },
  { key: '+', x: 3, y: 1, w: 1, h: 2 },
  { key: '4', x: 0, y: 2, w: 1, h: 1 },
  { key: '5', x: 1, y: 2, w: 1, h: 1 },
  { key: '6', x: 2, y: 2, w: 1, h: 1 },
  { key: '1', x: 0, y: 3, w: 1, h: 1 },
  { key: '2', x: 1, y: 3, w: 1, h: 1 },
  { key: '3', x: 2, y: 3, w: 1, h: 1 },
  { key: 'enter', x: 3, y: 3, w: 1, h: 2 },
  { key: '0', x: 0, y: 4, w: 2, h: 1 },
  { key: '.', x: 2, y: 4, w: 1, h: 1 },
];
const KEYPAD_KEYS = new Set(KEYPAD.map((k) => k.key));

const KEYBOARD: readonly GridKey[] = [
  ...KEYBOARD_ROWS.flatMap(([row, shift], y) => [...row].map((key, i) => ({ key, x: shift + i, y, w: 1, h: 1 }))),
  { key: ' ', x: 3.5, y: 4, w: 6, h: 1 },
];
const KEYBOARD_KEYS = new Set(KEYBOARD.map((k) => k.key));

/** The action a key does under this keymap, if any ("space" names the space bar). */
export function actionOn(keymap: Keymap, key: string): ActionName | null {
  const name = key === ' ' ? 'space' : key;
  return ACTION_NAMES.find((a) => keymap.actions[a] === name) ?? null;
}

/** A keypad keymap: every taxon key on the numeric keypad. */
export function onKeypad(keymap: Keymap): boolean {
  return keymap.order.every((k) => KEYPAD_KEYS.has(k));
}

/** Where each key of the keymap sits on the keyboard or keypad it is used on. */
export function keyGrid(keymap: Keymap): KeyGrid {
  if (onKeypad(keymap)) return { kind: 'keypad', keys: KEYPAD, width: 4, height: 5, offGrid: [] };
  const used = (k: GridKey) => keymap.keys[k.key] !== undefined || actionOn(keymap, k.key) !== null;
  // The space bar and the lowest rows only when something is on them.
  const lastRow = Math.max(0, ...KEYBOARD.filter(used).map((k) => k.y));
  const keys = KEYBOARD.filter((k) => k.y <= lastRow);
  return {
    kind: 'keyboard',
    keys,
    width: 12.5,
    height: lastRow + 1,
    offGrid: keymap.order.filter((k) => !KEYBOARD_KEYS.has(k)),
  };
}
