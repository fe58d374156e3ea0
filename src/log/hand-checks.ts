import { isPrintableKey } from '../keymap/parse-keymap.js';
import { RULE_NAMES } from '../rules/rule-set.js';

// Direct checks of session lines, one per event kind, so that reading a good file never
// loads zod. Each may accept only what its zod schema in event-schema.ts accepts (a property
// test per kind holds them together); whatever one rejects, and every kind without one here,
// goes through the schema, which decides and words the error. So a new kind needs only its
// schema to work; a check here makes it fast. Changing a schema means changing its check.

type V = Record<string, unknown>;
type Check = (v: V) => boolean;

// zod's own pattern for datetime({ precision: 3, offset: false, local: false }), copied (a test compares them).
export const ISO_MS =
  /^(?:(?:\d\d[2468][048]|\d\d[13579][26]|\d\d0[48]|[02468][048]00|[13579][26]00)-02-29|\d{4}-(?:(?:0[13578]|1[02])-(?:0[1-9]|[12]\d|3[01])|(?:0[469]|11)-(?:0[1-9]|[12]\d|30)|(?:02)-(?:0[1-9]|1\d|2[0-8])))T(?:(?:[01]\d|2[0-3]):[0-5]\d:[0-5]\d\.\d{3}(?:Z))$/;

// zod's number() refuses Infinity (JSON.parse makes it from 1e400); int() means a safe integer.
const num = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);
const positive = (x: unknown) => num(x) && x > 0;
const posInt = (x: unknown) => Number.isSafeInteger(x) && (x as number) > 0;
const count = (x: unknown) => Number.isSafeInteger(x) && (x as number) >= 0;
const str = (x: unknown): x is string => typeof x === 'string';
const trimmed = (x: unknown) => str(x) && x.trim().length > 0;
const orNull = (f: (x: unknown) => boolean) => (x: unknown) => x === null || f(x);
const optional = (f: (x: unknown) => boolean) => (x: unknown) => x === undefined || f(x);
const object = (x: unknown): x is V => typeof x === 'object' && x !== null && !Array.isArray(x);
const oneOf = (names: readonly string[]) => (x: unknown) => str(x) && names.includes(x);

// ISO_MS is a date of 10 characters, "T", and a time of 13. Lines of one day share the date, so
// the last date that passed is remembered and only the time is tested again: the same verdict.
let lastDate = '';
const digit = (at: string, i: number, max = 9) => {
  const d = at.charCodeAt(i) - 48;
  return d >= 0 && d <= max;
};
// The time part of ISO_MS, "THH:MM:SS.mmmZ" from index 10 with HH ≤ 23, read character by character
// (a regular expression on a slice of every line was a tenth of reading a long file).
function isoTime(at: string): boolean {
  const h = (at.charCodeAt(11) - 48) * 10 + (at.charCodeAt(12) - 48);
  return (
    at[10] === 'T' && digit(at, 11, 2) && digit(at, 12) && h <= 23 &&
    at[13] === ':' && digit(at, 14, 5) && digit(at, 15) &&
    at[16] === ':' && digit(at, 17, 5) && digit(at, 18) &&
    at[19] === '.' && digit(at, 20) && digit(at, 21) && digit(at, 22) && at[23] === 'Z'
  );
}
function isoMs(at: string): boolean {
  if (at.length !== 24) return false;
  if (at.startsWith(lastDate) && lastDate !== '') return isoTime(at);
  if (!ISO_MS.test(at)) return false;
  lastDate = at.slice(0, 10);
  return true;
}

const stamp = (v: V) => posInt(v.seq) && str(v.at) && isoMs(v.at) && str(v.prev);

const precision = (x: unknown) =>
  object(x) &&
  positive(x.halfWidth) &&
  optional(orNull((s) => num(s) && s >= 0 && s <= 100))(x.share) &&
  optional(orNull((t) => Array.isArray(t) && t.length > 0 && t.every((n) => str(n) && n.length > 0)))(x.taxa);

