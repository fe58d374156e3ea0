import { chiSquareTest, type ChiSquareResult } from '../stats/homogeneity.js';
import { Columns } from './column-merging.js';

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
  /** By the table's first column index; merged-away columns are left stale. */
  counts: number[];
  total: number;
  members: string[];
}

const total = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0);

/**
 * Cochran (1954) judged from the margins: E = R·C/N, so the cells below 5 in a
 * row are the columns with C·R < 5N, counted from the column totals. Exact in
 * integers, and the same verdict as expectedCountsOk on the full table.
 */
function cochranHolds(rows: readonly Row[], columns: Columns, n: number): boolean {
  let smallestRow = Infinity;
  let below5 = 0;
  for (const r of rows) {
    smallestRow = Math.min(smallestRow, r.total);
    below5 += columns.atMost(Math.floor((5 * n - 1) / r.total));
  }
  return smallestRow * columns.smallest() >= n && below5 <= 0.2 * rows.length * columns.size;
}

/**
 * Are the types spread alike across the traverses? A χ² test of homogeneity of
 * the taxa × traverses table. Rare taxa are pooled into one row, then (if still
 * needed) the smallest traverses merged with a neighbour, until Cochran's rule
 * for expected counts holds. Each step works from row and column totals, so a
 * level of thousands of traverses is judged in O(steps × rows × log N).
 */
export function evennessAcrossTraverses(counts: ReadonlyMap<string, ReadonlyMap<number, number>>, threshold = 2): Evenness {
  const traverseSet = new Set<number>();
  for (const perTraverse of counts.values()) for (const [t, c] of perTraverse) if (c > 0) traverseSet.add(t);
  const traverses = [...traverseSet].sort((a, b) => a - b);
  if (traverses.length < 2) return { ok: false, reason: 'fewer than two traverses with grains: nothing to compare' };
  let rows: Row[] = [...counts.entries()]
    .map(([taxon, per]) => {
      const c = traverses.map((t) => per.get(t) ?? 0);
      return { taxon, members: [taxon], counts: c, total: total(c) };
    })
    .filter((r) => r.total > 0);
  if (rows.length < 2) return { ok: false, reason: 'fewer than two types: nothing to compare' };
  const n = total(rows.map((r) => r.total));
  const columns = new Columns(traverses, traverses.map((_, j) => total(rows.map((r) => r.counts[j] as number))), n);
  const pooledTaxa: string[] = [];

  const poolSmallestRow = () => {
    const byTotal = [...rows].sort((a, b) => a.total - b.total);
    const pooled = rows.find((r) => r.taxon === POOLED);
    const smallest = byTotal.find((r) => r.taxon !== POOLED) as Row;
    pooledTaxa.push(...smallest.members);
    if (pooled) {
      smallest.counts.forEach((c, j) => (pooled.counts[j] = (pooled.counts[j] as number) + c));
      pooled.total += smallest.total;
      rows = rows.filter((r) => r !== smallest);
    } else {
      const second = byTotal.find((r) => r.taxon !== POOLED && r !== smallest) as Row;
      pooledTaxa.push(...second.members);
      const merged = { taxon: POOLED, members: [...smallest.members, ...second.members], counts: smallest.counts.map((c, j) => c + (second.counts[j] as number)), total: smallest.total + second.total };
      rows = [...rows.filter((r) => r !== smallest && r !== second), merged];
    }
  };
  const mergeSmallestColumn = () => {
    const [kept, removed] = columns.mergeSmallest();
    for (const r of rows) r.counts[kept] = (r.counts[kept] as number) + (r.counts[removed] as number);
  };

  while (!cochranHolds(rows, columns, n)) {
    // Keep at least two rows of named taxa where possible: pool while more than two rows remain.
    if (rows.length > 2) poolSmallestRow();
    else if (columns.size > 2) mergeSmallestColumn();
    else return { ok: false, reason: 'too few grains per traverse for a χ² test, even with rare types pooled and traverses merged' };
  }
  const live = columns.order();
  const table = rows.map((r) => live.map((j) => r.counts[j] as number));
  const result = chiSquareTest(table);
  const flagged: EvennessCell[] = [];
  const columnTraverses = live.map((j) => columns.traverses[j] as number[]);
  rows.forEach((r, i) =>
    columnTraverses.forEach((traverses, j) => {
      const residual = (result.residuals[i] as number[])[j] as number;
      if (Math.abs(residual) > threshold) {
        flagged.push({ taxon: r.taxon, traverses, observed: (table[i] as number[])[j] as number, expected: (result.expected[i] as number[])[j] as number, residual });
      }
    }),
  );
  flagged.sort((a, b) => Math.abs(b.residual) - Math.abs(a.residual));
  return {
    ok: true,
    test: {
      result,
      taxa: rows.map((r) => r.taxon),
      columns: columnTraverses,
      pooledTaxa,
      mergedTraverses: columnTraverses.filter((c) => c.length > 1),
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
