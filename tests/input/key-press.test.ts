import { describe, expect, it } from 'vitest';
import { splitKeys, splitRaw } from '../../src/input/key-press.js';

describe('splitting what Ink delivers into keys', () => {
  it('splits a burst into one key per character, control bytes included, in order', () => {
    expect(splitKeys('ab\x7f\t', {})).toEqual([
      { kind: 'char', char: 'a' },
      { kind: 'char', char: 'b' },
      { kind: 'backspace' },
      { kind: 'tab' },
    ]);
    expect(splitKeys('aaab', {}).length).toBe(4);
  });

  it('reads Enter, Backspace (0x7f and 0x08), Tab and Ctrl-C inside a burst even though the flags say nothing', () => {
    expect(splitKeys('q\rw\b\x03', { return: false }).map((k) => k.kind)).toEqual(['char', 'enter', 'char', 'backspace', 'interrupt']);
  });

  it('takes a lone special key from the flags; Ink 6.8 reports Backspace as delete', () => {
    expect(splitKeys('', { delete: true })).toEqual([{ kind: 'backspace' }]);
    expect(splitKeys('', { backspace: true })).toEqual([{ kind: 'backspace' }]);
    expect(splitKeys('', { tab: true })).toEqual([{ kind: 'tab' }]);
    expect(splitKeys('', { return: true })).toEqual([{ kind: 'enter' }]);
    expect(splitKeys('', { escape: true })).toEqual([{ kind: 'escape' }]);
    expect(splitKeys('c', { ctrl: true })).toEqual([{ kind: 'interrupt' }]);
  });

  it('never turns Ctrl or Alt combinations into taxon keys', () => {
    expect(splitKeys('q', { ctrl: true })[0]?.kind).toBe('ignored');
    expect(splitKeys('q', { meta: true })[0]?.kind).toBe('ignored');
    expect(splitKeys('\x01', {})[0]?.kind).toBe('ignored');
  });

  it('keeps characters outside ASCII whole', () => {
    expect(splitKeys('é🌲', {})).toEqual([
      { kind: 'char', char: 'é' },
      { kind: 'char', char: '🌲' },
    ]);
  });
});

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
