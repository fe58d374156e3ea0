import { describe, expect, it } from 'vitest';
import { COVERAGE_FLOOR, evaluateRules, type RuleReport } from '../../src/rules/evaluate-rules.js';
import { DEFAULT_RULES, NO_RULES, type RuleSet } from '../../src/rules/rule-set.js';
import type { Spike } from '../../src/stats/concentration.js';
import { levelStats } from '../../src/stats/level-stats.js';
import { wilsonInterval, Z95 } from '../../src/stats/wilson.js';
import { grain, grainsFor, keymapOf, openPayload, stateOf } from '../helpers/levels.js';
import type { EventPayload } from '../../src/model/events.js';

const KEYMAP = keymapOf(30);
const SPIKE: Spike = { tablets: 2, perTablet: 20000, perTabletSd: 800, volume: 1, mass: null, accumulationRate: null };

function judge(rules: Partial<RuleSet>, payloads: EventPayload[], spike: Spike | null = null): RuleReport {
  const state = stateOf(openPayload(KEYMAP, { rules: { ...NO_RULES, ...rules }, spike }), payloads);
  return evaluateRules(state.rules, levelStats(state), state.spike);
}

const only = (report: RuleReport) => {
  expect(report.rules).toHaveLength(1);
  return report.rules[0]!;
};

