import { describe, expect, it } from 'vitest';
import { GROUPS } from '../../src/keymap/groups.js';
import { parseNewType, parseNote } from '../../src/session/input-mode.js';
import { nextFreeKey } from '../../src/session/free-key.js';
import { TINY_KEYMAP, lowland } from '../helpers/levels.js';

describe('typed lines', () => {
  it.each([
    ['cf. Tilia cordata', 'cf. Tilia cordata', null],
    ['@12.4,88.1 cf. Tilia', 'cf. Tilia', { x: 12.4, y: 88.1 }],
    ['torn @ 3 ; -7.5', 'torn', { x: 3, y: -7.5 }],
    ['@10 20', '', { x: 10, y: 20 }],
    ['x 12 y 13', 'x 12 y 13', null],
  ])('a note "%s" is text "%s" and stage %j', (input, text, stage) => {
    expect(parseNote(input)).toEqual({ text, stage });
  });

  it('a new type is "name, group"; the group may be shortened', () => {
    expect(parseNewType('Ilex aquifolium, shrubs', GROUPS)).toEqual({ ok: true, taxon: 'Ilex aquifolium', group: 'shrubs' });
    expect(parseNewType('Ilex, sh', GROUPS)).toEqual({ ok: true, taxon: 'Ilex', group: 'shrubs' });
    expect(parseNewType('Ilex', GROUPS)).toMatchObject({ ok: false, message: /add its group/ });
    expect(parseNewType('Ilex, s', GROUPS)).toMatchObject({ ok: false, message: /"s" is not one group/ });
    expect(parseNewType(', herbs', GROUPS)).toMatchObject({ ok: false });
  });

  it('the next free key skips keys of taxa and actions', () => {
    expect(nextFreeKey(TINY_KEYMAP)).toBe('A');
    expect(nextFreeKey({ ...TINY_KEYMAP, keys: { ...TINY_KEYMAP.keys, A: { taxon: 'X', group: 'other' } } })).toBe('B');
    // The lowland keymap uses letters and 1-5: capitals are free.
    expect(nextFreeKey(lowland())).toBe('A');
  });
});
