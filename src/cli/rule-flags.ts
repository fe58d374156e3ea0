import { UsageError } from '../errors.js';
import { positiveInteger } from './parse-flags.js';
import { hasMarkerKey, type Keymap } from '../keymap/keymap.js';
import { DEFAULT_RULES, NO_RULES, type PrecisionRule, type RuleSet } from '../rules/rule-set.js';
import type { Spike } from '../stats/concentration.js';

/** The flags of `exine count` that set stop rules and marker spike data. */
export const RULE_OPTIONS = {
  target: { type: 'string' },
  precision: { type: 'string' },
  'precision-share': { type: 'string' },
  'precision-taxa': { type: 'string' },
  coverage: { type: 'string' },
  plateau: { type: 'string' },
  markers: { type: 'string' },
  'conc-error': { type: 'string' },
  'rule-mode': { type: 'string' },
  'min-sum': { type: 'string' },
  tablets: { type: 'string' },
  'per-tablet': { type: 'string' },
  'per-tablet-sd': { type: 'string' },
  volume: { type: 'string' },
  mass: { type: 'string' },
  'accumulation-rate': { type: 'string' },
} as const;

type Flags = Readonly<Record<string, string | undefined>>;

const RULE_FLAGS = ['target', 'precision', 'precision-share', 'precision-taxa', 'coverage', 'plateau', 'markers', 'conc-error', 'rule-mode', 'min-sum'];
const SPIKE_FLAGS = ['tablets', 'per-tablet', 'per-tablet-sd', 'volume', 'mass', 'accumulation-rate'];

const bad = (flag: string, what: string, value: string) => new UsageError(`exine count: --${flag} must be ${what}, not "${value}"`);

/** undefined: not given; null: "off" (remove the rule on resume); else the value. */
function read<T>(flags: Flags, flag: string, parse: (v: string) => T): T | null | undefined {
  const v = flags[flag];
  if (v === undefined) return undefined;
  if (v.trim().toLowerCase() === 'off') return null;
  return parse(v.trim());
}

function wholeAbove0(flag: string) {
  return (v: string) => positiveInteger('count', flag, v, ' (or off to drop the rule)') as number;
}

function positiveNumber(flag: string, allowZero = false) {
  return (v: string) => {
    const n = Number(v);
    if (v === '' || !Number.isFinite(n) || n < 0 || (!allowZero && n === 0)) throw bad(flag, `a number ${allowZero ? 'of 0 or more' : 'above 0'}`, v);
    return n;
  };
}

/** "0.99" or "99%" → 0.99; strictly between 0 and 1. */
function fraction(flag: string) {
  return (v: string) => {
    const percent = v.endsWith('%');
    const n = Number(percent ? v.slice(0, -1) : v) / (percent ? 100 : 1);
    if (!Number.isFinite(n) || n <= 0 || n >= 1) throw bad(flag, 'a fraction between 0 and 1, such as 0.95 or 95%', v);
    return n;
  };
}

/** A percent of the sum, "5" or "5%". */
function percent(flag: string) {
  return (v: string) => {
    const n = Number(v.endsWith('%') ? v.slice(0, -1) : v);
    if (!Number.isFinite(n) || n <= 0 || n > 100) throw bad(flag, 'a percent of the pollen sum above 0 and up to 100, such as 5', v);
    return n;
  };
}

function taxaIn(keymap: Keymap, v: string): string[] {
  const names = v.split(',').map((t) => t.trim()).filter(Boolean);
  if (names.length === 0) throw bad('precision-taxa', 'a comma-separated list of taxa', v);
  const known = new Set(Object.values(keymap.keys).map((b) => b.taxon));
  const unknown = names.find((t) => !known.has(t));
  if (unknown) throw new UsageError(`exine count: --precision-taxa names "${unknown}", which is not a taxon of keymap "${keymap.name}"`);
  return names;
}

export function givesRules(flags: Flags): boolean {
  return RULE_FLAGS.some((f) => flags[f] !== undefined);
}

/**
 * The rule set from the flags, on top of `recorded` (a resumed level's rules) or,
 * for a new level, on top of no rules: the default target sum applies only when no
 * rule is given at all. "off" removes a rule.
 */