const rules = (x: unknown) =>
  object(x) &&
  optional(orNull(posInt))(x.targetSum) &&
  optional(orNull(precision))(x.precision) &&
  optional(orNull((c) => num(c) && c > 0 && c <= 1))(x.coverage) &&
  optional(orNull(posInt))(x.plateau) &&
  optional(orNull(posInt))(x.markers) &&
  optional(orNull(positive))(x.concError) &&
  optional(oneOf(['all', 'any']))(x.mode) &&
  optional(orNull(posInt))(x.minSum);

const spike = optional(
  orNull(
    (x) =>
      object(x) &&
      positive(x.tablets) &&
      positive(x.perTablet) &&
      orNull((s) => num(s) && s >= 0)(x.perTabletSd) &&
      orNull(positive)(x.volume) &&
      orNull(positive)(x.mass) &&
      orNull(positive)(x.accumulationRate) &&
      (x.volume === null) !== (x.mass === null),
  ),
);

const text = orNull(str);

export const HAND_CHECKS: ReadonlyMap<string, Check> = new Map<string, Check>([
  ['grain', (v) => stamp(v) && str(v.taxon) && v.taxon.length > 0 && posInt(v.traverse) && str(v.key) && (v.cf === undefined || v.cf === true)],
  ['undo', (v) => stamp(v) && posInt(v.of)],
  ['traverse', (v) => stamp(v) && posInt(v.traverse)],
  ['traverse-undo', (v) => stamp(v) && posInt(v.of) && posInt(v.traverse)],
  ['reopen', (v) => stamp(v) && str(v.reason)],
  ['sitting', (v) => stamp(v) && posInt(v.sitting)],
  ['rules-met', (v) => stamp(v) && count(v.sum) && count(v.grains) && Array.isArray(v.met) && v.met.every(oneOf(RULE_NAMES))],
  ['rules-unmet', (v) => stamp(v) && count(v.sum) && count(v.grains)],
  ['note', (v) => stamp(v) && str(v.text) && orNull(posInt)(v.grain) && orNull((s) => object(s) && num(s.x) && num(s.y))(v.stage)],
  ['taxon', (v) => stamp(v) && trimmed(v.taxon) && trimmed(v.group) && str(v.key) && isPrintableKey(v.key) && v.key !== ' '],
  ['void', (v) => stamp(v) && orNull(posInt)(v.grain) && orNull(posInt)(v.traverse) && str(v.reason) && (v.grain === null) !== (v.traverse === null)],
  ['restore', (v) => stamp(v) && posInt(v.of) && str(v.reason)],
  ['repair', (v) => stamp(v) && str(v.damage) && posInt(v.line) && count(v.cutBytes) && str(v.backup)],
  ['rules', (v) => stamp(v) && rules(v.rules) && spike(v.spike)],
  ['slide', (v) => stamp(v) && trimmed(v.slide) && posInt(v.traverse)],
  ['close', stamp],
  ['finish', stamp],
  [
    'open',
    (v) =>
      stamp(v) &&
      posInt(v.format) &&
      str(v.session) &&
      v.session.length >= 8 &&
      str(v.level) &&
      orNull(num)(v.depth) &&
      text(v.site) &&
      text(v.core) &&
      text(v.slide) &&
      text(v.analyst) &&
      // z.unknown() still wants the field there; its content is checked as a keymap.
      'keymap' in v &&
      rules(v.rules) &&
      spike(v.spike) &&
      optional((x) => object(x) && Array.isArray(x.overrides) && x.overrides.every(str))(v.fromCore),
  ],
]);

/** True when the line is certainly a valid event of its kind; false means "ask the schema". */
export function passesHandCheck(v: V): boolean {
  const check = typeof v.type === 'string' ? HAND_CHECKS.get(v.type) : undefined;
  return check !== undefined && check(v);
}
