import { describeRules } from '../rules/rule-set.js';
import type { LevelState } from '../model/level-state.js';
import { levelReport } from '../rules/level-report.js';
import { inPollenSum } from '../keymap/keymap.js';
import { slideCounts } from '../model/slides.js';
import { clopperPearsonInterval } from '../stats/clopper-pearson.js';
import { rarefy } from '../stats/rarefaction.js';
import { sisonGlazIntervals } from '../stats/simultaneous.js';

const pct = (v: number | null) => (v === null ? null : 100 * v);

/**
 * Everything `exine summary --json` reports about one level, as one plain object.
 * Percentages and their limits are in percent; coverage as a fraction.
 */
export function levelSummary(state: LevelState, rarefyAt: readonly number[] = []) {
  const { stats, rules } = levelReport(state);
  const { table } = stats;
  const h = state.header;
  const sumRows = table.rows.filter((r) => r.inSum && r.count > 0);
  // Simultaneous limits for all the types of the sum together (Sison & Glaz 1995).
  const simultaneous = new Map(sisonGlazIntervals(sumRows.map((r) => r.count)).map((ci, i) => [sumRows[i]?.taxon, ci]));
  const sumCounts = sumRows.map((r) => r.count);
  return {
    level: h.level,
    depth: h.depth,
    site: h.site,
    core: h.core,
    slide: h.slide,
    // Every slide the level was counted on, with the grains from it that count now.
    slides: slideCounts(state).map((c) => ({
      slide: c.slide,
      firstTraverse: c.firstTraverse,
      grains: c.grains,
      pollenSum: Object.entries(c.counts).reduce((a, [taxon, n]) => a + (inPollenSum(state.keymap, taxon) ? n : 0), 0),
    })),
    analyst: h.analyst,
    keymap: state.keymap.name,
    pollenSum: table.pollenSum,
    grains: table.grains,
    types: stats.freq.s,
    typesAll: table.rows.filter((r) => r.count > 0).length,
    traverses: state.traverse,
    // Grains taken out by corrections in the audit that still stand.
    voided: Object.values(state.voids).reduce((a, g) => a + g.length, 0),
    sittings: state.sitting,
    closedCleanly: state.closed,
    finishedAt: state.finishedAt,
    reopens: state.reopens,
    groups: table.groupTotals,
    sumGroups: table.sumGroups,
    groupOrder: table.groups,
    groupRoles: Object.fromEntries(state.keymap.groups.map((g) => [g.name, g.role])),
    taxa: table.rows.map((r) => {
      const cp = r.basis > 0 ? clopperPearsonInterval(r.count, r.basis) : null;
      const sim = simultaneous.get(r.taxon) ?? null;
      return {
        key: r.key,
        taxon: r.taxon,
        group: r.group,
        inSum: r.inSum,
        count: r.count,
        /** Of `count`, the cf. grains (identification probable, not certain). */
        cf: state.cf[r.taxon] ?? 0,
        basis: r.basis,
        percent: r.percent,
        ciLow: r.ciLow,
        ciHigh: r.ciHigh,
        exactLow: pct(cp?.low ?? null),
        exactHigh: pct(cp?.high ?? null),
        simultaneousLow: pct(sim?.low ?? null),
        simultaneousHigh: pct(sim?.high ?? null),
      };
    }),
    intervals: {
      ci: 'Wilson score 95%',
      exact: 'Clopper–Pearson 95%',
      simultaneous: 'Sison & Glaz (1995) 95%, all types of the sum at once',
    },
    coverage: stats.coverage,
    goodTuring: stats.goodTuring,
    chao1: stats.chao1,
    rarefaction: rarefyAt.map((n) => {
      const r = rarefy(sumCounts, n);
      return { n, expected: r?.expected ?? null, se: r?.se ?? null };
    }),
    sinceNewType: stats.sinceNewType,
    markers: stats.markers,
    spike: state.spike,
    concentration: stats.concentration
      ? {
          value: stats.concentration.value,
          relativeError: stats.concentration.relativeError,
          low: stats.concentration.low,
          high: stats.concentration.high,
          unit: stats.concentration.unit,
          influx: stats.concentration.influx,
          influxUnit: 'grains/cm2/yr',
        }
      : null,
    ruleSet: describeRules(state.rules),
    ruleMode: rules.mode,
    minSum: rules.minSum,
    rules: rules.rules,
    met: rules.met,
    grainsNeeded: rules.grainsNeeded,
    notes: state.notes,
    addedTypes: state.addedTypes,
    // When the count could first have stopped, and the latest time the set became met.
    firstMet: state.firstRulesMet,
    lastMet: state.lastRulesMet,
  };
}

export type LevelSummary = ReturnType<typeof levelSummary>;
