import { describeIssue } from '../validation/describe-issue.js';
import { keymapSchemaModule } from './deferred-keymap-schema.js';

/** A keymap value of the right shape, as keymap-schema.ts gives it: the name trimmed, the rest as written. */
export interface RawKeymap {
  readonly name: string;
  readonly keys: Record<string, { taxon: string; group: string; inSum?: false }>;
  readonly actions?: Record<string, string | null> | undefined;
  readonly sum?: string[] | undefined;
  readonly groups?: unknown;
  readonly order?: string[] | undefined;
  readonly [field: string]: unknown;
}

const object = (x: unknown): x is Record<string, unknown> => typeof x === 'object' && x !== null && !Array.isArray(x);
const str = (x: unknown): x is string => typeof x === 'string';

// Fields the check below knows; a keymap with any other field goes to the schema, so a field
// added there is never waved through here.
const KNOWN = new Set(['name', 'keys', 'actions', 'sum', 'groups', 'order']);

/** True only for values the schema accepts (a property test holds the two together). */
export function isPlainKeymap(v: unknown): v is RawKeymap {
  if (!object(v) || !str(v.name) || v.name.trim().length === 0 || !object(v.keys)) return false;
  for (const field of Object.keys(v)) if (!KNOWN.has(field)) return false;
  for (const b of Object.values(v.keys)) {
    if (!object(b) || !str(b.taxon) || b.taxon.trim().length === 0 || !str(b.group) || !(b.inSum === undefined || b.inSum === false)) return false;
  }
  if (v.actions !== undefined && !(object(v.actions) && Object.values(v.actions).every((k) => k === null || str(k)))) return false;
  if (v.sum !== undefined && !(Array.isArray(v.sum) && v.sum.every(str))) return false;
  if (v.order !== undefined && !(Array.isArray(v.order) && v.order.every(str))) return false;
  return true;
}

/** The keymap value of the right shape, or what is wrong with it in words (zod is loaded only then). */
export function keymapShapeOf(value: unknown): { ok: true; raw: RawKeymap } | { ok: false; message: string } {
  if (isPlainKeymap(value)) return { ok: true, raw: { ...value, name: value.name.trim() } };
  const shape = keymapSchemaModule().keymapShape.safeParse(value, { reportInput: true });
  if (!shape.success) return { ok: false, message: describeIssue(shape.error.issues[0]) };
  return { ok: true, raw: shape.data as RawKeymap };
}
