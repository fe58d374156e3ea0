import { readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { rulesFromFlags, spikeFromFlags } from '../../src/cli/rule-flags.js';
import { UsageError } from '../../src/errors.js';
import { GROUPS } from '../../src/keymap/groups.js';
import { parseKeymap } from '../../src/keymap/parse-keymap.js';
import { scanLog } from '../../src/log/scan-log.js';
import { AppendError } from '../../src/log/session-writer.js';
import { verdictOf } from '../../src/log/verify-log.js';
import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import type { EventPayload } from '../../src/model/events.js';
import { createLevel, readLevel, resumeLevel } from '../../src/session/session-files.js';
import { grain, newLevelFile, openPayload, sessionText, TINY_KEYMAP } from '../helpers/levels.js';
import { tempDir } from '../helpers/temp-dir.js';

const INFO = { level: 'R-1', depth: 5, site: 'Test Mere', core: 'TM-1', slide: 'A', analyst: null };

describe('a level exine writes is a level exine reads', () => {
  it('keeps a taxon on the help and new-type keys, with those actions recorded as having no key', () => {
    const parsed = parseKeymap(
      JSON.stringify({ name: 'odd', keys: { '?': { taxon: 'Indet.', group: 'indeterminable' }, '=': { taxon: 'Cf. Tilia', group: 'trees' }, a: { taxon: 'Alnus', group: 'trees' } } }),
      'odd.json',
    );
    if (!parsed.ok) throw new Error(parsed.message);
    expect(parsed.keymap.actions).toMatchObject({ help: null, newType: null });
    const path = join(tempDir(), 'odd.jsonl');
    createLevel(path, { info: INFO, keymap: parsed.keymap, rules: DEFAULT_RULES, spike: null }).writer.close();
    expect(readFileSync(path, 'utf8')).toContain('"help":null');
    const { scan, state } = readLevel(path);
    expect(scan.corruption).toBeNull();
    expect(state.keymap.keys['?']).toEqual({ taxon: 'Indet.', group: 'indeterminable' });
  });

  it('refuses a whole-number flag beyond what the file holds exactly, naming the flag', () => {
    const attempt = () => rulesFromFlags({ target: '99999999999999999999' }, TINY_KEYMAP, null, null);
    expect(attempt).toThrow(UsageError);
    expect(attempt).toThrow(/--target must be at most 9007199254740991, not "99999999999999999999"/);
    expect(() => spikeFromFlags({ tablets: '9007199254740992', 'per-tablet': '1', volume: '1' }, null)).toThrow(/--tablets must be at most/);
    expect(rulesFromFlags({ target: '9007199254740991' }, TINY_KEYMAP, null, null)?.targetSum).toBe(Number.MAX_SAFE_INTEGER);
  });

  it('the writer refuses an event the reader would refuse, and the file stays as it was', () => {
    const dir = tempDir();
    const { path, writer } = newLevelFile(dir);
    const before = statSync(path).size;
    const bad = { type: 'rules', rules: { ...DEFAULT_RULES, targetSum: 2 ** 60 }, spike: null } as EventPayload;
    expect(() => writer.append(bad)).toThrow(AppendError);
    expect(() => writer.append(bad)).toThrow(/would not read back \(line 3 is not a valid event/);
    expect(() => writer.append({ type: 'grain', taxon: '', traverse: 1, key: 'a' })).toThrow(/would not read back/);
    expect(statSync(path).size).toBe(before);
    // Nothing went read-only: the next good event is written with the next seq.
    expect(writer.append(grain('Alnus')).seq).toBe(3);
    writer.close();
    expect(readLevel(path).state.counts).toEqual({ Alnus: 1 });
  });

  it('property: any keymap the keymap check accepts and any rule flags the flag check accepts make a level that reads back (fast-check)', () => {
    const keyChar = fc.oneof(fc.constantFrom('?', '=', ' ', '.', '0', '+', '-', '*', '/', 'é', 'ß', 'Ω', '中'), fc.string({ minLength: 1, maxLength: 1 }));
    const binding = fc.record({ taxon: fc.string({ minLength: 1, maxLength: 12 }), group: fc.constantFrom(...GROUPS) });
    const actions = fc.dictionary(fc.constantFrom('undo', 'traverse', 'note', 'help', 'newType'), fc.oneof(fc.constantFrom('backspace', 'tab', 'enter', 'escape', '?', '=', '!', null), fc.string({ maxLength: 2 })), { maxKeys: 2 });
    const keymapValue = fc.record({ name: fc.string({ minLength: 1, maxLength: 10 }), keys: fc.dictionary(keyChar, binding, { minKeys: 1, maxKeys: 8 }), actions: fc.option(actions, { nil: undefined, freq: 2 }) });
    // Mostly values the flags accept, with the edges (the largest whole number, tiny and huge doubles) among them.
    const wholeish = fc.oneof(
      { weight: 12, arbitrary: fc.integer({ min: 1, max: 2000 }).map(String) },
      { weight: 1, arbitrary: fc.constantFrom('9007199254740991', '9007199254740992', '1e3', '0', '12.5', '99999999999999999999') },
    );
    const numberish = fc.oneof(
      { weight: 12, arbitrary: fc.double({ min: 1e-6, max: 0.999, noNaN: true }).map(String) },
      { weight: 1, arbitrary: fc.double({ noNaN: true }).map(String) },
      { weight: 1, arbitrary: fc.constantFrom('0.5', '95%', '1', '1e308', '5e-324', '-0', '100', '1e-7') },
    );
    const ruleFlags = fc.record({ target: wholeish, plateau: wholeish, markers: wholeish, 'min-sum': wholeish, coverage: numberish, precision: numberish, 'precision-share': numberish }, { requiredKeys: [] });
    const spikeFlags = fc.option(fc.record({ tablets: wholeish, 'per-tablet': numberish, 'per-tablet-sd': numberish, volume: numberish, 'accumulation-rate': numberish, 'conc-error': numberish }), { nil: {} });
    const flags = fc.tuple(ruleFlags, spikeFlags).map(([r, s]) => ({ ...r, ...s }) as Record<string, string>);
    const dir = tempDir();
    let made = 0;
    fc.assert(
      fc.property(keymapValue, flags, (value, given) => {
        const parsed = parseKeymap(JSON.stringify(value), 'random.json');
        if (!parsed.ok) return;
        let rules;
        let spike;
        try {
          spike = spikeFromFlags(given, null);
          rules = rulesFromFlags(given, parsed.keymap, null, spike) ?? DEFAULT_RULES;
        } catch (error) {
          if (error instanceof UsageError) return;
          throw error;
        }
        const path = join(dir, `level-${++made}.jsonl`);
        const opened = createLevel(path, { info: INFO, keymap: parsed.keymap, rules, spike }, {});
        const key = Object.keys(parsed.keymap.keys)[0] as string;
        opened.writer.append({ type: 'grain', taxon: (parsed.keymap.keys[key] as { taxon: string }).taxon, traverse: 1, key });
        opened.writer.close();
        const scan = scanLog(readFileSync(path));
        expect(scan.corruption?.message ?? null).toBeNull();
        expect(scan.keymap).toEqual(parsed.keymap);
        // And it opens again for counting, as the next day's sitting would.
        resumeLevel(path).writer.close();
      }),
      { numRuns: 300 },
    );
    expect(made).toBeGreaterThan(20);
  });
});

describe('every reference in a session file points at something', () => {
  const base: EventPayload[] = [openPayload(), { type: 'sitting', sitting: 1 }, grain('Alnus'), grain('Betula')];
  const cases: [string, EventPayload, RegExp][] = [
    ['an undo of a seq that does not exist', { type: 'undo', of: 40 }, /line 5 is an undo of #40, which is not an earlier grain line/],
    ['an undo of line 1', { type: 'undo', of: 1 }, /line 5 is an undo of #1, which is not an earlier grain line/],
    ['a void of a line that is not a grain', { type: 'void', grain: 2, traverse: null, reason: 'x' }, /line 5 is a void of #2, which is not an earlier grain line/],
    ['a restore of what was not voided', { type: 'restore', of: 3, reason: 'x' }, /line 5 is a restore of #3, which is not an earlier void line/],
    ['a note on a missing grain', { type: 'note', text: 'x', grain: 9, stage: null }, /line 5 is a note on #9, which is not an earlier grain line/],
  ];
  for (const [what, payload, message] of cases) {
    it(`refuses ${what}, naming the line, in verify and at resume`, () => {
      const path = join(tempDir(), 'level.jsonl');
      writeFileSync(path, sessionText([...base, payload, { type: 'close' }]));
      const verdict = verdictOf('level.jsonl', scanLog(readFileSync(path)));
      expect(verdict.intact).toBe(false);
      expect(verdict.summary).toMatch(message);
      expect(() => resumeLevel(path)).toThrow(message);
    });
  }

  it('accepts the references exine writes', () => {
    const path = join(tempDir(), 'level.jsonl');
    const ok: EventPayload[] = [...base, { type: 'undo', of: 4 }, { type: 'note', text: 'folded', grain: 3, stage: null }, { type: 'void', grain: 3, traverse: null, reason: 'x' }, { type: 'restore', of: 7, reason: 'y' }, { type: 'close' }];
    writeFileSync(path, sessionText(ok));
    expect(verdictOf('level.jsonl', scanLog(readFileSync(path))).intact).toBe(true);
  });
});
