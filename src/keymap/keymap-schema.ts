import { z } from 'zod';

// The shape of a keymap value, in zod: it words what is wrong. keymap-shape.ts checks good
// values by hand so that starting exine does not load zod; it may accept only what this accepts.
export const keymapShape = z.object({
  name: z.string().trim().min(1),
  keys: z.record(
    z.string(),
    z.object({ taxon: z.string().trim().min(1), group: z.string(), inSum: z.literal(false).optional() }).loose(),
  ),
  // null: the action has no key (a keymap copied into a session file says so for an action whose default key is a taxon's).
  actions: z.record(z.string(), z.string().nullable()).optional(),
  sum: z.array(z.string()).optional(),
  groups: z.unknown().optional(),
  // Only in a copy held by a session file: the key order, which the "keys" object cannot keep for digits.
  order: z.array(z.string()).optional(),
}).loose();
