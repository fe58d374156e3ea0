import { z } from 'zod';
import type { SessionEvent } from '../session/events.js';

// Validation of lines read back from a session file. Objects are loose so that fields
// written by a later exine are kept and ignored rather than rejected.
const stamp = { seq: z.number().int().positive(), at: z.iso.datetime({ precision: 3 }), prev: z.string() };
const text = z.string();
const optionalText = z.string().nullable();

const rules = z.object({ targetSum: z.number().int().positive() }).loose();

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
}).loose();

const grain = z.object({
  ...stamp,
  type: z.literal('grain'),
  taxon: z.string().min(1),
  traverse: z.number().int().positive(),
  key: z.string(),
}).loose();

const undo = z.object({ ...stamp, type: z.literal('undo'), of: z.number().int().positive() }).loose();
const traverse = z.object({ ...stamp, type: z.literal('traverse'), traverse: z.number().int().positive() }).loose();
const note = z.object({
  ...stamp,
  type: z.literal('note'),
  text,
  grain: z.number().int().positive().nullable(),
  stage: z.object({ x: z.number(), y: z.number() }).nullable(),
}).loose();
const sitting = z.object({ ...stamp, type: z.literal('sitting'), sitting: z.number().int().positive() }).loose();
const ruleChange = z.object({ ...stamp, type: z.literal('rules'), rules }).loose();
const repair = z.object({
  ...stamp,
  type: z.literal('repair'),
  damage: text,
  line: z.number().int().positive(),
  cutBytes: z.number().int().nonnegative(),
  backup: text,
}).loose();
const close = z.object({ ...stamp, type: z.literal('close') }).loose();
const finish = z.object({ ...stamp, type: z.literal('finish') }).loose();

export const eventSchema = z.discriminatedUnion('type', [
  open,
  grain,
  undo,
  traverse,
  note,
  sitting,
  ruleChange,
  repair,
  close,
  finish,
]);

export const KNOWN_EVENT_TYPES: ReadonlySet<string> = new Set(eventSchema.options.map((o) => o.shape.type.value));

export type ParsedEvent = SessionEvent & { readonly prev: string };

/** The schema checks the open line's keymap only as "present"; its content is checked by the keymap rules. */
export function parseEventObject(value: unknown): { ok: true; event: ParsedEvent } | { ok: false; issue: z.core.$ZodIssue | undefined } {
  const result = eventSchema.safeParse(value);
  if (!result.success) return { ok: false, issue: result.error.issues[0] };
  return { ok: true, event: result.data as unknown as ParsedEvent };
}
