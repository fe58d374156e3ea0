import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { parse } from 'jsonc-parser';
import { BUNDLED_KEYMAP_DIR, loadKeymap } from '../keymap/load-keymap.js';
import { encodeLine } from '../log/line-codec.js';
import { FORMAT_VERSION, type EventPayload } from '../model/events.js';
import { DEFAULT_RULES } from '../rules/rule-set.js';

/** One hostile input: a session file's bytes, a keymap file's bytes, or a command line. */
export type FaultCase =
  | { readonly kind: 'session'; readonly how: string; readonly bytes: Buffer; readonly args: readonly string[] }
  | { readonly kind: 'keymap'; readonly how: string; readonly bytes: Buffer }
  | { readonly kind: 'flags'; readonly how: string; readonly command: string; readonly args: readonly string[]; readonly existing: boolean };

const START = Date.parse('2026-11-02T09:00:00.000Z');

/** Session lines as exine writes them: the hash chain holds, so the content checks are reached. */
export function chained(payloads: readonly unknown[]): Buffer {
  let prev = '';
  return Buffer.from(
    payloads
      .map((p, i) => {
        const { line, hash } = encodeLine(p as EventPayload, { seq: i + 1, at: new Date(START + i * 1000).toISOString() }, prev);
        prev = hash;
        return `${line}\n`;
      })
      .join(''),
  );
}

/** A valid level with every kind of line a real one holds. */
export function baseLevel(): EventPayload[] {
  const { keymap } = loadKeymap('temperate-lowland');
  return [
    { type: 'open', format: FORMAT_VERSION, session: 'f'.repeat(32), level: 'F-1', depth: 12, site: 'Fault Mere', core: 'FM-1', slide: 'A', analyst: null, keymap, rules: DEFAULT_RULES, spike: null },
    { type: 'sitting', sitting: 1 },
    { type: 'grain', taxon: 'Quercus', traverse: 1, key: 'q' },
    { type: 'grain', taxon: 'Betula', traverse: 1, key: 'b' },
    { type: 'undo', of: 4 },
    { type: 'traverse', traverse: 2 },
    { type: 'grain', taxon: 'Pinus', traverse: 2, key: 'p' },
    { type: 'note', grain: 7, text: 'cf. Pinus', stage: { x: 4.5, y: 77 } },
    { type: 'grain', taxon: 'Corylus', traverse: 2, key: 'c' },
    { type: 'close' },
    { type: 'sitting', sitting: 2 },
    { type: 'grain', taxon: 'Poaceae', traverse: 2, key: 'o' },
  ] as EventPayload[];
}

const KINDS = ['open', 'sitting', 'grain', 'undo', 'traverse', 'note', 'close', 'finish', 'taxon', 'rules', 'rules-met', 'rules-unmet', 'repair', 'void', 'restore', 'wobble'];
const FIELDS = ['taxon', 'traverse', 'key', 'of', 'grain', 'text', 'stage', 'sitting', 'rules', 'spike', 'reason', 'sum', 'grains', 'group', 'backup', 'cutBytes', 'line', 'damage', 'keymap', 'format', '__proto__', 'constructor'];

/** Odd values: huge and negative numbers, control characters, long text, nested things. */
const oddValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.jsonValue({ maxDepth: 3 }),
  fc.constantFrom(2 ** 53, -1, 0, 1e308, -0, 'Quercus', 'q', '', '\x1b]0;t\x07', '\u202e', '\uD800', 'x'.repeat(5000), null, true),
  fc.integer(),
  fc.double(),
  fc.string({ unit: 'binary' }),
);

/** A random event: a known kind or not, with fields drawn from those the kinds use. */
const randomEvent = fc.tuple(fc.constantFrom(...KINDS), fc.dictionary(fc.constantFrom(...FIELDS), oddValue, { maxKeys: 6 })).map(([type, fields]) => ({ ...fields, type }));

/** Byte-level damage: flips, cuts, inserted text, NUL padding. */
function mutateBytes(bytes: Buffer): fc.Arbitrary<{ how: string; bytes: Buffer }> {
  const at = fc.nat({ max: Math.max(0, bytes.length - 1) });
  return fc.oneof(
    fc.array(fc.tuple(at, fc.integer({ min: 0, max: 7 })), { minLength: 1, maxLength: 4 }).map((flips) => {
      const b = Buffer.from(bytes);
      for (const [i, bit] of flips) b[i] = (b[i] as number) ^ (1 << bit);
      return { how: 'bit flips', bytes: b };
    }),
    at.map((i) => ({ how: 'truncated', bytes: bytes.subarray(0, i) })),
    fc.tuple(at, fc.oneof(fc.json(), fc.string({ unit: 'binary' }), fc.constantFrom('\n', '{}\n', '\x00\x00', '\r\n', '\uFEFF'))).map(([i, text]) => ({
      how: 'inserted text',
      bytes: Buffer.concat([bytes.subarray(0, i), Buffer.from(text), bytes.subarray(i)]),
    })),
    fc.nat({ max: 4096 }).map((n) => ({ how: 'NUL padding', bytes: Buffer.concat([bytes, Buffer.alloc(n)]) })),
    fc.uint8Array({ maxLength: 300 }).map((u) => ({ how: 'random bytes', bytes: Buffer.from(u) })),
  );
}

