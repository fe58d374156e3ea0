import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evennessAcrossTraverses } from '../../src/audit/evenness.js';
import { evennessAcrossTraverses as reference } from './evenness-reference.js';

const tableOf = (rows: number[][]) => new Map(rows.map((counts, i) => [`T${i}`, new Map(counts.map((c, j) => [j + 1, c]))]));

describe('evenness across traverses, from margins', () => {
  it('property: the same report as pooling on the full table, step by step (fast-check)', () => {
    const count = fc.oneof({ weight: 3, arbitrary: fc.integer({ min: 0, max: 3 }) }, { weight: 2, arbitrary: fc.integer({ min: 0, max: 40 }) });
    const table = fc.integer({ min: 1, max: 30 }).chain((cols) => fc.array(fc.array(count, { minLength: cols, maxLength: cols }), { minLength: 1, maxLength: 12 }));
    fc.assert(
      fc.property(table, (rows) => {
        expect(evennessAcrossTraverses(tableOf(rows))).toEqual(reference(tableOf(rows)));
      }),
      { numRuns: 600 },
    );
  });

  it('judges 4,000 traverses of five grains each (the audit of such a level took half a minute)', () => {
    const rows = Array.from({ length: 12 }, (_, i) => Array.from({ length: 4000 }, (_, t) => ((t * 7 + i * 3) % 12 < 5 ? 1 : 0)));
    const ev = evennessAcrossTraverses(tableOf(rows));
    expect(ev.ok).toBe(true);
  });
});
