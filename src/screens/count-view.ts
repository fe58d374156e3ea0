import { isTypeRole } from '../keymap/groups.js';
import { roleOf } from '../keymap/keymap.js';
import type { LevelState } from '../model/level-state.js';
import { levelReport, type LevelReport } from '../rules/level-report.js';
import type { Snapshot } from '../session/counting-session.js';
import { LiveSaturationCurve, type SaturationCurve } from '../stats/accumulation.js';
import { countLayout, tooSmall, type CountLayout } from './count-layout.js';
import { headingLines, keysLine, statusArea, stopBannerLine } from './count-lines.js';
import { helpOverlay } from './help-overlay.js';
import { rareLineCount, rareLines, rareTypes, type RareType } from './rare-types.js';
import { recentLines } from './recent-events.js';
import { rulesLines, rulesPanelHeight } from './rules-panel.js';
import { saturationLines } from './saturation-panel.js';
import { titled, type Line, type Panel } from './styled-line.js';
import { sumLines, sumPanelHeight } from './sum-panel.js';
import { tableWidth, totalsLines } from './totals-table.js';

/** What the screen works out from the level once per change of state, not once per tick of the clock. */
export interface LevelFacts {
  readonly report: LevelReport;
  readonly curve: SaturationCurve;
  readonly rare: readonly RareType[];
  /** The pollen and spore types counted so far (of groups in the sum or outside it: markers and indeterminables are not discoveries). */
  readonly types: ReadonlySet<string>;
}

// The curve after each key from where the stack changed, not from every grain (one screen per process).
const liveCurve = new LiveSaturationCurve();

export function levelFacts(state: LevelState, rareThreshold: number): LevelFacts {
  const groupOf = new Map(Object.values(state.keymap.keys).map((b) => [b.taxon, b.group]));
  const types = new Set(Object.keys(state.firstSeen).filter((t) => isTypeRole(roleOf(state.keymap, groupOf.get(t) ?? 'other'))));
  return { report: levelReport(state), curve: liveCurve.curve(state), rare: rareTypes(state, rareThreshold), types };
}

export interface CountViewInput {
  readonly snapshot: Snapshot;
  readonly columns: number;
  readonly rows: number;
  /** The time now (ms since the epoch): the sitting's length and the breaks due follow from it. */
  readonly now: number;
  readonly rareThreshold: number;
  /** Remind the analyst to rest the eyes after this many minutes of a sitting; null: never. */
  readonly breakMinutes: number | null;
}

/** A column of panels beside the table; every panel after the first stands `gap` lines below the one before. */
export interface SideColumn {
  readonly width: number;
  readonly marginLeft: number;
  readonly panels: readonly Panel[];
}

export type CountMain =
  | { readonly kind: 'help'; readonly panel: Panel & { readonly height: number } }
  | { readonly kind: 'panels'; readonly height: number; readonly table: Panel; readonly sideWidth: number; readonly gap: number; readonly columns: readonly SideColumn[] };

/** Values whose rise rings the bell: the latest rules-met event's seq, the types found, the break spans passed. */
export interface Rings {
  readonly stop: number;
  readonly types: number;
  readonly breaks: number;
  /** Keys that counted nothing. */
  readonly misses: number;
}

/** Everything the counting screen shows, top to bottom, as plain values. */
export interface CountScreenView {
  /** Set below the smallest size the layout supports: the screen shows only this. */
  readonly tooSmall: string | null;
  readonly width: number;
  readonly height: number;
  readonly heading: readonly Line[];
  readonly banner: Line | null;
  readonly main: CountMain;
  readonly status: { readonly height: number; readonly line: Line };
  readonly keys: Line;
  readonly rings: Rings;
}

