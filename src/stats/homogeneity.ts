import { chisquareUpperTail } from './special-functions.js';

export interface ChiSquareResult {
  readonly statistic: number;
  readonly df: number;
  /** Upper tail of χ²_df at the statistic. */
  readonly p: number;
  readonly expected: readonly (readonly number[])[];
  /** Adjusted standardized residuals (Haberman 1973): about N(0, 1) under homogeneity. */
  readonly residuals: readonly (readonly number[])[];
}

/** Pearson's χ² test of homogeneity of an r × c table of counts (rows and columns with a zero total are the caller's to drop). */
export function chiSquareTest(table: readonly (readonly number[])[]): ChiSquareResult {
  const rows = table.map((r) => r.reduce((a, b) => a + b, 0));
  const cols = (table[0] ?? []).map((_, j) => table.reduce((a, r) => a + (r[j] ?? 0), 0));
  const n = rows.reduce((a, b) => a + b, 0);
  const expected = rows.map((ri) => cols.map((cj) => (ri * cj) / n));
  let statistic = 0;
  const residuals = table.map((r, i) =>
    r.map((o, j) => {
      const e = (expected[i] as number[])[j] as number;
      statistic += (o - e) ** 2 / e;
      return (o - e) / Math.sqrt(e * (1 - (rows[i] as number) / n) * (1 - (cols[j] as number) / n));
    }),
  );
  const df = (rows.length - 1) * (cols.length - 1);
  return { statistic, df, p: chisquareUpperTail(statistic, df), expected, residuals };
}

/** Cochran (1954): no more than 20% of expected counts below 5, and none below 1. */
export function expectedCountsOk(expected: readonly (readonly number[])[]): boolean {
  const all = expected.flat();
  return all.every((e) => e >= 1) && all.filter((e) => e < 5).length <= 0.2 * all.length;
}
