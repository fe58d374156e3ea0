import { describe, expect, it } from 'vitest';
import { parseFlags } from '../../src/cli/parse-flags.js';
import { UsageError } from '../../src/errors.js';

describe('flags a person types', () => {
  it.each([
    ['--site', 'Kestrel\x1b]0;owned\x07Mere', 'Kestrel\\u{1b}]0;owned\\u{7}Mere'],
    ['--slide', 'A\u202eB', 'A\\u{202e}B'],
    ['--level', 'KM\u200b-1', 'KM\\u{200b}-1'],
  ])('refuse %s with a control or invisible character, showing it escaped', (flag, value, shown) => {
    const attempt = () => parseFlags('count', [`${flag}=${value}`, 'f.jsonl'], { site: { type: 'string' }, slide: { type: 'string' }, level: { type: 'string' } });
    expect(attempt).toThrow(UsageError);
    expect(attempt).toThrow(`exine count: ${flag} has a control or invisible character ("${shown}"); type it plainly`);
  });

  it('take plain names, accents and all', () => {
    expect(parseFlags('count', ['--site', 'Lac de Crécy', 'f.jsonl'], { site: { type: 'string' } }).values.site).toBe('Lac de Crécy');
  });
});
