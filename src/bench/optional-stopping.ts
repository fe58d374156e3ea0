import { evaluateRules } from '../rules/evaluate-rules.js';
import { DEFAULT_TARGET_SUM, NO_RULES, type RuleSet } from '../rules/rule-set.js';
import type { Keymap } from '../keymap/keymap.js';
import { syntheticKeymap } from './synthetic-keymap.js';
import type { OpenEvent, SessionEvent } from '../model/events.js';
import { startFold } from '../model/fold.js';
import { levelStats } from '../stats/level-stats.js';
import { sisonGlazIntervals } from '../stats/simultaneous.js';
import { wilsonInterval } from '../stats/wilson.js';
import { pickWeighted, seededRandom } from '../demo/seeded-random.js';
import { quantile } from './stats.js';

/** The known assemblage: nine named shares and a tail of twenty rare types of 0.1% each. */
const MAJOR = [0.45, 0.2, 0.1, 0.08, 0.05, 0.04, 0.03, 0.02, 0.01];
const SHARES = [...MAJOR, ...Array<number>(20).fill(0.001)];
const CAP = 5000;

const RULE_SETS: readonly { name: string; rules: RuleSet }[] = [
  { name: 'target 300', rules: { ...NO_RULES, targetSum: 300 } },
  { name: `target ${DEFAULT_TARGET_SUM}`, rules: { ...NO_RULES, targetSum: DEFAULT_TARGET_SUM } },
  { name: 'precision ±3 pts, taxa ≥ 5%', rules: { ...NO_RULES, precision: { halfWidth: 3, share: 5, taxa: null } } },
  { name: 'coverage 0.99', rules: { ...NO_RULES, coverage: 0.99 } },
];

interface Outcome {
  readonly grains: number;
  /** For each major taxon: did the reported 95% Wilson interval contain the true share? */
  readonly covered: readonly boolean[];
  /** Did the Sison–Glaz simultaneous limits contain all nine true shares at once? */
  readonly jointSimultaneous: boolean;
}

/** One simulated count: grains drawn one by one, the real rules judged after each, until the set is met. */
function countOnce(rules: RuleSet, keymap: Keymap, random: () => number): Outcome {
  const at = new Date(0).toISOString();
  const open = { type: 'open', seq: 1, at, format: 2, session: 's'.repeat(32), level: 'sim', depth: null, site: null, core: null, slide: null, analyst: null, keymap, rules, spike: null } as OpenEvent;
  const folding = startFold(open, keymap);
  const taxa = Object.values(keymap.keys).map((b) => b.taxon);
  const counts = new Array<number>(taxa.length).fill(0);
  let n = 0;
  const targetOnly = rules.targetSum !== null && Object.entries(rules).every(([k, v]) => k === 'targetSum' || k === 'mode' || v === null);
  while (n < CAP) {
    const i = pickWeighted(random, SHARES);
    counts[i]!++;
    n++;
    folding.add({ type: 'grain', taxon: taxa[i] as string, traverse: 1, key: 'x', seq: n + 1, at } as SessionEvent);
    // A fixed target needs no judging before it is reached; every other rule is judged at every grain.
    if (targetOnly ? n >= (rules.targetSum as number) : evaluateRules(rules, levelStats(folding.state()), null).met) break;
  }
  // Simultaneous limits over the types seen, as summary reports them.
  const seen = counts.map((c, i) => [c, i] as const).filter(([c]) => c > 0);
  const limits = sisonGlazIntervals(seen.map(([c]) => c));
  const byType = new Map(seen.map(([, i], k) => [i, limits[k]]));
  const jointSimultaneous = MAJOR.every((share, i) => {
    const ci = byType.get(i);
    return ci !== undefined && ci.low <= share && share <= ci.high;
  });
  return {
    grains: n,
    covered: MAJOR.map((share, i) => {
      const ci = wilsonInterval(counts[i] as number, n);
      return ci.low <= share && share <= ci.high;
    }),
    jointSimultaneous,
  };
}

/**
 * Optional stopping: does stopping when the data look good enough bias what is
 * reported? Counts drawn from a known assemblage, stopped by each rule, and
 * the reported intervals checked against the true shares.
 */
export function benchOptionalStopping(runs = 2000): string[] {
  const keymap = syntheticKeymap(SHARES.length);
  const lines = [
    `(e) optional stopping: ${runs} simulated counts per rule from a known assemblage (shares ${MAJOR.join(', ')} and 20 types of 0.001), cap ${CAP} grains`,
    `    ${'rule'.padEnd(30)} ${'mean'.padStart(6)} ${'p90'.padStart(6)}  95% Wilson intervals containing the true share: mean of 9 taxa · worst taxon · all 9 at once; Sison–Glaz limits holding all 9 at once`,
  ];
  RULE_SETS.forEach(({ name, rules }, r) => {
    const random = seededRandom(4242 + r);
    const outcomes = Array.from({ length: runs }, () => countOnce(rules, keymap, random));
    const grains = outcomes.map((o) => o.grains).sort((a, b) => a - b);
    const mean = grains.reduce((a, b) => a + b, 0) / runs;
    const perTaxon = MAJOR.map((_, i) => outcomes.filter((o) => o.covered[i]).length / runs);
    const all = outcomes.filter((o) => o.covered.every(Boolean)).length / runs;
    const joint = outcomes.filter((o) => o.jointSimultaneous).length / runs;
    const capped = outcomes.filter((o) => o.grains >= CAP).length;
    const worst = Math.min(...perTaxon);
    const worstTaxon = perTaxon.indexOf(worst);
    lines.push(
      `    ${name.padEnd(30)} ${mean.toFixed(0).padStart(6)} ${String(quantile(grains, 0.9)).padStart(6)}  ${(100 * perTaxon.reduce((a, b) => a + b, 0) / perTaxon.length).toFixed(1)}% · ${(100 * worst).toFixed(1)}% (share ${MAJOR[worstTaxon]}) · ${(100 * all).toFixed(1)}%; ${(100 * joint).toFixed(1)}%${capped ? ` · ${capped} hit the cap` : ''}`,
    );
  });
  return lines;
}
