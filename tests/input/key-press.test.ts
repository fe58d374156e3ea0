import { describe, expect, it } from 'vitest';
import { splitRaw } from '../../src/input/key-press.js';

describe('splitting raw terminal input into keys', () => {
  const kinds = (s: string) => splitRaw(s).map((k) => (k.kind === 'char' ? k.char : k.kind));

  it('reads an Esc and the key after it as two keys, whatever the key (Ink would read Alt+key)', () => {
    expect(kinds('q\x1bq')).toEqual(['q', 'escape', 'q']);
    expect(kinds('\x1b.')).toEqual(['escape', '.']);
    expect(kinds('\x1b\x1b')).toEqual(['escape', 'escape']);
    expect(kinds('\x1b\r')).toEqual(['escape', 'enter']);
    expect(kinds('\x1b\x7f')).toEqual(['escape', 'backspace']);
    expect(kinds('\x1b')).toEqual(['escape']);
  });

  it('reads the cursor keys, with or without modifiers, and drops other escape sequences as special keys', () => {
    expect(kinds('\x1b[A\x1b[B\x1bOC\x1b[1;5D')).toEqual(['up', 'down', 'right', 'left']);
    expect(kinds('a\x1b[15~b')).toEqual(['a', 'ignored', 'b']);
    expect(kinds('\x1b\x1b[A')).toEqual(['escape', 'up']);
  });

  it('keeps every code point, control bytes and astral characters included, in order', () => {
    expect(kinds('ab\x7f\t\r\x03\x06')).toEqual(['a', 'b', 'backspace', 'tab', 'enter', 'interrupt', 'finish']);
    expect(kinds('😀x')).toEqual(['😀', 'x']);
    expect(kinds('\x01\x9b')).toEqual(['ignored', 'ignored']);
  });
});

describe('characters no one means to type', () => {
  it('drops direction overrides, zero-width marks and C1 controls instead of taking them as keys or note text', () => {
    expect(splitRaw('a\u202eb\u200bc\u009b').map((k) => k.kind)).toEqual(['char', 'ignored', 'char', 'ignored', 'char', 'ignored']);
  });
});
