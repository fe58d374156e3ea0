import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { GROUPS } from '../../src/keymap/groups.js';
import { keymapShape } from '../../src/keymap/keymap-schema.js';
import { isPlainKeymap } from '../../src/keymap/keymap-shape.js';
import { eventSchema } from '../../src/log/event-schema.js';
import { HAND_CHECKS, ISO_MS, passesHandCheck } from '../../src/log/hand-checks.js';
import { RULE_NAMES } from '../../src/rules/rule-set.js';

const number = fc.oneof(
  fc.constantFrom(0, 1, 2, 3, 7, 100, 101, 600, -1, 0.5, 1.5, 99.5, Number.MAX_SAFE_INTEGER + 1, Infinity, -0),
  fc.integer({ min: -3, max: 1e6 }),
  fc.double({ noNaN: true }),
);
const text = fc.oneof(
  fc.constantFrom('', ' ', '  x ', 'a', 'A', 'Alnus', 'abcdefgh', 'x'.repeat(32), '\x7f', '\u0301', 'all', 'any', ...GROUPS, ...RULE_NAMES),
  fc.constantFrom('2026-11-02T09:00:00.000Z', '2024-02-29T10:00:00.000Z', '2026-02-29T10:00:00.000Z', '2026-11-02T09:00:00Z', '2026-11-02T24:00:00.000Z'),
  fc.string({ maxLength: 3 }),
);
const rules = fc.record(
  {
    targetSum: fc.oneof(number, fc.constant(null)),
    precision: fc.oneof(
      fc.constant(null),
      fc.record({ halfWidth: number, share: fc.oneof(number, fc.constant(null)), taxa: fc.oneof(fc.constant(null), fc.array(text, { maxLength: 2 })) }, { requiredKeys: [] }),
    ),
    coverage: fc.oneof(number, fc.constant(null)),
    plateau: fc.oneof(number, fc.constant(null)),
    markers: fc.oneof(number, fc.constant(null)),
    concError: fc.oneof(number, fc.constant(null)),
    mode: text,
    minSum: fc.oneof(number, fc.constant(null)),
  },
  { requiredKeys: [] },
);
const spike = fc.record(
  {
    tablets: number,
    perTablet: number,
    perTabletSd: fc.oneof(number, fc.constant(null)),
    volume: fc.oneof(number, fc.constant(null)),
    mass: fc.oneof(number, fc.constant(null)),
    accumulationRate: fc.oneof(number, fc.constant(null)),
  },
  { requiredKeys: [] },
);
const anyValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: number },
  { weight: 4, arbitrary: text },
  { weight: 2, arbitrary: fc.constant(null) },
  fc.boolean(),
  fc.array(text, { maxLength: 3 }),
  fc.record({ x: number, y: number }, { requiredKeys: [] }),
  rules,
  spike,
);

// A valid line of each kind: from the demo sessions, and written here for kinds they lack.
const demoDir = join(import.meta.dirname, '../../demo-sessions');
const demoLines = readdirSync(demoDir)
  .filter((f) => f.endsWith('.jsonl'))
  .flatMap((f) => readFileSync(join(demoDir, f), 'utf8').split('\n').filter(Boolean).map((l) => JSON.parse(l) as Record<string, unknown>));
