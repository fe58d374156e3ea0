import { NO_RULES, type RuleSet } from '../rules/rule-set.js';
import { syntheticKeymap } from './synthetic-keymap.js';
import type { OpenEvent, SessionEvent } from '../model/events.js';
import { applyEvent, startFold } from '../model/fold.js';
import { levelReport } from '../rules/level-report.js';
import { levelSummary } from '../export/level-summary.js';
import { saturationCurve } from '../stats/accumulation.js';
import { seededRandom } from '../demo/seeded-random.js';
import { fmt, ms, ratio, summarise } from './stats.js';

const RULES: RuleSet = { ...NO_RULES, targetSum: 500, precision: { halfWidth: 3, share: 5, taxa: null }, coverage: 0.99, plateau: 300, markers: 100, concError: 0.1 };

/**
 * Everything the screen recomputes after one more grain (table, intervals,
 * coverage, Chao1, concentration, every rule), at 5,000 grains of 150 types,
 * beside the plain count update (the fold of the grain) measured in the same run.
 */
export function benchStatsRecompute(grains = 5000, types = 150): string[] {
  const keymap = syntheticKeymap(types, (i) => (i % 3 === 0 ? 'herbs' : 'trees'), true);
  const at = new Date().toISOString();
  const open = {
    type: 'open', seq: 1, at, format: 2, session: 'b'.repeat(32), level: 'bench', depth: 1, site: null, core: null, slide: null, analyst: null,
    keymap, rules: RULES, spike: { tablets: 1, perTablet: 10000, perTabletSd: 300, volume: 1, mass: null, accumulationRate: null },
  } as OpenEvent;
  const random = seededRandom(7);
  const taxa = Object.values(keymap.keys).map((b) => b.taxon);
  // A long-tailed assemblage: a few common types and many rare ones, every type present.
  const pick = () => taxa[Math.min(taxa.length - 1, Math.floor(taxa.length * random() ** 3))] as string;
  const folding = startFold(open, keymap);
  let seq = 1;
  for (let i = 0; i < grains; i++) {
    const taxon = i < taxa.length ? (taxa[i] as string) : pick();
    folding.add({ type: 'grain', taxon, traverse: 1, key: 'x', seq: ++seq, at } as SessionEvent);
  }
  let state = folding.state();
  const plain: number[] = [];
  const full: number[] = [];
  for (let i = 0; i < 2000; i++) {
    const event = { type: 'grain', taxon: pick(), traverse: 1, key: 'x', seq: ++seq, at } as SessionEvent;
    let t0 = process.hrtime.bigint();
    const next = applyEvent(state, event);
    const t1 = process.hrtime.bigint();
    levelReport(next);
    const t2 = process.hrtime.bigint();
    if (i >= 200) {
      plain.push(ms(t1 - t0));
      full.push(ms(t2 - t0));
    }
    state = next;
    t0 = 0n;
  }
  const curveTimes: number[] = [];
  for (let i = 0; i < 50; i++) {
    const t0 = process.hrtime.bigint();
    saturationCurve(state);
    curveTimes.push(ms(process.hrtime.bigint() - t0));
  }
  const summaryTimes: number[] = [];
  for (let i = 0; i < 20; i++) {
    const t0 = process.hrtime.bigint();
    levelSummary(state, [300]);
    summaryTimes.push(ms(process.hrtime.bigint() - t0));
  }
  const p = summarise(plain);
  const f = summarise(full);
  const s = summarise(summaryTimes);
  return [
    `(d) statistics after one more grain, ${grains} grains of ${types} types, every rule set (target, precision, coverage, plateau, markers, concentration error)`,
    `    count update (fold)          p50 ${fmt(p.p50)}   p99 ${fmt(p.p99)}`,
    `    + all statistics and rules   p50 ${fmt(f.p50)}   p99 ${fmt(f.p99)}   ratio p50 ${ratio(f.p50, p.p50)}   (goal: well inside a 16 ms frame)`,
    `    the saturation curve of the screen (types found, E(S_n) at 60 points): median ${fmt(summarise(curveTimes).median)}`,
    `    the whole summary (adds Sison–Glaz, exact limits, E(S_300) with variance): median ${fmt(s.median)} (not on the live screen)`,
  ];
}