/** Line-level damage with the chain kept: random events inserted or lines dropped, swapped, repeated. */
function mutateEvents(payloads: readonly EventPayload[]): fc.Arbitrary<{ how: string; bytes: Buffer }> {
  const at = fc.integer({ min: 1, max: payloads.length });
  return fc.oneof(
    fc.tuple(at, fc.array(randomEvent, { minLength: 1, maxLength: 3 })).map(([i, events]) => ({ how: 'chained random events', bytes: chained([...payloads.slice(0, i), ...events, ...payloads.slice(i)]) })),
    fc.tuple(at, at).map(([i, j]) => {
      const p = [...payloads];
      [p[i - 1], p[j - 1]] = [p[j - 1] as EventPayload, p[i - 1] as EventPayload];
      return { how: 'chained swap', bytes: chained(p) };
    }),
    at.map((i) => ({ how: 'chained repeat', bytes: chained([...payloads.slice(0, i), payloads[i - 1], ...payloads.slice(i)]) })),
    at.map((i) => ({ how: 'chained drop', bytes: chained(payloads.filter((_, k) => k !== i - 1)) })),
    fc.tuple(fc.constantFrom(...Object.keys(payloads[0] as object)), oddValue).map(([field, value]) => ({ how: `line 1 ${field} replaced`, bytes: chained([{ ...payloads[0], [field]: value }, ...payloads.slice(1)]) })),
  );
}

const SESSION_COMMANDS: readonly (readonly string[])[] = [['verify'], ['summary'], ['summary', '--json'], ['export'], ['export', '--format', 'wide'], ['export', '--format', 'notes'], ['audit', '--plain']];

export function sessionCases(): fc.Arbitrary<FaultCase> {
  const payloads = baseLevel();
  const bytes = chained(payloads);
  return fc.tuple(fc.oneof(mutateBytes(bytes), mutateEvents(payloads)), fc.constantFrom(...SESSION_COMMANDS)).map(([m, args]) => ({ kind: 'session' as const, ...m, args }));
}

/** Keymaps: the bundled ones damaged byte by byte, a value replaced, or random JSON. */
export function keymapCases(): fc.Arbitrary<FaultCase> {
  const texts = ['temperate-lowland', 'keypad'].map((name) => readFileSync(join(BUNDLED_KEYMAP_DIR, `${name}.json`)));
  const replaced = fc.tuple(fc.constantFrom(...texts), fc.array(fc.constantFrom('name', 'keys', 'actions', 'sum', 'q', 'taxon', 'group', 'help', 'undo', 'newType'), { minLength: 1, maxLength: 3 }), oddValue).map(([text, path, value]) => {
    const doc = parse(text.toString('utf8')) as Record<string, unknown>;
    let at: Record<string, unknown> = doc;
    for (const key of path.slice(0, -1)) {
      const next = at[key];
      if (typeof next !== 'object' || next === null) break;
      at = next as Record<string, unknown>;
    }
    at[path.at(-1) as string] = value;
    return { how: `${path.join('.')} replaced`, bytes: Buffer.from(JSON.stringify(doc)) };
  });
  return fc
    .oneof(fc.constantFrom(...texts).chain(mutateBytes), replaced, fc.json().map((j) => ({ how: 'random JSON', bytes: Buffer.from(j) })))
    .map((m) => ({ kind: 'keymap' as const, ...m }));
}

const COUNT_FLAGS = ['level', 'depth', 'site', 'core', 'slide', 'analyst', 'target', 'precision', 'precision-share', 'precision-taxa', 'coverage', 'plateau', 'markers', 'conc-error', 'rule-mode', 'min-sum', 'tablets', 'per-tablet', 'per-tablet-sd', 'volume', 'mass', 'accumulation-rate'];
const OTHER: Readonly<Record<string, readonly string[]>> = { summary: ['json', 'rarefy'], export: ['format', 'out', 'force'], audit: ['plain', 'double-press', 'gap'], verify: [], keys: ['add-types'] };

const flagValue = fc.oneof(
  fc.constantFrom('99999999999999999999', '9007199254740992', '-1', '0', '1e400', 'NaN', 'Infinity', '0x10', '1.5', ' 5', '', '--', 'all', 'any', 'coverage', 'Quercus,Betula', 'wide', 'notes'),
  fc.integer().map(String),
  fc.double().map(String),
  fc.string({ unit: 'binary', maxLength: 40 }),
);

/** Command lines: known flags with odd values, unknown flags, repeated flags, stray positionals. */
export function flagCases(): fc.Arbitrary<FaultCase> {
  const countArgs = fc.array(fc.tuple(fc.constantFrom(...COUNT_FLAGS), flagValue), { maxLength: 5 }).map((pairs) => pairs.flatMap(([f, v]) => [`--${f}`, v]));
  const count = fc.tuple(countArgs, fc.boolean()).map(([args, existing]) => ({ kind: 'flags' as const, how: 'count flags', command: 'count', args, existing }));
  const other = fc
    .tuple(fc.constantFrom(...Object.keys(OTHER)), fc.array(fc.tuple(fc.oneof(fc.constantFrom(...Object.values(OTHER).flat(), 'bogus', 'h'), fc.string({ maxLength: 8 })), flagValue, fc.boolean()), { maxLength: 4 }))
    .map(([command, pairs]) => ({
      kind: 'flags' as const,
      how: `${command} flags`,
      command,
      args: pairs.flatMap(([f, v, withValue]) => (withValue ? [`--${f}`, v] : [`--${f}`])),
      existing: true,
    }));
  return fc.oneof(count, other);
}

export const ALL_CASES = (): fc.Arbitrary<FaultCase> => fc.oneof(sessionCases(), keymapCases(), flagCases());
