import { describe, expect, it } from 'vitest';
import { HELP, MAIN_HELP } from '../../src/cli/help.js';

describe('the help texts', () => {
  it.each([['exine', MAIN_HELP], ...Object.entries(HELP)])('%s --help fits an 80-column terminal, so no line wraps mid-word', (_name, text) => {
    const long = text.split('\n').filter((l) => [...l].length > 80);
    expect(long).toEqual([]);
  });
});
