import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { flagCases, keymapCases, sessionCases, type FaultCase } from '../../src/bench/fault-cases.js';
import { isFailure, runFaultCase } from '../../src/bench/fault-run.js';
import { tempDir } from '../helpers/temp-dir.js';

// The bounded part of the fault suite; `npm run bench -- --only faults` runs thousands of cases.
// A failure is a stack trace, an error not in one line, a hang over 5 s, a level that exine
// wrote (or was given readable) and then cannot read, or a control character printed raw.
const RUNS = 40;

async function holds(arbitrary: fc.Arbitrary<FaultCase>, runs: number, child = false) {
  const root = tempDir();
  await fc.assert(
    fc.asyncProperty(arbitrary, async (c) => {
      const v = await runFaultCase(c, root, child);
      expect(isFailure(v), v.detail).toBe(false);
    }),
    { numRuns: runs },
  );
}

describe('hostile input never breaks a promise', () => {
  it('session files: bit flips, cuts, NUL padding, inserted text, chained random events, dropped and swapped lines', () => holds(sessionCases(), RUNS));
  it('keymaps: the bundled ones damaged, a value replaced by an odd one, random JSON', () => holds(keymapCases(), RUNS));
  it('flags of count (created and resumed), summary, export, audit, verify and keys', () => holds(flagCases(), RUNS));
  it('a sample of each through the real program', () => holds(fc.oneof(sessionCases(), keymapCases(), flagCases()), 3, true));
});
