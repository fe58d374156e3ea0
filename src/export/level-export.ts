import { groupRank, roleOf } from '../keymap/keymap.js';
import type { LevelState } from '../model/level-state.js';
import { slideCounts, slideOf } from '../model/slides.js';
import { clopperPearsonInterval } from '../stats/clopper-pearson.js';
import { concentration } from '../stats/concentration.js';
import { levelTable } from '../stats/level-table.js';
import type { Cell } from './csv-text.js';

export interface ExportLevel {
  readonly state: LevelState;
  /** Session file name, so each row can be traced to its source. */
  readonly source: string;
}

/** The slides of a level in order, "A;B" (one slide: its name, as before slides were events). */
export const slidesCell = (state: LevelState): string => slideCounts(state).map((s) => s.slide ?? '–').join(';');

/** "A=312;B=190": grains per slide, a cell that splits with strsplit in R or Text to Columns in a spreadsheet. */
export function bySlideCell(state: LevelState, taxon?: string): string {
  return slideCounts(state).map((s) => `${s.slide ?? '–'}=${taxon === undefined ? s.grains : (s.counts[taxon] ?? 0)}`).join(';');
}

const round = (value: number | null, places: number): number | null =>
  value === null ? null : Number(value.toFixed(places));

export const LONG_COLUMNS = [
  'level',
  'depth',
  'site',
  'core',
  'slide',
  'taxon',
  'group',
  'in_sum',
  'count',
  'cf_count',
  'percent',
  'ci_low',
  'ci_high',
  'exact_low',
  'exact_high',
  'basis',
  'pollen_sum',
  'markers',
  'concentration',
  'conc_low',
  'conc_high',
  'conc_unit',
  'influx',
  'count_by_slide',
  'source',
] as const;

/**
 * One row per level and taxon; percent of the pollen sum (or of sum + own group
 * outside it) with 95% Wilson and Clopper–Pearson limits; with spike data, each
 * taxon's marker concentration, its exact interval and influx. The columns are the
 * same for every level, so many levels make one table; cells without a value are empty.
 */
export function longRows(levels: readonly ExportLevel[]): Cell[][] {
  const rows: Cell[][] = [];
  for (const { state, source } of levels) {
    const h = state.header;
    const table = levelTable(state);
    const markers = table.markers;
    const slides = slidesCell(state);
    const several = state.slides.length > 1;
    for (const r of table.rows) {
      const exact = r.basis > 0 ? clopperPearsonInterval(r.count, r.basis) : null;
      const conc = state.spike && roleOf(state.keymap, r.group) !== 'marker' ? concentration(r.count, markers, state.spike) : null;
      rows.push([
        h.level,
        h.depth,
        h.site,
        h.core,
        slides,
        r.taxon,
        r.group,
        r.inSum ? 'yes' : 'no',
        r.count,
        // Grains of the count marked cf. (probable, not certain): part of `count`, not added to it.
        state.cf[r.taxon] ?? 0,
        round(r.percent, 4),
        round(r.ciLow, 4),
        round(r.ciHigh, 4),
        exact ? round(100 * exact.low, 4) : null,
        exact ? round(100 * exact.high, 4) : null,
        r.basis,
        table.pollenSum,
        state.spike ? markers : null,
        round(conc?.value ?? null, 1),
        round(conc?.low ?? null, 1),
        round(conc?.high ?? null, 1),
        conc ? conc.unit : null,
        round(conc?.influx ?? null, 2),
        several ? bySlideCell(state, r.taxon) : null,
        source,
      ]);
    }
  }
  return rows;
}

/** Levels in depth order when every level has a depth; otherwise in the order given. */
export function orderLevels(levels: readonly ExportLevel[]): ExportLevel[] {
  const all = [...levels];
  if (all.every((l) => l.state.header.depth !== null)) {
    all.sort((a, b) => (a.state.header.depth as number) - (b.state.header.depth as number));
  }
  return all;
}

/**
 * One row per level, one count column per taxon; taxa ordered by group, then by
 * first appearance. Marker counts, the pollen sum's concentration and influx come
 * before the taxa (empty without spike data).
 */
export function wideTable(levels: readonly ExportLevel[]): { columns: string[]; rows: Cell[][] } {
  const ordered = orderLevels(levels);
  const taxa = new Map<string, { rank: number; first: number }>();
  const tables = ordered.map((l) => levelTable(l.state));
  // A taxon's group is ranked by the keymap of the first level that counts it: levels may have groups of their own.
  tables.forEach((table, i) => {
    const keymap = (ordered[i] as ExportLevel).state.keymap;
    for (const r of table.rows) if (!taxa.has(r.taxon)) taxa.set(r.taxon, { rank: groupRank(keymap, r.group), first: taxa.size });
  });
  const names = [...taxa.entries()]
    .sort(([, a], [, b]) => a.rank - b.rank || a.first - b.first)
    .map(([name]) => name);
  // Concentration and influx of the pollen sum beside the counts, for the concentration diagram of the core.
  const columns = ['level', 'depth', 'site', 'core', 'slide', 'grains_by_slide', 'pollen_sum', 'grains', 'markers', 'concentration', 'conc_unit', 'influx', ...names];
  const rows = ordered.map((l, i): Cell[] => {
    const h = l.state.header;
    const table = tables[i] as (typeof tables)[number];
    const markers = table.markers;
    const conc = l.state.spike ? concentration(table.pollenSum, markers, l.state.spike) : null;
    return [
      h.level,
      h.depth,
      h.site,
      h.core,
      slidesCell(l.state),
      l.state.slides.length > 1 ? bySlideCell(l.state) : null,
      table.pollenSum,
      table.grains,
      l.state.spike ? markers : null,
      round(conc?.value ?? null, 1),
      conc ? conc.unit : null,
      round(conc?.influx ?? null, 2),
      ...names.map((t) => l.state.counts[t] ?? 0),
    ];
  });
  return { columns, rows };
}

export const NOTE_COLUMNS = ['level', 'depth', 'site', 'core', 'slide', 'note_seq', 'at', 'grain_seq', 'taxon', 'traverse', 'stage_x', 'stage_y', 'text', 'source'] as const;

/** One row per note: where the grain is (traverse, stage position) and what was said of it. */
export function noteRows(levels: readonly ExportLevel[]): Cell[][] {
  const rows: Cell[][] = [];
  for (const { state, source } of orderLevels(levels)) {
    const h = state.header;
    for (const n of state.notes) {
      rows.push([h.level, h.depth, h.site, h.core, slideOf(state.slides, n.seq), n.seq, n.at, n.grain, n.taxon, n.traverse, n.stage?.x ?? null, n.stage?.y ?? null, n.text, source]);
    }
  }
  return rows;
}
