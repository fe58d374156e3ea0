/**
 * Squared-chord distance between two assemblages given as proportions (Overpeck,
 * Webb & Prentice 1985): Σ (√pᵢ − √qᵢ)². Each assemblage is a map taxon → share
 * of its pollen sum (shares of one assemblage add up to 1); a taxon missing from
 * one side counts as 0. It is 0 for identical assemblages and 2 for two with no
 * taxon in common; the square roots damp the weight of the dominant taxa.
 */
export function squaredChord(p: Readonly<Record<string, number>>, q: Readonly<Record<string, number>>): number {
  let d = 0;
  for (const [taxon, share] of Object.entries(p)) {
    const diff = Math.sqrt(share) - Math.sqrt(q[taxon] ?? 0);
    d += diff * diff;
  }
  for (const [taxon, share] of Object.entries(q)) if (!(taxon in p)) d += share;
  // Rounding may put identical or disjoint assemblages a hair outside [0, 2].
  return Math.min(2, Math.max(0, d));
}

/** Counts → shares of their total; null when nothing is counted. */
export function proportions(counts: Readonly<Record<string, number>>): Record<string, number> | null {
  let total = 0;
  for (const n of Object.values(counts)) total += n;
  if (total <= 0) return null;
  const out: Record<string, number> = {};
  for (const [taxon, n] of Object.entries(counts)) if (n > 0) out[taxon] = n / total;
  return out;
}
