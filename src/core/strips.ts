import type { CoreConfig } from './core-file.js';
import type { OverviewRow } from './overview.js';

/** One strip: a taxon (or a summary group) and its percentage at each row of the overview. */
export interface Strip {
  readonly name: string;
  readonly group: boolean;
  /** Percent per row, in the overview's row order; null where nothing is counted (planned, unreadable, empty). */
  readonly values: readonly (number | null)[];
  readonly max: number;
  readonly mean: number;
}

/**
 * Strips for the summary groups of core.json first, then every taxon counted,
 * commonest first (mean percentage over the levels that have a pollen sum). A
 * group is a percentage of the pollen sum, its taxa outside the sum added to the
 * basis, as for a single taxon.
 */
export function stripsOf(config: CoreConfig, rows: readonly OverviewRow[]): Strip[] {
  const counted = rows.filter((r) => r.shares !== null);
  const strip = (name: string, group: boolean, valueOf: (r: OverviewRow) => number): Strip => {
    const values = rows.map((r) => (r.shares === null ? null : valueOf(r)));
    const present = values.filter((v): v is number => v !== null);
    const max = present.length ? Math.max(...present) : 0;
    const mean = present.length ? present.reduce((a, b) => a + b, 0) / present.length : 0;
    return { name, group, values, max, mean };
  };
  const groups = config.summaryGroups.map((g) =>
    strip(g.name, true, (r) => {
      let inSum = 0;
      let outside = 0;
      for (const t of new Set(g.taxa.map((name) => config.synonyms[name] ?? name))) {
        const n = r.counts[t] ?? 0;
        if (r.shares?.[t] !== undefined) inSum += n;
        else outside += n;
      }
      return (100 * (inSum + outside)) / (r.pollenSum + outside);
    }),
  );
  const taxa = new Set<string>();
  for (const r of counted) for (const t of Object.keys(r.percents)) taxa.add(t);
  const each = [...taxa].map((t) => strip(t, false, (r) => r.percents[t] ?? 0));
  each.sort((a, b) => b.mean - a.mean || a.name.localeCompare(b.name));
  return [...groups, ...each];
}
