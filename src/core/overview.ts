import type { LevelState } from '../model/level-state.js';
import { levelReport } from '../rules/level-report.js';
import { describeRules } from '../rules/rule-set.js';
import type { ConcentrationUnit } from '../stats/concentration.js';
import { proportions } from '../stats/squared-chord.js';
import type { CoreConfig } from './core-file.js';
import type { CoreLevel } from './core-level.js';

export type LevelStatus = 'planned' | 'in progress' | 'rules met' | 'finished' | 'unreadable';

/** The file's integrity as `exine verify` judges it, from the same read. */
export type Integrity =
  | { readonly kind: 'intact'; readonly closed: boolean }
  /** The last line is torn: verify fails it, and the next exine count repairs it. */
  | { readonly kind: 'torn'; readonly message: string }
  /** Damage that is not the last line: nothing is read. */
  | { readonly kind: 'damaged'; readonly message: string };

/** One level of the core as the overview shows it; a planned depth has no file. */
export interface OverviewRow {
  readonly depth: number | null;
  readonly file: string | null;
  readonly path: string | null;
  readonly status: LevelStatus;
  readonly pollenSum: number;
  readonly grains: number;
  /** The rules' target pollen sum, when one is set. */
  readonly targetSum: number | null;
  readonly rulesText: string | null;
  /** More grains of the pollen sum the rules need, as estimated now; null when unknown or planned. */
  readonly grainsNeeded: number | null;
  readonly markers: number;
  readonly concentration: { readonly value: number | null; readonly relativeError: number | null; readonly unit: ConcentrationUnit } | null;
  readonly sittings: number;
  readonly countingMs: number;
  readonly analyst: string | null;
  /** Time of the file's last event (ISO), null when planned or unreadable. */
  readonly lastAt: string | null;
  readonly integrity: Integrity | null;
  readonly slides: number;
  /** Why the level keeps its own settings (copied in from elsewhere); empty when it inherits the core's. */
  readonly outside: readonly string[];
  /** Shares of the pollen sum by taxon, synonyms merged; null while nothing of the sum is counted. */
  readonly shares: Readonly<Record<string, number>> | null;
  /** Percent by taxon (synonyms merged) on the usual basis: of the sum, or sum + own group outside it. */
  readonly percents: Readonly<Record<string, number>>;
  /** Grains by taxon, synonyms merged. */
  readonly counts: Readonly<Record<string, number>>;
}

function statusOf(state: LevelState, met: boolean): LevelStatus {
  if (state.finishedAt !== null) return 'finished';
  return met ? 'rules met' : 'in progress';
}

const renamed = (synonyms: CoreConfig['synonyms'], taxon: string) => synonyms[taxon] ?? taxon;

function levelRow(config: CoreConfig, level: CoreLevel, state: LevelState): OverviewRow {
  const { stats, rules } = levelReport(state);
  const { table } = stats;
  const sumCounts: Record<string, number> = {};
  const percents: Record<string, number> = {};
  const counts: Record<string, number> = {};
  for (const r of table.rows) {
    const taxon = renamed(config.synonyms, r.taxon);
    if (r.count > 0) counts[taxon] = (counts[taxon] ?? 0) + r.count;
    if (r.inSum && r.count > 0) sumCounts[taxon] = (sumCounts[taxon] ?? 0) + r.count;
    if (r.percent !== null && r.count > 0) percents[taxon] = (percents[taxon] ?? 0) + r.percent;
  }
  const c = stats.concentration;
  return {
    depth: level.depth,
    file: level.file,
    path: level.path,
    status: statusOf(state, rules.met),
    pollenSum: table.pollenSum,
    grains: table.grains,
    targetSum: state.rules.targetSum,
    rulesText: describeRules(state.rules),
    grainsNeeded: rules.grainsNeeded,
    markers: stats.markers,
    concentration: c ? { value: c.value, relativeError: c.relativeError, unit: c.unit } : null,
    sittings: state.sitting,
    countingMs: state.countingMs,
    analyst: state.header.analyst,
    lastAt: state.lastAt,
    integrity: level.warnings.length > 0 ? { kind: 'torn', message: level.warnings.join('; ') } : { kind: 'intact', closed: state.closed },
    slides: state.slides.length,
    outside: level.outside ? level.differences : [],
    shares: proportions(sumCounts),
    percents,
    counts,
  };
}

const EMPTY = {
  pollenSum: 0,
  grains: 0,
  grainsNeeded: null,
  markers: 0,
  concentration: null,
  sittings: 0,
  countingMs: 0,
  analyst: null,
  lastAt: null,
  slides: 0,
  outside: [],
  shares: null,
  percents: {},
  counts: {},
} as const;

function plannedRow(config: CoreConfig, depth: number): OverviewRow {
  return { ...EMPTY, depth, file: null, path: null, status: 'planned', targetSum: config.rules.targetSum, rulesText: describeRules(config.rules), integrity: null };
}

function unreadableRow(level: CoreLevel): OverviewRow {
  return { ...EMPTY, depth: level.depth, file: level.file, path: level.path, status: 'unreadable', targetSum: null, rulesText: null, integrity: { kind: 'damaged', message: level.error ?? 'cannot be read' } };
}

/** Rows by depth (no depth last), a planned depth before a file at the same depth cannot happen: it is no longer planned. */
function byDepth(a: OverviewRow, b: OverviewRow): number {
  const da = a.depth ?? Infinity;
  const db = b.depth ?? Infinity;
  return da === db ? (a.file ?? '').localeCompare(b.file ?? '') : da - db;
}

/**
 * Every level of the core, planned ones included, in depth order. Pure: the
 * folder as read (readCoreFolder) in, rows out. `cache` keeps the row of a level
 * whose read did not change (the same CoreLevel object), so a refresh after one
 * grain recomputes one row.
 */
export function overviewRows(config: CoreConfig, levels: readonly CoreLevel[], planned: readonly number[], cache?: WeakMap<CoreLevel, OverviewRow>): OverviewRow[] {
  const rows: OverviewRow[] = [];
  for (const level of levels) {
    let row = cache?.get(level);
    if (!row) {
      row = level.state ? levelRow(config, level, level.state) : unreadableRow(level);
      cache?.set(level, row);
    }
    rows.push(row);
  }
  for (const depth of planned) rows.push(plannedRow(config, depth));
  return rows.sort(byDepth);
}
