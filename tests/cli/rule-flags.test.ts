import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { rulesFromFlags, spikeFromFlags } from '../../src/cli/rule-flags.js';
import { DEFAULT_RULES, NO_RULES } from '../../src/rules/rule-set.js';
import { TINY_KEYMAP } from '../helpers/levels.js';
import { oneLine, runExine } from '../helpers/run-exine.js';
import { tempDir } from '../helpers/temp-dir.js';

const SPIKE = { tablets: 2, perTablet: 20000, perTabletSd: 800, volume: 1, mass: null, accumulationRate: null };

describe('stop-rule flags', () => {
  it('no rule flag on a new level: the default target of 500', () => {
    expect(rulesFromFlags({}, TINY_KEYMAP, null, null)).toEqual(DEFAULT_RULES);
  });

  it('a rule flag replaces the default: the target applies only when asked for', () => {
    expect(rulesFromFlags({ coverage: '0.99' }, TINY_KEYMAP, null, null)).toEqual({ ...NO_RULES, coverage: 0.99 });
    expect(rulesFromFlags({ coverage: '99%', target: '300', 'rule-mode': 'any' }, TINY_KEYMAP, null, null)).toEqual({
      ...NO_RULES,
      coverage: 0.99,
      targetSum: 300,
      mode: 'any',
    });
  });

  it('precision: a share in percent, or named taxa; 5% when neither is given', () => {
    expect(rulesFromFlags({ precision: '3', 'precision-share': '5%' }, TINY_KEYMAP, null, null)?.precision).toEqual({ halfWidth: 3, share: 5, taxa: null });
    expect(rulesFromFlags({ precision: '2.5', 'precision-taxa': 'Alnus, Corylus' }, TINY_KEYMAP, null, null)?.precision).toEqual({
      halfWidth: 2.5,
      share: null,
      taxa: ['Alnus', 'Corylus'],
    });
    expect(rulesFromFlags({ precision: '3' }, TINY_KEYMAP, null, null)?.precision).toEqual({ halfWidth: 3, share: 5, taxa: null });
  });

  it('on resume, flags change only what they name, and "off" drops a rule', () => {
    const recorded = { ...NO_RULES, targetSum: 500, coverage: 0.99 };
    expect(rulesFromFlags({}, TINY_KEYMAP, recorded, null)).toBeUndefined();
    expect(rulesFromFlags({ target: '300' }, TINY_KEYMAP, recorded, null)).toEqual({ ...recorded, targetSum: 300 });
    expect(rulesFromFlags({ target: 'off' }, TINY_KEYMAP, recorded, null)).toEqual({ ...recorded, targetSum: null });
    expect(() => rulesFromFlags({ target: 'off', coverage: 'off' }, TINY_KEYMAP, recorded, null)).toThrow(/no stop rule is left/);
  });

  it('spike data comes whole, or on top of what was recorded', () => {
    expect(spikeFromFlags({ tablets: '2', 'per-tablet': '20000', 'per-tablet-sd': '800', volume: '1' }, null)).toEqual(SPIKE);
    expect(spikeFromFlags({ mass: '0.4' }, SPIKE)).toEqual({ ...SPIKE, volume: null, mass: 0.4 });
    expect(spikeFromFlags({}, SPIKE)).toBe(SPIKE);
    expect(spikeFromFlags({ tablets: 'off' }, SPIKE)).toBeNull();
    expect(() => spikeFromFlags({ tablets: '2' }, null)).toThrow(/needs --tablets, --per-tablet and --volume or --mass together/);
    expect(() => spikeFromFlags({ tablets: '2', 'per-tablet': '1', mass: '1', 'accumulation-rate': '0.1' }, null)).toThrow(/give --volume, not --mass/);
  });

  it.each([
    [['--precision', '0'], /--precision must be a number above 0, not "0"/],
    [['--precision', '70'], /--precision must be a half-width in percentage points, above 0 and at most 50/],
    [['--precision-share', '5'], /--precision-share and --precision-taxa need --precision H/],
    [['--precision', '3', '--precision-taxa', 'Quercus robur'], /--precision-taxa names "Quercus robur", which is not a taxon of keymap "Temperate lowland \(letter keys\)"/],
    [['--precision', '3', '--precision-taxa', 'Alnus', '--precision-share', '5'], /give --precision-share or --precision-taxa, not both/],
    [['--coverage', '1'], /--coverage must be a fraction between 0 and 1, such as 0.95 or 95%, not "1"/],
    [['--plateau', '2.5'], /--plateau must be a whole number above 0, not "2.5" \(or off to drop the rule\)/],
    [['--rule-mode', 'some'], /--rule-mode must be all or any, not "some"/],
    [['--conc-error', '0.1'], /--conc-error needs the marker spike: --tablets, --per-tablet and --volume or --mass/],
    [['--tablets', '2', '--per-tablet', '20000', '--volume', '1', '--mass', '2'], /give --volume \(cm³\) or --mass \(g\), not both/],
    [['--per-tablet-sd', '-1', '--tablets', '1', '--per-tablet', '5', '--volume', '1'], /--per-tablet-sd cannot be negative \("-1"\)/],
    [['--per-tablet-sd=-1', '--tablets', '1', '--per-tablet', '5', '--volume', '1'], /--per-tablet-sd must be a number of 0 or more, not "-1"/],
  ])('exine count %j is a usage error that names the flag, and creates nothing', async (flags, message) => {
    const dir = tempDir();
    const run = await runExine(['count', 'new.jsonl', ...flags], dir);
    expect(run.code).toBe(2);
    expect(oneLine(run)).toMatch(message);
    expect(existsSync(join(dir, 'new.jsonl'))).toBe(false);
  });

  it('marker rules need a markers key in the keymap', () => {
    const noMarkers = { ...TINY_KEYMAP, keys: { a: TINY_KEYMAP.keys.a! } };
    expect(() => rulesFromFlags({ markers: '50' }, noMarkers, null, null)).toThrow(/marker rules need a key in a group of role marker, and keymap "tiny" has none/);
  });
});