const stamp = { seq: 5, at: '2026-11-02T09:00:00.000Z', prev: 'f'.repeat(64) };
const templates = new Map<string, Record<string, unknown>[]>();
for (const v of [
  ...demoLines,
  { ...stamp, type: 'repair', damage: 'torn', line: 5, cutBytes: 10, backup: 'x.bak' },
  { ...stamp, type: 'rules', rules: { targetSum: 300, precision: { halfWidth: 5, share: 10, taxa: ['Alnus'] }, mode: 'all' }, spike: { tablets: 1, perTablet: 9666, perTabletSd: null, volume: 1, mass: null, accumulationRate: null } },
  { ...stamp, type: 'void', grain: null, traverse: 2, reason: 'r' },
  { ...stamp, type: 'slide', slide: 'B', traverse: 9 },
  { ...stamp, type: 'traverse-undo', of: 4, traverse: 3 },
  { ...stamp, type: 'reopen', reason: 'a type missed at first' },
  { ...stamp, type: 'note', text: 't', grain: null, stage: { x: 1, y: 2.5 } },
  { ...stamp, type: 'slide', slide: 'KM1-012-B', traverse: 3 },
  { ...stamp, type: 'traverse-undo', of: 4, traverse: 2 },
  { ...stamp, type: 'reopen', reason: 'recount the last traverse' },
  { ...stamp, type: 'grain', taxon: 'Tilia', traverse: 1, key: 't', cf: true },
]) {
  const list = templates.get(v.type as string) ?? [];
  if (list.length < 20) list.push(v);
  templates.set(v.type as string, list);
}

/** Records of `kind`: a valid line with some of its fields, and of the fields its schema knows (other helpers' too), replaced or left out. */
function recordsOf(kind: string, schema: z.ZodObject): fc.Arbitrary<Record<string, unknown>> {
  const names = [...new Set([...Object.keys(schema.shape), ...Object.keys(stamp)])].filter((k) => k !== 'type');
  const base = fc.constantFrom(...(templates.get(kind) ?? [{ ...stamp, type: kind }]));
  const changes = fc.dictionary(fc.constantFrom(...names), fc.oneof(anyValue, fc.constant(undefined)), { maxKeys: 3 });
  return fc.tuple(base, changes).map(([b, c]) => {
    const v: Record<string, unknown> = { ...b, type: kind };
    for (const [k, x] of Object.entries(c)) {
      if (x === undefined) delete v[k];
      else v[k] = x;
    }
    return v;
  });
}

const objectOf = (o: unknown): z.ZodObject => ('shape' in (o as object) ? (o as z.ZodObject) : ((o as { def: { in: z.ZodObject } }).def.in ?? o) as z.ZodObject);
const kinds = eventSchema.options.map((o) => [(objectOf(o).shape.type as z.ZodLiteral).value as string, o as z.ZodType, objectOf(o)] as const);

/** Runs a hand check on generated values and holds every value it accepts to the schema; how many it accepted. */
function acceptedOnlyAsSchema<T>(values: fc.Arbitrary<T>, check: (v: T) => boolean, schema: z.ZodType, numRuns: number): number {
  let accepted = 0;
  fc.assert(
    fc.property(values, (v) => {
      if (check(v)) {
        accepted++;
        expect(schema.safeParse(v).success).toBe(true);
      }
    }),
    { numRuns },
  );
  return accepted;
}

describe('hand checks of session lines', () => {
  it('exist only for kinds the schema knows', () => {
    const known = new Set(kinds.map(([k]) => k));
    for (const kind of HAND_CHECKS.keys()) expect(known.has(kind), kind).toBe(true);
  });

  it("use zod's own pattern for the time stamp", () => {
    expect(ISO_MS.source).toBe(z.core.regexes.datetime({ precision: 3, offset: false, local: false }).source);
  });

  it.each(kinds.filter(([k]) => HAND_CHECKS.has(k)).map(([k, schema, object]) => [k, schema, object] as const))(
    'property: the %s check accepts only what its zod schema accepts (fast-check)',
    (kind, schema, object) => {
      const check = HAND_CHECKS.get(kind) as (v: Record<string, unknown>) => boolean;
      // The records are valid lines with a few fields changed: a kind with a hand check needs one here.
      expect(templates.has(kind), `add a valid "${kind}" line to the templates of this test`).toBe(true);
      const accepted = acceptedOnlyAsSchema(recordsOf(kind, object), check, schema, 3000);
      // Otherwise the property held only because nothing passed.
      expect(accepted).toBeGreaterThan(100);
    },
  );

  it('pass every line of the demo sessions (a good file never needs zod)', () => {
    for (const v of demoLines) expect(passesHandCheck(v), JSON.stringify(v).slice(0, 80)).toBe(true);
    expect(demoLines.length).toBeGreaterThan(1000);
  });

  it('leave a kind without a check of its own to the schema', () => {
    expect(passesHandCheck({ type: 'slide-change', seq: 2, at: '2026-11-02T09:00:00.000Z', prev: 'x' })).toBe(false);
  });
});

