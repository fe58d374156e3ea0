import { z } from 'zod';

// The zod schema of core.json (see core-file.ts); loaded on first use (deferred-core-schema.ts).
const CORE_FORMAT = 1;

const name = z.string().trim().min(1).max(200);
const wholeAbove0 = z.number().int().positive().max(Number.MAX_SAFE_INTEGER);
// Bounds as the flags of exine count take them (cli/rule-flags.ts): a fraction strictly between 0 and 1.
const fraction = z.number().gt(0).lt(1);

export const coreShape = z.object({
  // As core-file.ts's CORE_FORMAT: a core.json of a later exine is refused.
  format: z.literal(CORE_FORMAT).optional(),
  site: name,
  core: name,
  keymap: z.unknown(),
  rules: z.object({
    targetSum: wholeAbove0.nullable().optional(),
    precision: z
      .object({ halfWidth: z.number().gt(0).max(50), share: z.number().gt(0).max(100).nullable().optional(), taxa: z.array(name).min(1).nullable().optional() })
      .nullable()
      .optional(),
    coverage: fraction.nullable().optional(),
    plateau: wholeAbove0.nullable().optional(),
    markers: wholeAbove0.nullable().optional(),
    concError: fraction.nullable().optional(),
    mode: z.enum(['all', 'any']).optional(),
    minSum: wholeAbove0.nullable().optional(),
  }),
  markerBatch: z.object({ tablets: wholeAbove0, perTablet: z.number().positive(), perTabletSd: z.number().nonnegative().nullable().optional() }).nullable().optional(),
  depths: z.array(z.number().nonnegative().max(1e6)).max(5000).optional(),
  synonyms: z.record(name, name).optional(),
  summaryGroups: z.array(z.object({ name, taxa: z.array(name).min(1) })).optional(),
});

