import type { SummaryGroup } from '../core/core-file.js';
import { statusOf } from '../core/core-level.js';
import type { Group } from '../keymap/groups.js';
import { groupRank } from '../keymap/keymap.js';
import { concentration } from '../stats/concentration.js';
import { levelTable, type LevelTable } from '../stats/level-table.js';
import type { Cell } from './csv-text.js';
import { bySlideCell, orderLevels, slidesCell, type ExportLevel } from './level-export.js';

export type MatrixValues = 'counts' | 'percent';

export interface MatrixTaxon {
  readonly taxon: string;
  readonly group: Group;
  readonly inSum: boolean;
  /** Names merged into this one (synonyms of core.json). */
  readonly mergedFrom: readonly string[];
  readonly levels: number;
  readonly grains: number;
}

const round = (value: number | null, places: number): number | null => (value === null ? null : Number(value.toFixed(places)));

/**
 * The core's matrix: one row per level in depth order, its status and slides, the
 * pollen sum and markers (counted whether or not spike data is recorded), then the
 * analyst's summary groups and one column per taxon: counts, or percentages (of
 * the pollen sum; a group outside the sum of the sum plus that group, as `summary`
 * gives them). A summary group is the sum of its taxa's values.
 */
export function coreMatrix(
  levels: readonly ExportLevel[],
  options: { values: MatrixValues; summaryGroups: readonly SummaryGroup[]; mergedFrom?: ReadonlyMap<string, readonly string[]> },
): { columns: string[]; rows: Cell[][]; taxa: MatrixTaxon[] } {
  const ordered = orderLevels(levels);
  const tables: LevelTable[] = ordered.map((l) => levelTable(l.state));
  // A taxon's group is ranked by the keymap of the first level that has it: levels may have groups of their own.
  const seen = new Map<string, { group: Group; rank: number; inSum: boolean; first: number; levels: number; grains: number }>();
  for (const [i, table] of tables.entries()) {
    const keymap = (ordered[i] as ExportLevel).state.keymap;
    for (const r of table.rows) {
      const t = seen.get(r.taxon) ?? { group: r.group, rank: groupRank(keymap, r.group), inSum: r.inSum, first: seen.size, levels: 0, grains: 0 };
      if (r.count > 0) {
        t.levels++;
        t.grains += r.count;
      }
      seen.set(r.taxon, t);
    }
  }
  const taxa = [...seen.entries()]
    .sort(([, a], [, b]) => a.rank - b.rank || a.first - b.first)
    .map(([taxon, t]): MatrixTaxon => ({ taxon, group: t.group, inSum: t.inSum, mergedFrom: options.mergedFrom?.get(taxon) ?? [], levels: t.levels, grains: t.grains }));
  const groupNames = options.summaryGroups.map((g) => `sum:${g.name}`);
  const columns = ['level', 'depth', 'status', 'rules_met', 'slides', 'grains_by_slide', 'analyst', 'pollen_sum', 'grains', 'markers', 'concentration', 'conc_unit', 'influx', ...groupNames, ...taxa.map((t) => t.taxon), 'source'];
  const rows = ordered.map((l, i): Cell[] => {
    const h = l.state.header;
    const table = tables[i] as LevelTable;
    const markers = table.markers;
    const conc = l.state.spike ? concentration(table.pollenSum, markers, l.state.spike) : null;
    const value = new Map(table.rows.map((r) => [r.taxon, options.values === 'counts' ? r.count : r.percent]));
    const cell = (taxon: string): number | null => {
      const v = value.get(taxon);
      if (v === undefined) return options.values === 'counts' ? 0 : table.pollenSum > 0 ? 0 : null;
      return options.values === 'counts' ? v : round(v, 4);
    };
    const groupCell = (g: SummaryGroup): number | null => {
      const parts = g.taxa.map(cell).filter((v): v is number => v !== null);
      return parts.length ? round(parts.reduce((a, b) => a + b, 0), 4) : null;
    };
    return [
      h.level,
      h.depth,
      statusOf(l.state),
      l.state.rulesMet ? 'yes' : 'no',
      slidesCell(l.state),
      bySlideCell(l.state),
      h.analyst,
      table.pollenSum,
      table.grains,
      markers,
      round(conc?.value ?? null, 1),
      conc ? conc.unit : null,
      round(conc?.influx ?? null, 2),
      ...options.summaryGroups.map(groupCell),
      ...taxa.map((t) => cell(t.taxon)),
      l.source,
    ];
  });
  return { columns, rows, taxa };
}

export const TAXA_COLUMNS = ['taxon', 'group', 'in_sum', 'merged_from', 'levels', 'grains'] as const;

/** The taxa of the matrix, one row each: its group, whether it is in the pollen sum, and the names merged into it. */
export function taxaRows(taxa: readonly MatrixTaxon[]): Cell[][] {
  return taxa.map((t) => [t.taxon, t.group, t.inSum ? 'yes' : 'no', t.mergedFrom.join(';'), t.levels, t.grains]);
}