/** The taxon of the grain just counted: the last event, the rule verdict it brought aside. */
export function lastGrainTaxon(state: LevelState): string | null {
  for (let i = state.recent.length - 1; i >= 0; i--) {
    const e = state.recent[i];
    if (e?.type === 'rules-met' || e?.type === 'rules-unmet') continue;
    return e?.type === 'grain' ? e.taxon : null;
  }
  return null;
}

/** Break spans passed in this sitting: the reminder shows from the first on, and each new one rings. */
export function breaksPassed(sittingMs: number, breakMinutes: number | null): number {
  return breakMinutes === null ? 0 : Math.floor(sittingMs / (breakMinutes * 60_000));
}

/** The table and the side columns: sum, rules, curve (and recent events when narrow); rare types and recent events when wide. */
function panelsArea(state: LevelState, facts: LevelFacts, layout: CountLayout, rareThreshold: number): CountMain {
  const { report, curve, rare, types } = facts;
  const { table } = report.stats;
  const { mainHeight, taxonWidth, sideWidth, wide, colWidth, compactSum, gap, plotRows, legend, rareRoom, recentRoom } = layout;
  const panel = (lines: readonly Line[]): Panel => ({ width: colWidth, lines });
  const recent = panel(recentLines(state.recent, recentRoom, colWidth, state.firstSeen, (t) => types.has(t)));
  const rules = rulesPanelHeight(report.rules, report.stats.concentration) ? [panel(rulesLines(report.rules, report.stats.concentration, colWidth))] : [];
  const curvePanel = plotRows >= 2 ? [panel(titled(saturationLines(curve, colWidth, plotRows, legend)))] : [];
  const first: SideColumn = {
    width: colWidth,
    marginLeft: 0,
    panels: [panel(sumLines(table, state.rules.targetSum, colWidth, compactSum)), ...rules, ...curvePanel, ...(wide ? [] : [recent])],
  };
  const second = (): SideColumn => ({ width: colWidth, marginLeft: 2, panels: [panel(titled(rareLines(rare, rareThreshold, colWidth, rareRoom))), recent] });
  return {
    kind: 'panels',
    height: mainHeight,
    table: { width: tableWidth(taxonWidth), lines: totalsLines(table, mainHeight - 1, lastGrainTaxon(state), taxonWidth, state.cf) },
    sideWidth,
    gap,
    columns: wide ? [first, second()] : [first],
  };
}

/** The counting screen for a session's snapshot, a terminal size and a time: what it shows, computed without a terminal. */
export function countScreenView(input: CountViewInput, facts: LevelFacts = levelFacts(input.snapshot.state, input.rareThreshold)): CountScreenView {
  const { snapshot, columns: width, now, rareThreshold, breakMinutes } = input;
  const { state, mode } = snapshot;
  const height = Math.max(12, input.rows - 1);
  const sittingMs = now - Date.parse(state.sittingStartedAt);
  const breaks = breaksPassed(sittingMs, breakMinutes);
  const status = statusArea(snapshot, width);
  const banner = stopBannerLine(state, width);
  const { report } = facts;
  const layout = countLayout({
    width,
    height,
    statusLines: status.height,
    banner: banner !== null,
    sumHeight: (compact) => sumPanelHeight(report.stats.table, state.rules.targetSum, compact),
    rulesHeight: rulesPanelHeight(report.rules, report.stats.concentration),
    rareLines: rareLineCount(facts.rare),
  });
  return {
    tooSmall: tooSmall(width, input.rows),
    width,
    height,
    heading: headingLines(state, sittingMs, breakMinutes, breaks > 0),
    banner,
    main: mode?.kind === 'help' ? { kind: 'help', panel: { width, height: layout.mainHeight, lines: helpOverlay(state.keymap, width, layout.mainHeight) } } : panelsArea(state, facts, layout, rareThreshold),
    status,
    keys: keysLine(state.keymap, width, state.finishedAt !== null),
    rings: { stop: state.lastRulesMet?.seq ?? 0, types: facts.types.size, breaks, misses: snapshot.misses },
  };
}
