import { z } from 'zod';
import { isPrintableKey } from '../keymap/parse-keymap.js';
import { RULE_NAMES } from '../rules/rule-set.js';
import type { SessionEvent } from '../model/events.js';

// Validation of lines read back from a session file. Fields written by a later exine
// are not rejected: the schema ignores them and the reader keeps the parsed line as it is.
const stamp = { seq: z.number().int().positive(), at: z.iso.datetime({ precision: 3, offset: false, local: false }), prev: z.string() };
const text = z.string();
const optionalText = z.string().nullable();

const count = z.number().int().nonnegative();
const positive = z.number().positive();
// Rule fields absent from a format-1 file read as "rule not used" (see normalRules).
const rules = z.looseObject({
  targetSum: z.number().int().positive().nullable().optional(),
  precision: z
    .looseObject({
      halfWidth: positive,
      share: z.number().min(0).max(100).nullable().optional(),
      taxa: z.array(z.string().min(1)).min(1).nullable().optional(),
    })
    .nullable()
    .optional(),
  coverage: z.number().gt(0).lte(1).nullable().optional(),
  plateau: z.number().int().positive().nullable().optional(),
  markers: z.number().int().positive().nullable().optional(),
  concError: z.number().gt(0).nullable().optional(),
  mode: z.enum(['all', 'any']).optional(),
  minSum: z.number().int().positive().nullable().optional(),
});
const spike = z
  .looseObject({
    tablets: positive,
    perTablet: positive,
    perTabletSd: z.number().nonnegative().nullable(),
    volume: positive.nullable(),
    mass: positive.nullable(),
    accumulationRate: positive.nullable(),
  })
  .refine((s) => (s.volume === null) !== (s.mass === null), { message: 'a spike gives either a volume or a mass' })
  .nullable()
  .optional();

const open = z.object({
  ...stamp,
  type: z.literal('open'),
  format: z.number().int().positive(),
  session: z.string().min(8),
  level: text,
  depth: z.number().nullable(),
  site: optionalText,
  core: optionalText,
  slide: optionalText,
  analyst: optionalText,
  keymap: z.unknown(),
  rules,
  spike,
  fromCore: z.looseObject({ overrides: z.array(z.string()) }).optional(),
});

const grain = z.object({
  ...stamp,
  type: z.literal('grain'),
  taxon: z.string().min(1),
  traverse: z.number().int().positive(),
  key: z.string(),
  cf: z.literal(true).optional(),
});

const undo = z.object({ ...stamp, type: z.literal('undo'), of: z.number().int().positive() });
const traverse = z.object({ ...stamp, type: z.literal('traverse'), traverse: z.number().int().positive() });
const traverseUndo = z.object({ ...stamp, type: z.literal('traverse-undo'), of: z.number().int().positive(), traverse: z.number().int().positive() });
const reopen = z.object({ ...stamp, type: z.literal('reopen'), reason: text });
const note = z.object({
  ...stamp,
  type: z.literal('note'),
  text,
  grain: z.number().int().positive().nullable(),
  stage: z.object({ x: z.number(), y: z.number() }).nullable(),
});
const taxonEvent = z.object({
  ...stamp,
  type: z.literal('taxon'),
  taxon: z.string().trim().min(1),
  // A built-in group or one of the keymap's own (format 3).
  group: z.string().trim().min(1),
  // As an action key: one printable character, not a space (the keymap's own rule).
  key: z.string().refine((k) => isPrintableKey(k) && k !== ' ', { message: 'a key is one printable character' }),
});
const sitting = z.object({ ...stamp, type: z.literal('sitting'), sitting: z.number().int().positive() });
const ruleChange = z.object({ ...stamp, type: z.literal('rules'), rules, spike });
const rulesMet = z.object({ ...stamp, type: z.literal('rules-met'), sum: count, grains: count, met: z.array(z.enum(RULE_NAMES)) });
const rulesUnmet = z.object({ ...stamp, type: z.literal('rules-unmet'), sum: count, grains: count });
const repair = z.object({
  ...stamp,
  type: z.literal('repair'),
  damage: text,
  line: z.number().int().positive(),
  cutBytes: z.number().int().nonnegative(),
  backup: text,
});
const voidEvent = z
  .object({
    ...stamp,
    type: z.literal('void'),
    grain: z.number().int().positive().nullable(),
    traverse: z.number().int().positive().nullable(),
    reason: text,
  })
  .refine((v) => (v.grain === null) !== (v.traverse === null), { message: 'a void names one grain or one traverse' });
const restore = z.object({ ...stamp, type: z.literal('restore'), of: z.number().int().positive(), reason: text });
const slide = z.object({ ...stamp, type: z.literal('slide'), slide: z.string().trim().min(1), traverse: z.number().int().positive() });
const close = z.object({ ...stamp, type: z.literal('close') });
const finish = z.object({ ...stamp, type: z.literal('finish') });

export const eventSchema = z.discriminatedUnion('type', [
  open,
  grain,
  undo,
  traverse,
  traverseUndo,
  reopen,
  note,
  taxonEvent,
  sitting,
  ruleChange,
  rulesMet,
  rulesUnmet,
  repair,
  voidEvent,
  restore,
  slide,
  close,
  finish,
]);

const byType = new Map<string, z.ZodType>(eventSchema.options.map((o) => [o.shape.type.value, o]));

export const KNOWN_EVENT_TYPES: ReadonlySet<string> = new Set(byType.keys());

export type ParsedEvent = SessionEvent & { readonly prev: string };

// zod's own pattern for the `at` field, so the direct check below cannot disagree with it.
const ISO_MS = z.core.regexes.datetime({ precision: 3, offset: false, local: false });
const positiveInt = (v: unknown): boolean => Number.isSafeInteger(v) && (v as number) > 0;

/**
 * Grain lines are nearly every line of a session, so they get a direct check that
 * accepts exactly what the zod schema `grain` accepts (a property test holds the two
 * together); everything else, and any grain line this rejects, goes through zod.
 */
export function isPlainGrain(v: Record<string, unknown>): boolean {
  return (
    v.type === 'grain' &&
    positiveInt(v.seq) &&
    typeof v.at === 'string' &&
    ISO_MS.test(v.at) &&
    typeof v.prev === 'string' &&
    typeof v.taxon === 'string' &&
    v.taxon.length > 0 &&
    positiveInt(v.traverse) &&
    typeof v.key === 'string' &&
    (v.cf === undefined || v.cf === true)
  );
}

/** The schema checks the open line's keymap only as "present"; its content is checked by the keymap rules. */
export function parseEventObject(value: unknown): { ok: true; event: ParsedEvent } | { ok: false; issue: z.core.$ZodIssue | undefined } {
  const record = value as Record<string, unknown>;
  if (typeof value === 'object' && value !== null && isPlainGrain(record)) return { ok: true, event: value as ParsedEvent };
  const schema = (typeof record?.type === 'string' && byType.get(record.type)) || eventSchema;
  const result = schema.safeParse(value, { reportInput: true });
  if (!result.success) return { ok: false, issue: result.error.issues[0] };
  // The checked value itself, not zod's stripped copy: unknown fields stay with the event.
  return { ok: true, event: value as ParsedEvent };
}
