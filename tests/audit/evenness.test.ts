import { describe, expect, it } from 'vitest';
import { describeCell, evennessAcrossTraverses, POOLED } from '../../src/audit/evenness.js';
import { expectedCountsOk } from '../../src/stats/homogeneity.js';

const table = (rows: Record<string, number[]>) => new Map(Object.entries(rows).map(([taxon, counts]) => [taxon, new Map(counts.map((c, i) => [i + 1, c]))]));

describe('evenness across traverses', () => {
  it('types spread alike: a high p and no cell flagged', () => {
    const ev = evennessAcrossTraverses(table({ Quercus: [20, 21, 19, 20], Betula: [10, 11, 9, 10], Corylus: [15, 14, 16, 15] }));
    expect(ev.ok).toBe(true);
    if (!ev.ok) return;
    expect(ev.test.result.p).toBeGreaterThan(0.9);
    expect(ev.test.flagged).toEqual([]);
    expect(ev.test.pooledTaxa).toEqual([]);
  });

  it('one traverse rich in Pinus: flagged in words', () => {
    const ev = evennessAcrossTraverses(table({ Pinus: [8, 9, 30, 8], Quercus: [30, 31, 12, 30], Corylus: [20, 19, 18, 21] }));
    expect(ev.ok).toBe(true);
    if (!ev.ok) return;
    expect(ev.test.result.p).toBeLessThan(0.001);
    const top = ev.test.flagged[0]!;
    expect(top).toMatchObject({ taxon: 'Pinus', traverses: [3], observed: 30 });
    expect(describeCell(top)).toMatch(/^Traverse 3 has more Pinus than the rest \(30 counted, \d+\.\d expected; adjusted residual \+\d+\.\d\)$/);
    expect(ev.test.flagged.some((c) => c.taxon === 'Quercus' && c.traverses[0] === 3 && /fewer Quercus/.test(describeCell(c)))).toBe(true);
  });

  it('pools rare types until expected counts are large enough (Cochran 1954)', () => {
    const ev = evennessAcrossTraverses(
      table({ Quercus: [30, 28, 32], Corylus: [25, 27, 24], Tilia: [1, 0, 2], Ulmus: [2, 1, 0], Fraxinus: [0, 1, 1], Hedera: [1, 0, 0] }),
    );
    expect(ev.ok).toBe(true);
    if (!ev.ok) return;
    expect(ev.test.taxa).toContain(POOLED);
    expect(ev.test.pooledTaxa).toEqual(expect.arrayContaining(['Hedera', 'Fraxinus', 'Tilia', 'Ulmus']));
    expect(expectedCountsOk(ev.test.result.expected)).toBe(true);
  });

  it('merges small traverses when pooling types is not enough', () => {
    const ev = evennessAcrossTraverses(table({ Quercus: [12, 1, 13, 2], Corylus: [11, 2, 12, 1] }));
    expect(ev.ok).toBe(true);
    if (!ev.ok) return;
    expect(ev.test.mergedTraverses.length).toBeGreaterThan(0);
    expect(expectedCountsOk(ev.test.result.expected)).toBe(true);
  });

  it('says why when there is nothing to test', () => {
    expect(evennessAcrossTraverses(table({ Quercus: [12], Corylus: [3] }))).toEqual({ ok: false, reason: 'fewer than two traverses with grains: nothing to compare' });
    expect(evennessAcrossTraverses(table({ Quercus: [12, 14] })).ok).toBe(false);
    expect(evennessAcrossTraverses(table({ Quercus: [1, 1], Corylus: [0, 1] }))).toMatchObject({ ok: false, reason: expect.stringMatching(/too few grains/) });
  });
});