export function rulesFromFlags(flags: Flags, keymap: Keymap, recorded: RuleSet | null, spike: Spike | null): RuleSet | undefined {
  if (!givesRules(flags)) {
    if (!recorded) return DEFAULT_RULES;
    return undefined;
  }
  const base = recorded ?? NO_RULES;
  const pick = <T>(given: T | null | undefined, old: T | null): T | null => (given === undefined ? old : given);

  const halfWidth = read(flags, 'precision', (v) => {
    const n = positiveNumber('precision')(v);
    if (n > 50) throw bad('precision', 'a half-width in percentage points, above 0 and at most 50', v);
    return n;
  });
  const share = read(flags, 'precision-share', percent('precision-share'));
  const taxa = read(flags, 'precision-taxa', (v) => taxaIn(keymap, v));
  if (share && taxa) throw new UsageError('exine count: give --precision-share or --precision-taxa, not both');
  let precision: PrecisionRule | null = base.precision;
  if (halfWidth === null) precision = null;
  else if (halfWidth !== undefined || share || taxa) {
    const width = halfWidth ?? base.precision?.halfWidth;
    if (width === undefined) throw new UsageError('exine count: --precision-share and --precision-taxa need --precision H (the half-width in percentage points)');
    const which = share ? { share, taxa: null } : taxa ? { share: null, taxa } : base.precision ? { share: base.precision.share, taxa: base.precision.taxa } : { share: 5, taxa: null };
    precision = { halfWidth: width, ...which };
  }

  const mode = read(flags, 'rule-mode', (v) => {
    if (v !== 'all' && v !== 'any') throw bad('rule-mode', 'all or any', v);
    return v;
  });
  const rules: RuleSet = {
    targetSum: pick(read(flags, 'target', wholeAbove0('target')), base.targetSum),
    precision,
    coverage: pick(read(flags, 'coverage', fraction('coverage')), base.coverage),
    plateau: pick(read(flags, 'plateau', wholeAbove0('plateau')), base.plateau),
    markers: pick(read(flags, 'markers', wholeAbove0('markers')), base.markers),
    concError: pick(read(flags, 'conc-error', fraction('conc-error')), base.concError),
    mode: mode ?? base.mode,
    minSum: pick(read(flags, 'min-sum', wholeAbove0('min-sum')), base.minSum),
  };
  const { mode: _m, minSum: _s, ...each } = rules;
  if (Object.values(each).every((v) => v === null)) {
    throw new UsageError('exine count: no stop rule is left; give at least one of --target, --precision, --coverage, --plateau, --markers, --conc-error');
  }
  if ((rules.markers !== null || rules.concError !== null) && !hasMarkerKey(keymap)) {
    throw new UsageError(`exine count: marker rules need a key in a group of role marker, and keymap "${keymap.name}" has none`);
  }
  if (rules.concError !== null && !spike) {
    throw new UsageError('exine count: --conc-error needs the marker spike: --tablets, --per-tablet and --volume or --mass');
  }
  return rules;
}

/** The spike data from the flags, on top of what a resumed level recorded. */
export function spikeFromFlags(flags: Flags, recorded: Spike | null): Spike | null {
  if (!SPIKE_FLAGS.some((f) => flags[f] !== undefined)) return recorded;
  if (flags.tablets?.trim().toLowerCase() === 'off') return null;
  const num = (flag: string, allowZero = false) => read(flags, flag, positiveNumber(flag, allowZero));
  const tablets = read(flags, 'tablets', wholeAbove0('tablets'));
  const perTablet = num('per-tablet');
  const sd = num('per-tablet-sd', true);
  const volume = num('volume');
  const mass = num('mass');
  const rate = num('accumulation-rate');
  if (volume && mass) throw new UsageError('exine count: give --volume (cm³) or --mass (g), not both');
  const base = recorded;
  const spike = {
    tablets: tablets === undefined ? base?.tablets : tablets,
    perTablet: perTablet === undefined ? base?.perTablet : perTablet,
    perTabletSd: sd === undefined ? (base?.perTabletSd ?? null) : sd,
    // A new volume replaces a recorded mass and the other way round.
    volume: volume !== undefined ? volume : mass ? null : (base?.volume ?? null),
    mass: mass !== undefined ? mass : volume ? null : (base?.mass ?? null),
    accumulationRate: rate === undefined ? (base?.accumulationRate ?? null) : rate,
  };
  if (!spike.tablets || !spike.perTablet || (spike.volume === null && spike.mass === null)) {
    throw new UsageError('exine count: marker spike data needs --tablets, --per-tablet and --volume or --mass together');
  }
  if (spike.accumulationRate !== null && spike.volume === null) {
    throw new UsageError('exine count: --accumulation-rate (cm/yr) gives influx from a concentration per cm³; give --volume, not --mass');
  }
  return spike as Spike;
}