describe('rule evaluation tables', () => {
  it.each([
    // sum, target → met, grains needed
    [0, 500, false, 500],
    [499, 500, false, 1],
    [500, 500, true, 0],
    [612, 500, true, 0],
  ])('target sum: %i grains of target %i → met %s, %i more', (sum, target, met, needed) => {
    const r = only(judge({ targetSum: target }, grainsFor([sum])));
    expect([r.met, r.grainsNeeded, r.value]).toEqual([met, needed, sum]);
  });

  it('the default rule set is a target sum of 500 alone (common practice: 500, about 300 where sparse)', () => {
    expect(DEFAULT_RULES).toEqual({ ...NO_RULES, targetSum: 500 });
  });

  describe('precision (Wilson half-width of the taxa at or above a share)', () => {
    const halfWidth = (x: number, n: number) => (100 * (wilsonInterval(x, n).high - wilsonInterval(x, n).low)) / 2;
    // 40 of 400 = 10%: Wilson half-width 2.95 points; 30 of 300 = 10%: 3.41 points.
    it('met when every qualifying taxon is within ±H points', () => {
      const r = only(judge({ precision: { halfWidth: 3, share: 5, taxa: null } }, grainsFor([40, 360])));
      expect(r.met).toBe(true);
      expect(r.value).toBeCloseTo(halfWidth(40, 400), 10);
      expect(r.value).toBeCloseTo(2.95, 2);
    });

    it('not met, with z²p(1−p)/e² − n more grains: 10% to ±3 points needs about 385 grains (FIELD §1)', () => {
      const r = only(judge({ precision: { halfWidth: 3, share: 5, taxa: null } }, grainsFor([30, 270])));
      expect(r.met).toBe(false);
      expect(r.value).toBeCloseTo(3.41, 2);
      expect(r.grainsNeeded).toBe(Math.ceil((Z95 ** 2 * 0.1 * 0.9) / 0.03 ** 2 - 300));
      expect(300 + (r.grainsNeeded as number)).toBe(385);
    });

    it('taxa below the share do not count; named taxa count whatever their share', () => {
      // T01 is 2% (wide relative, narrow absolute), T02 98%: with share 5 only T02 qualifies.
      const bigOnly = only(judge({ precision: { halfWidth: 2.5, share: 5, taxa: null } }, grainsFor([4, 196])));
      expect(bigOnly.value).toBeCloseTo(halfWidth(196, 200), 10);
      expect(bigOnly.met).toBe(true);
      const named = only(judge({ precision: { halfWidth: 1.5, share: null, taxa: ['T01'] } }, grainsFor([4, 196])));
      expect(named.value).toBeCloseTo(halfWidth(4, 200), 10);
      expect(named.label).toMatch(/T01/);
      expect(named.met).toBe(false);
    });

    it('nothing counted: no taxon qualifies, the rule is not met and says why', () => {
      const r = only(judge({ precision: { halfWidth: 3, share: 5, taxa: null } }, []));
      expect([r.met, r.value, r.grainsNeeded, r.note]).toEqual([false, null, null, 'no taxon qualifies yet']);
    });
  });

  describe('coverage (Chao & Jost 2012)', () => {
    it('is not judged below the floor: four grains of one type are no proof of coverage', () => {
      const r = only(judge({ coverage: 0.95 }, grainsFor([4])));
      expect(r.value).toBe(1);
      expect(r.met).toBe(false);
      expect(r.grainsNeeded).toBe(COVERAGE_FLOOR - 4);
    });

    it('met at high coverage, not met with many singletons and an estimate from the extrapolation', () => {
      expect(only(judge({ coverage: 0.95 }, grainsFor([60, 50, 40, 30, 20, 10, 2, 1]))).met).toBe(true);
      const r = only(judge({ coverage: 0.99 }, grainsFor([60, 40, 20, 10, 2, 2, 1, 1, 1, 1, 1, 1])));
      expect(r.met).toBe(false);
      expect(r.grainsNeeded).toBeGreaterThan(0);
    });
  });

  it('plateau: grains of the sum since the last new type; undo of a new type moves it back', () => {
    const r = only(judge({ plateau: 50 }, [...grainsFor([10, 1]), ...grainsFor([30])]));
    expect([r.value, r.met, r.grainsNeeded]).toEqual([30, false, 20]);
    // Undo the only T02 (seq 12): the newest type is T01 again, counted from its first grain.
    const undone = only(judge({ plateau: 40 }, [...grainsFor([10, 1]), ...grainsFor([30]), { type: 'undo', of: 12 }]));
    expect([undone.value, undone.met]).toEqual([39, false]);
    const done = only(judge({ plateau: 40 }, [...grainsFor([10, 1]), ...grainsFor([30]), { type: 'undo', of: 12 }, grain('T01')]));
    expect([done.value, done.met]).toEqual([40, true]);
  });

  it('markers: met at M; more grains estimated at the present grains-to-markers ratio; unknown with none', () => {
    expect(only(judge({ markers: 20 }, grainsFor([100], 25))).met).toBe(true);
    const r = only(judge({ markers: 40 }, grainsFor([100], 10)));
    expect([r.met, r.grainsNeeded]).toEqual([false, 300]);
    const none = only(judge({ markers: 40 }, grainsFor([100])));
    expect([none.grainsNeeded, none.note]).toEqual([null, 'unknown until a marker is counted']);
  });

  it('concentration error: the worked example (p 400, m 80) is at 12.6%; 10% needs 253 more; 2% is out of reach', () => {
    const data = grainsFor([400], 80);
    expect(only(judge({ concError: 0.15 }, data, SPIKE)).met).toBe(true);
    const r = only(judge({ concError: 0.1 }, data, SPIKE));
    expect(r.value).toBeCloseTo(0.1257, 4);
    expect([r.met, r.grainsNeeded]).toEqual([false, 253]);
    const never = only(judge({ concError: 0.02 }, data, SPIKE));
    expect(never.grainsNeeded).toBeNull();
    expect(never.note).toMatch(/unreachable: the tablets' own spread is 2\.8%/);
  });

  describe('combining rules', () => {
    const data = grainsFor([150, 150], 10); // sum 300
    it('all: met only when every rule is; needs the most any rule needs', () => {
      const r = judge({ targetSum: 300, markers: 20, mode: 'all' }, data);
      expect(r.met).toBe(false);
      expect(r.grainsNeeded).toBe(300);
      expect(judge({ targetSum: 300, markers: 10, mode: 'all' }, data).met).toBe(true);
    });
    it('any: met when one rule is', () => {
      const r = judge({ targetSum: 500, markers: 10, mode: 'any' }, data);
      expect(r.met).toBe(true);
      expect(judge({ targetSum: 500, markers: 20, mode: 'any' }, data).grainsNeeded).toBe(200);
    });
    it('a minimum sum holds the set back until it is reached', () => {
      const r = judge({ markers: 10, minSum: 400 }, data);
      expect(r.rules[0]!.met).toBe(true);
      expect([r.met, r.grainsNeeded]).toEqual([false, 100]);
      expect(judge({ markers: 10, minSum: 300 }, data).met).toBe(true);
    });
    it('all with an unknown estimate says unknown', () => {
      expect(judge({ targetSum: 500, markers: 10, mode: 'all' }, grainsFor([300])).grainsNeeded).toBeNull();
    });
  });
});
