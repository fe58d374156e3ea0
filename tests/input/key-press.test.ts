import { describe, expect, it } from 'vitest';
import { splitKeys } from '../../src/input/key-press.js';

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
