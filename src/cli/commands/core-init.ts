import { existsSync, mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { ExineError, UsageError } from '../../errors.js';
import { CORE_FILE, CORE_FORMAT, coreFileText, parseCoreFile, type CoreConfig, type MarkerBatch } from '../../core/core-file.js';
import { parsePlannedDepths } from '../../core/planned-depths.js';
import { writeFileAtomic } from '../../io/write-atomic.js';
import { DEFAULT_KEYMAP, loadKeymap } from '../../keymap/load-keymap.js';
import { readPreferences } from '../../prefs/preferences.js';
import { describeRules, type RuleSet } from '../../rules/rule-set.js';
import type { Io } from '../io.js';
import { parseFlags } from '../parse-flags.js';
import { RULE_OPTIONS, rulesFromFlags, spikeFromFlags } from '../rule-flags.js';

const { volume: _v, mass: _m, 'accumulation-rate': _r, ...CORE_RULE_OPTIONS } = RULE_OPTIONS;
const OPTIONS = {
  site: { type: 'string' },
  core: { type: 'string' },
  keymap: { type: 'string' },
  depths: { type: 'string' },
  ...CORE_RULE_OPTIONS,
} as const;

const PER_LEVEL = ['volume', 'mass', 'accumulation-rate'];

/** The flag parsers of exine count, with their messages naming this command. */
function asInit<T>(work: () => T): T {
  try {
    return work();
  } catch (error) {
    if (error instanceof UsageError) throw new UsageError(error.message.replace(/^exine count:/, 'exine core init:'));
    throw error;
  }
}

function batchFrom(flags: Record<string, string | undefined>): MarkerBatch | null {
  if (flags.tablets === undefined && flags['per-tablet'] === undefined && flags['per-tablet-sd'] === undefined) return null;
  if (flags.tablets === undefined || flags['per-tablet'] === undefined) {
    throw new UsageError('exine core init: the marker batch needs --tablets and --per-tablet (and --per-tablet-sd when the batch gives it)');
  }
  // The batch alone, as the spike of a sample of 1 cm³: the volume or mass is given per level.
  const spike = spikeFromFlags({ ...flags, volume: '1' }, null);
  return spike ? { tablets: spike.tablets, perTablet: spike.perTablet, perTabletSd: spike.perTabletSd } : null;
}

export function coreInitCommand(args: string[], io: Io): number {
  const given = PER_LEVEL.find((f) => args.some((a) => a === `--${f}` || a.startsWith(`--${f}=`)));
  if (given) throw new UsageError(`exine core init: --${given} is measured per level; give it to exine count DIR --depth D`);
  const { values, positionals } = parseFlags('core init', args, OPTIONS);
  if (positionals.length !== 1) throw new UsageError('exine core init: give one folder DIR (see exine core --help)');
  if (!values.site?.trim() || !values.core?.trim()) throw new UsageError('exine core init: give --site and --core (the names every level of the core records)');
  const dir = resolve(io.cwd, positionals[0] as string);
  const file = join(dir, CORE_FILE);
  if (existsSync(file)) throw new ExineError(`${file} already exists; edit it by hand to change the core (exine checks it at the next command)`);
  if (!existsSync(dirname(dir))) throw new ExineError(`cannot make ${dir}: the folder ${dirname(dir)} does not exist`);

  const flags = values as Record<string, string | undefined>;
  const { prefs } = readPreferences(io.env);
  const { keymap } = loadKeymap(values.keymap ?? prefs.keymap ?? DEFAULT_KEYMAP, io.cwd);
  const markerBatch = asInit(() => batchFrom(flags));
  const stand = markerBatch ? { ...markerBatch, volume: 1, mass: null, accumulationRate: null } : null;
  const rules = asInit(() => rulesFromFlags(flags, keymap, null, stand)) as RuleSet;
  let depths: number[] = [];
  if (values.depths !== undefined) {
    const planned = parsePlannedDepths(values.depths);
    if (!planned.ok) throw new UsageError(`exine core init: --depths ${planned.message}`);
    depths = planned.depths;
  }
  const config: CoreConfig = { format: CORE_FORMAT, site: values.site.trim(), core: values.core.trim(), keymap, rules, markerBatch, depths, synonyms: {}, summaryGroups: [] };
  const text = coreFileText(config);
  // What is written must read back: the same checks as every later command.
  const check = parseCoreFile(text, file);
  if (!check.ok) throw new ExineError(check.message);
  if (!existsSync(dir)) mkdirSync(dir);
  writeFileAtomic(file, text, false);
  io.stderr.write(
    `exine: made core ${config.site} ${config.core} in ${positionals[0]}: keymap "${keymap.name}", stop rules ${describeRules(rules)}` +
      `${markerBatch ? `, markers ${markerBatch.tablets} tablet(s) of ${markerBatch.perTablet}` : ''}${depths.length ? `, ${depths.length} planned depths` : ''}; ` +
      `count a level with exine count ${positionals[0]} --depth D\n`,
  );
  return 0;
}
