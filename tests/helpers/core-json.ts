import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { coreFileText, type CoreConfig } from '../../src/core/core-file.js';
import { DEFAULT_RULES } from '../../src/rules/rule-set.js';
import { TINY_KEYMAP } from './levels.js';

export const TINY_CORE: CoreConfig = {
  format: 1,
  site: 'Test Mere',
  core: 'TM-1',
  keymap: TINY_KEYMAP,
  rules: DEFAULT_RULES,
  markerBatch: { tablets: 1, perTablet: 18583, perTabletSd: 1708 },
  depths: [10, 20, 30],
  synonyms: { Gramineae: 'Poaceae' },
  summaryGroups: [{ name: 'Arboreal', taxa: ['Alnus', 'Betula'] }],
};

/** A core folder's core.json, written as exine writes it. */
export function writeCore(dir: string, config: Partial<CoreConfig> = {}): CoreConfig {
  const full = { ...TINY_CORE, ...config };
  writeFileSync(join(dir, 'core.json'), coreFileText(full));
  return full;
}
