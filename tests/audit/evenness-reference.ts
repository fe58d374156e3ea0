// The first, straightforward pooling (it rebuilt the table at every step): kept as the reference that the
// margin-based one in src/audit/evenness.ts must equal on every table (tests/audit/evenness-property.test.ts).
import { chiSquareTest, expectedCountsOk, type ChiSquareResult } from '../../src/stats/homogeneity.js';

export const POOLED = 'pooled rare types';

export interface EvennessCell {
  readonly taxon: string;
  /** The traverses of the column (several when small ones were merged). */
  readonly traverses: readonly number[];
  readonly observed: number;
  readonly expected: number;
  readonly residual: number;
}

export interface EvennessTest {
  readonly result: ChiSquareResult;
  readonly taxa: readonly string[];
  readonly columns: readonly (readonly number[])[];
  /** Taxa pooled into one row, and traverses merged into one column, so that expected counts are large enough. */
  readonly pooledTaxa: readonly string[];
  readonly mergedTraverses: readonly (readonly number[])[];
  /** Cells whose adjusted residual is beyond ±2, largest first. */
  readonly flagged: readonly EvennessCell[];
}

export type Evenness = { readonly ok: true; readonly test: EvennessTest } | { readonly ok: false; readonly reason: string };

interface Row {
  taxon: string;
  counts: number[];
  members: string[];
}

const total = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0);

function expectedOf(rows: readonly Row[]): number[][] {
  const n = total(rows.map((r) => total(r.counts)));
  const cols = (rows[0]?.counts ?? []).map((_, j) => total(rows.map((r) => r.counts[j] ?? 0)));
  return rows.map((r) => cols.map((c) => (total(r.counts) * c) / n));
}

/**
 * Are the types spread alike across the traverses? A χ² test of homogeneity of
 * the taxa × traverses table. Rare taxa are pooled into one row, then (if still
 * needed) the smallest traverses merged with a neighbour, until Cochran's rule
 * for expected counts holds.
 */
export function evennessAcrossTraverses(counts: ReadonlyMap<string, ReadonlyMap<number, number>>, threshold = 2): Evenness {
  const traverseSet = new Set<number>();
  for (const perTraverse of counts.values()) for (const [t, c] of perTraverse) if (c > 0) traverseSet.add(t);
  let columns: number[][] = [...traverseSet].sort((a, b) => a - b).map((t) => [t]);
  if (columns.length < 2) return { ok: false, reason: 'fewer than two traverses with grains: nothing to compare' };
  let rows: Row[] = [...counts.entries()]
    .map(([taxon, per]) => ({ taxon, members: [taxon], counts: columns.map(([t]) => per.get(t as number) ?? 0) }))
    .filter((r) => total(r.counts) > 0);
  if (rows.length < 2) return { ok: false, reason: 'fewer than two types: nothing to compare' };
  const pooledTaxa: string[] = [];

  const poolSmallestRow = () => {
    const byTotal = [...rows].sort((a, b) => total(a.counts) - total(b.counts));
    const pooled = rows.find((r) => r.taxon === POOLED);
    const smallest = byTotal.find((r) => r.taxon !== POOLED) as Row;
    pooledTaxa.push(...smallest.members);
    if (pooled) {
      pooled.counts = pooled.counts.map((c, j) => c + (smallest.counts[j] ?? 0));
      rows = rows.filter((r) => r !== smallest);
    } else {
      const second = byTotal.find((r) => r.taxon !== POOLED && r !== smallest) as Row;
      pooledTaxa.push(...second.members);
      rows = [...rows.filter((r) => r !== smallest && r !== second), { taxon: POOLED, members: [...smallest.members, ...second.members], counts: smallest.counts.map((c, j) => c + (second.counts[j] ?? 0)) }];
    }
  };
  const mergeSmallestColumn = () => {
    const totals = columns.map((_, j) => total(rows.map((r) => r.counts[j] ?? 0)));
    const j = totals.indexOf(Math.min(...totals));
    const k = j === 0 ? 1 : j === columns.length - 1 ? j - 1 : (totals[j - 1] as number) <= (totals[j + 1] as number) ? j - 1 : j + 1;
    const [a, b] = [Math.min(j, k), Math.max(j, k)];
    columns = [...columns.slice(0, a), [...(columns[a] as number[]), ...(columns[b] as number[])], ...columns.slice(b + 1)];
    for (const r of rows) r.counts = [...r.counts.slice(0, a), (r.counts[a] as number) + (r.counts[b] as number), ...r.counts.slice(b + 1)];
  };

  while (!expectedCountsOk(expectedOf(rows))) {
    // Keep at least two rows of named taxa where possible: pool while more than two rows remain.
    if (rows.length > 2) poolSmallestRow();
    else if (columns.length > 2) mergeSmallestColumn();
    else return { ok: false, reason: 'too few grains per traverse for a χ² test, even with rare types pooled and traverses merged' };
  }
  const result = chiSquareTest(rows.map((r) => r.counts));
  const flagged: EvennessCell[] = [];
  rows.forEach((r, i) =>
    columns.forEach((traverses, j) => {
      const residual = (result.residuals[i] as number[])[j] as number;
      if (Math.abs(residual) > threshold) {
        flagged.push({ taxon: r.taxon, traverses, observed: r.counts[j] as number, expected: (result.expected[i] as number[])[j] as number, residual });
      }
    }),
  );
  flagged.sort((a, b) => Math.abs(b.residual) - Math.abs(a.residual));
  return {
    ok: true,
    test: {
      result,
      taxa: rows.map((r) => r.taxon),
      columns,
      pooledTaxa,
      mergedTraverses: columns.filter((c) => c.length > 1),
      flagged,
    },
  };
}

const traverseWords = (ts: readonly number[]) => (ts.length === 1 ? `Traverse ${ts[0]}` : `Traverses ${ts.join('+')}`);

/** "Traverse 3 has more Pinus than the rest (12 counted, 6.1 expected; adjusted residual +2.6)". */
export function describeCell(cell: EvennessCell): string {
  const more = cell.observed > cell.expected;
  const verb = cell.traverses.length === 1 ? 'has' : 'have';
  return `${traverseWords(cell.traverses)} ${verb} ${more ? 'more' : 'fewer'} ${cell.taxon} than the rest (${cell.observed} counted, ${cell.expected.toFixed(1)} expected; adjusted residual ${cell.residual > 0 ? '+' : ''}${cell.residual.toFixed(1)})`;
}
