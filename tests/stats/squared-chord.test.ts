import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { proportions, squaredChord } from '../../src/stats/squared-chord.js';

describe('squared-chord distance (Overpeck, Webb & Prentice 1985)', () => {
  it('matches a worked example done by hand from the formula Σ (√pᵢ − √qᵢ)²', () => {
    // Level 1: Alnus 64, Betula 36 of 100 → p = 0.64, 0.36, 0   → √p = 0.8, 0.6, 0
    // Level 2: Alnus 36, Betula 16, Poaceae 48 of 100 → q = 0.36, 0.16, 0.48 → √q = 0.6, 0.4, √0.48
    // (0.8 − 0.6)² + (0.6 − 0.4)² + (0 − √0.48)² = 0.04 + 0.04 + 0.48 = 0.56
    const p = proportions({ Alnus: 64, Betula: 36 });
    const q = proportions({ Alnus: 36, Betula: 16, Poaceae: 48 });
    expect(squaredChord(p!, q!)).toBeCloseTo(0.56, 12);
    // Level 3: Alnus 1, Betula 3 of 4 → √ = 0.5, √0.75; against level 1:
    // (0.8 − 0.5)² + (0.6 − √0.75)² = 0.09 + (0.36 + 0.75 − 1.2·√0.75) = 0.09 + 1.11 − 1.0392305 = 0.1607695
    expect(squaredChord(p!, proportions({ Alnus: 1, Betula: 3 })!)).toBeCloseTo(0.1607695, 7);
  });

  it('agrees with R vegan', () => {
    // Reference implementation: R 4.2.2, vegan 2.6.4. vegan's "chord" is the Euclidean distance of rows
    // scaled to unit length; on square roots of proportions it is √(squared chord), so
    //   m <- rbind(c(64,36,0,0), c(36,16,48,0), c(10,20,30,40), c(5,0,0,95))
    //   as.vector(vegdist(sqrt(decostand(m, "total")), method = "chord"))^2
    // (the same values as vegdist(m, method = "hellinger")^2), pairs 1–2, 1–3, 1–4, 2–3, 2–4, 3–4:
    const VEGAN = [0.56, 0.9573792598, 1.6422291236, 0.5038091659, 1.7316718427, 0.6256958432];
    const rows: Record<string, number>[] = [
      { a: 64, b: 36 },
      { a: 36, b: 16, c: 48 },
      { a: 10, b: 20, c: 30, d: 40 },
      { a: 5, d: 95 },
    ];
    const pairs = [
      [0, 1],
      [0, 2],
      [0, 3],
      [1, 2],
      [1, 3],
      [2, 3],
    ] as const;
    for (const [k, [i, j]] of pairs.entries()) {
      expect(squaredChord(proportions(rows[i]!)!, proportions(rows[j]!)!), `${i}–${j}`).toBeCloseTo(VEGAN[k]!, 7);
    }
  });

  it('is 2 for assemblages with no taxon in common, and nothing counted has no proportions', () => {
    expect(squaredChord({ Alnus: 1 }, { Betula: 0.5, Corylus: 0.5 })).toBe(2);
    expect(proportions({})).toBeNull();
    expect(proportions({ Alnus: 0 })).toBeNull();
  });

  const counts = fc.dictionary(fc.constantFrom('Alnus', 'Betula', 'Corylus', 'Poaceae', 'Quercus', 'Pinus'), fc.integer({ min: 0, max: 500 })).filter((c) => Object.values(c).some((n) => n > 0));

  it('is zero for identical assemblages, symmetric, and between 0 and 2', () => {
    fc.assert(
      fc.property(counts, counts, fc.integer({ min: 1, max: 7 }), (a, b, k) => {
        const p = proportions(a)!;
        const q = proportions(b)!;
        // The same assemblage counted k times over has the same proportions.
        const scaled = proportions(Object.fromEntries(Object.entries(a).map(([t, n]) => [t, n * k])))!;
        expect(squaredChord(p, scaled)).toBeCloseTo(0, 12);
        expect(squaredChord(p, p)).toBe(0);
        expect(squaredChord(p, q)).toBeCloseTo(squaredChord(q, p), 12);
        const d = squaredChord(p, q);
        expect(d).toBeGreaterThanOrEqual(0);
        expect(d).toBeLessThanOrEqual(2);
      }),
    );
  });
});
