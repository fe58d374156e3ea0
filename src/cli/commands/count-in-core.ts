import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { UsageError } from '../../errors.js';
import type { MarkerBatch } from '../../core/core-file.js';
import { levelFileName } from '../../core/level-name.js';
import { readCoreConfig } from '../../core/read-core.js';
import { hasMarkerKey } from '../../keymap/keymap.js';
import { loadKeymap } from '../../keymap/load-keymap.js';
import { createLevel, type OpenedLevel } from '../../session/session-files.js';
import type { Spike } from '../../stats/concentration.js';
import { finiteNumber } from '../parse-flags.js';
import { RULE_OPTIONS, rulesFromFlags, spikeFromFlags } from '../rule-flags.js';
import { resumeForCounting, type LevelDefaults } from './count.js';

/** The flags that set what a level would otherwise take from core.json; volume and mass are the sample's own. */
const OVERRIDING = ['keymap', ...Object.keys(RULE_OPTIONS).filter((f) => !['volume', 'mass', 'accumulation-rate'].includes(f))];

/** The core's batch as spike data still waiting for the sample's volume or mass. */
const batchSpike = (batch: MarkerBatch | null): Spike | null =>
  batch ? { tablets: batch.tablets, perTablet: batch.perTablet, perTabletSd: batch.perTabletSd, volume: null, mass: null, accumulationRate: null } : null;

const SPIKE_FLAGS = ['tablets', 'per-tablet', 'per-tablet-sd', 'volume', 'mass', 'accumulation-rate'];

/**
 * The level at --depth in the core folder `dir`: created with the core's keymap,
 * rules and marker batch (each flag given overrides its part and is named in the
 * level's open line), or resumed as recorded.
 */
export function openInCore(dir: string, flags: Record<string, string | undefined>, check: () => void, defaults: LevelDefaults, cwd: string): OpenedLevel {
  const config = readCoreConfig(dir);
  const depth = finiteNumber('count', 'depth', flags.depth);
  if (depth === undefined) {
    const planned = config.depths.length ? ` (planned: ${config.depths.slice(0, 8).join(', ')}${config.depths.length > 8 ? ' …' : ''})` : '';
    throw new UsageError(`exine count: ${dir} is a core folder; give --depth D for the level to count${planned}`);
  }
  if (depth < 0) throw new UsageError(`exine count: --depth must be 0 or more, not ${depth}`);
  for (const field of ['site', 'core'] as const) {
    if (flags[field] !== undefined && flags[field] !== config[field]) {
      throw new UsageError(`exine count: this core is ${field} "${config[field]}" (core.json), not "${flags[field]}"; leave out --${field}`);
    }
  }
  const path = join(dir, levelFileName(config.core, depth));
  const base = batchSpike(config.markerBatch);
  if (existsSync(path)) return resumeForCounting(path, { ...flags, site: undefined, core: undefined }, check, cwd, base);

  const keymap = flags.keymap ? loadKeymap(flags.keymap, cwd).keymap : config.keymap;
  const spike = SPIKE_FLAGS.some((f) => flags[f] !== undefined) ? spikeFromFlags(flags, base) : null;
  const rules = rulesFromFlags(flags, keymap, config.rules, spike) ?? config.rules;
  if (rules.concError !== null && !spike) {
    throw new UsageError('exine count: the core\'s stop rules include a concentration error; give the sample\'s --volume (cm³) or --mass (g)');
  }
  if ((rules.markers !== null || rules.concError !== null) && !hasMarkerKey(keymap)) {
    throw new UsageError(`exine count: the stop rules count markers, and keymap "${keymap.name}" has no key for the markers group`);
  }
  check();
  return createLevel(path, {
    info: {
      level: flags.level ?? levelFileName(config.core, depth).replace(/\.jsonl$/, ''),
      depth,
      site: config.site,
      core: config.core,
      // A slide needs a name to tell it from the next one.
      slide: flags.slide ?? 'A',
      analyst: flags.analyst ?? defaults.analyst ?? null,
    },
    keymap,
    rules,
    spike,
    fromCore: { overrides: OVERRIDING.filter((f) => flags[f] !== undefined) },
  });
}