describe('the hand check of a keymap shape', () => {
  const binding = fc.oneof(fc.record({ taxon: anyValue, group: anyValue, inSum: fc.oneof(fc.constant(false), anyValue), later: anyValue }, { requiredKeys: [] }), anyValue);
  const keymap = fc.record(
    {
      name: anyValue,
      keys: fc.oneof(fc.dictionary(fc.constantFrom('a', 'b', 'Q', '1'), binding, { maxKeys: 3 }), anyValue),
      actions: fc.oneof(fc.dictionary(fc.constantFrom('undo', 'help', 'x'), fc.oneof(text, fc.constant(null), number), { maxKeys: 2 }), anyValue),
      sum: fc.oneof(fc.array(fc.oneof(text, number), { maxLength: 3 }), anyValue),
      groups: anyValue,
      order: fc.oneof(fc.array(fc.oneof(text, number), { maxLength: 3 }), anyValue),
    },
    { requiredKeys: [] },
  );

  it('property: accepts only what the zod shape accepts (fast-check)', () => {
    const accepted = acceptedOnlyAsSchema(keymap, isPlainKeymap, keymapShape, 5000);
    expect(accepted).toBeGreaterThan(0);
  });

  it('accepts the bundled keymaps', () => {
    const dir = join(import.meta.dirname, '../../keymaps');
    for (const file of readdirSync(dir).filter((f) => f.endsWith('.json'))) expect(isPlainKeymap(JSON.parse(readFileSync(join(dir, file), 'utf8'))), file).toBe(true);
  });
});

describe('the time stamp check', () => {
  it('property: gives the verdict of zod\'s pattern whatever date it saw before (fast-check)', () => {
    const stampAt = (at: string) => passesHandCheck({ type: 'close', seq: 2, at, prev: 'x' });
    const day = fc.constantFrom('2026-11-02', '2024-02-29', '2026-02-29', '2026-13-01', '2026-11-31', '1900-02-29', '2000-02-29');
    const time = fc.constantFrom('T09:00:00.000Z', 'T23:59:59.999Z', 'T24:00:00.000Z', 'T09:60:00.000Z', 'T09:00:00Z', 'T09:00:00.0000Z', ' 09:00:00.000Z');
    // The time is read character by character: any character at any place of a time of the right
    // length, the neighbours of the digits ('/' and ':') and the limits of each field among them.
    const char = fc.constantFrom(...'0123456789/:.TZtz 9'.split(''), '\u0660');
    const anyTime = fc.array(char, { minLength: 14, maxLength: 14 }).map((cs) => cs.join(''));
    const nearTime = fc.tuple(fc.constantFrom('T09:00:00.000Z', 'T23:59:59.999Z', 'T19:09:09.009Z', 'T20:50:50.500Z'), fc.nat(13), char).map(([t, i, c]) => t.slice(0, i) + c + t.slice(i + 1));
    const at = fc.oneof(fc.tuple(day, fc.oneof(time, anyTime, nearTime)).map(([d, t]) => d + t), fc.string({ maxLength: 26 }));
    fc.assert(
      fc.property(fc.array(at, { minLength: 1, maxLength: 6 }), (list) => {
        for (const a of list) expect(stampAt(a)).toBe(ISO_MS.test(a));
      }),
      { numRuns: 2000 },
    );
  });
});
