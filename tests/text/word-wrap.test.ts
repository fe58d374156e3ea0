import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { wordWrap } from '../../src/text/word-wrap.js';

describe('wordWrap', () => {
  it('cuts at word breaks, never inside a word that fits', () => {
    expect(wordWrap('next: two levels with a pollen sum of 100 or more are needed', 20)).toEqual([
      'next: two levels',
      'with a pollen sum of',
      '100 or more are',
      'needed',
    ]);
  });

  it('splits a word longer than the line (a path, a hash)', () => {
    expect(wordWrap('hash 0123456789abcdef', 8)).toEqual(['hash', '01234567', '89abcdef']);
  });

  it('keeps at most maxLines, the last ending in … when words were left', () => {
    expect(wordWrap('one two three four five six', 9, 2)).toEqual(['one two', 'three…']);
    expect(wordWrap('one two', 9, 2)).toEqual(['one two']);
  });

  it('property: every line fits, and without a limit no word is lost', () => {
    const word = fc.string({ unit: fc.constantFrom('a', 'b', 'é', '7'), minLength: 1, maxLength: 30 });
    fc.assert(
      fc.property(fc.array(word, { minLength: 1, maxLength: 30 }), fc.integer({ min: 1, max: 80 }), (words, width) => {
        const text = words.join(' ');
        const lines = wordWrap(text, width);
        for (const l of lines) expect([...l].length).toBeLessThanOrEqual(width);
        expect(lines.join('').replace(/ /g, '')).toBe(words.join(''));
      }),
    );
  });
});
