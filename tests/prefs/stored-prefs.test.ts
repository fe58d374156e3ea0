import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { storedPrefProblem } from '../../src/prefs/stored-prefs.js';

// The schema the preferences were checked with while they were read through conf (kept here as the reference).
const STORED = z
  .object({
    bell: z.boolean(),
    rare: z.number().int().min(1).max(100),
    break: z.number().int().min(1).max(600).nullable(),
    keymap: z.string().min(1),
    analyst: z.string().nullable(),
  })
  .partial()
  .loose();

const anyValue = fc.oneof(
  fc.boolean(),
  fc.constant(null),
  fc.integer({ min: -5, max: 700 }),
  fc.double(),
  fc.constantFrom(0, 1, 100, 101, 600, 601, 2.5, Number.MAX_SAFE_INTEGER + 1),
  fc.string({ maxLength: 4 }),
  fc.array(fc.integer(), { maxLength: 2 }),
  fc.object({ maxDepth: 1 }),
);
const record = fc.record(
  { bell: anyValue, rare: anyValue, break: anyValue, keymap: anyValue, analyst: anyValue, later: anyValue },
  { requiredKeys: [] },
);

describe('stored preferences, checked by hand', () => {
  it('accept exactly what the former zod schema accepted', () => {
    fc.assert(
      fc.property(fc.oneof(record, anyValue), (v) => {
        expect(storedPrefProblem(v) === null).toBe(STORED.safeParse(v).success);
      }),
      { numRuns: 5000 },
    );
  });

  it('name the field and the value', () => {
    expect(storedPrefProblem({ rare: 'many' })).toBe('"rare" must be a whole number from 1 to 100, not "many"');
    expect(storedPrefProblem({ break: 0 })).toBe('"break" must be a whole number from 1 to 600 or null, not 0');
    expect(storedPrefProblem([])).toBe('the file must hold one JSON object');
    expect(storedPrefProblem({ bell: false, break: null, analyst: null, keymap: 'keypad', rare: 3, colour: 'red' })).toBeNull();
  });
});

describe('the preferences folder', () => {
  it('is where conf kept it: XDG_CONFIG_HOME/exine, else ~/.config/exine (Linux)', async () => {
    const { configDir } = await import('../../src/prefs/preferences.js');
    const { homedir } = await import('node:os');
    if (process.platform !== 'linux') return;
    expect(configDir({ XDG_CONFIG_HOME: '/cfg' })).toBe('/cfg/exine');
    expect(configDir({})).toBe(`${homedir()}/.config/exine`);
    expect(configDir({ EXINE_CONFIG_DIR: '/t', XDG_CONFIG_HOME: '/cfg' })).toBe('/t');
  });
});
