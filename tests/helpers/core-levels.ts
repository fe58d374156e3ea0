import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { CoreConfig } from '../../src/core/core-file.js';
import { levelFileName } from '../../src/core/level-name.js';
import type { EventPayload } from '../../src/model/events.js';
import { TINY_CORE } from './core-json.js';
import { openPayload, sessionText } from './levels.js';

const KEY_OF: Record<string, string> = { Alnus: 'a', Betula: 'b', Corylus: 'c', Poaceae: 'o', Sphagnum: 's', Lycopodium: 'l' };

export interface LevelPlan {
  readonly analyst?: string;
  readonly finish?: boolean;
  /** End with a close line (a clean quit); default true. */
  readonly close?: boolean;
  readonly config?: CoreConfig;
  readonly start?: number;
}

/** The events of a level made in the core at `depth`, with `counts` grains per taxon (TINY keymap), interleaved. */
export function corePayloads(depth: number, counts: Readonly<Record<string, number>>, plan: LevelPlan = {}): EventPayload[] {
  const config = plan.config ?? TINY_CORE;
  const out: EventPayload[] = [
    openPayload(config.keymap, { level: `${config.core} ${depth}`, depth, site: config.site, core: config.core, slide: 'A', analyst: plan.analyst ?? null, rules: config.rules, spike: null, fromCore: { overrides: [] } }),
    { type: 'sitting', sitting: 1 },
  ];
  const left = { ...counts };
  // Round-robin, so the events look like a count and not one block per taxon.
  for (let more = true; more; ) {
    more = false;
    for (const [taxon, n] of Object.entries(left)) {
      if (n <= 0) continue;
      out.push({ type: 'grain', taxon, traverse: 1, key: KEY_OF[taxon] ?? taxon[0]!.toLowerCase() });
      left[taxon] = n - 1;
      more = true;
    }
  }
  if (plan.finish) out.push({ type: 'finish' });
  else if (plan.close ?? true) out.push({ type: 'close' });
  return out;
}

/** Write the level at `depth` into the core folder `dir` under the name exine gives it. */
export function writeCoreLevel(dir: string, depth: number, counts: Readonly<Record<string, number>>, plan: LevelPlan = {}): string {
  const path = join(dir, levelFileName((plan.config ?? TINY_CORE).core, depth));
  writeFileSync(path, sessionText(corePayloads(depth, counts, plan), plan.start));
  return path;
}
