import { existsSync } from 'node:fs';
import { basename, extname, resolve } from 'node:path';
import { ExineError, UsageError } from '../../errors.js';
import { DEFAULT_KEYMAP, loadKeymap } from '../../keymap/load-keymap.js';
import type { Keymap } from '../../keymap/keymap.js';
import type { LevelInfo } from '../../model/events.js';
import type { LevelState } from '../../model/level-state.js';
import { createLevel, resumeLevel, type OpenedLevel } from '../../session/session-files.js';
import type { Spike } from '../../stats/concentration.js';
import { isCoreFolder } from '../../core/read-core.js';
import { openInCore } from './count-in-core.js';
import { drawLiveOnThisTerminal } from '../interactive-terminal.js';
import { finiteNumber, parseFlags } from '../parse-flags.js';
import { RULE_OPTIONS, rulesFromFlags, spikeFromFlags } from '../rule-flags.js';
import { parsePref, type Preferences } from '../../prefs/pref-values.js';
import { readPreferences } from '../../prefs/preferences.js';
import type { Io } from '../io.js';
import { checkedDepth } from '../depth-flag.js';

const OPTIONS = {
  keymap: { type: 'string' },
  level: { type: 'string' },
  depth: { type: 'string' },
  site: { type: 'string' },
  core: { type: 'string' },
  slide: { type: 'string' },
  analyst: { type: 'string' },
  quiet: { type: 'boolean' },
  rare: { type: 'string' },
  break: { type: 'string' },
  reopen: { type: 'string' },
  'allow-negative-depth': { type: 'boolean' },
  ...RULE_OPTIONS,
} as const;

function sameKeymap(a: Keymap, b: Keymap): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

/** Details given on the command line must agree with those recorded in an existing file. */
function checkAgainstRecorded(path: string, state: LevelState, given: Partial<LevelInfo>, keymap: Keymap | null): void {
  for (const [field, value] of Object.entries(given)) {
    if (value === undefined) continue;
    const recorded = state.header[field as keyof LevelInfo];
    if (recorded !== value) {
      throw new UsageError(
        `exine count: ${path} records ${field} ${JSON.stringify(recorded)}, not ${JSON.stringify(value)}; a level's details are fixed when it is created (leave out --${field} to resume)`,
      );
    }
  }
  if (keymap && !sameKeymap(keymap, state.keymap)) {
    throw new UsageError(
      `exine count: ${path} was counted with its own keymap "${state.keymap.name}"; resuming always uses that one (leave out --keymap)`,
    );
  }
}

export function requireTerminal(command: string, { stdin }: Pick<Io, 'stdin'>): void {
  if (!stdin.isTTY || typeof stdin.setRawMode !== 'function') {
    throw new ExineError(`exine ${command}: needs an interactive terminal (standard input is not a TTY); run it in a terminal window`);
  }
}

/** What preferences supply when a flag is not given, for a new level. */
export interface LevelDefaults {
  readonly keymap?: string;
  readonly analyst?: string | null;
}

/** Open or create the level for counting; the caller runs the screen. A keymap path in `flags` starts from `cwd`. A folder with a core.json is a core: --depth picks the level. */
export function openForCounting(
  path: string,
  flags: Record<string, string | undefined>,
  check: () => void = () => {},
  defaults: LevelDefaults = {},
  cwd = process.cwd(),
): OpenedLevel {
  if (isCoreFolder(path)) return openInCore(path, flags, check, defaults, cwd);
  const depth = checkedDepth(finiteNumber('count', 'depth', flags.depth), flags['allow-negative-depth'] !== undefined);
  if (existsSync(path)) return resumeForCounting(path, flags, check, cwd);
  const { keymap } = loadKeymap(flags.keymap ?? defaults.keymap ?? DEFAULT_KEYMAP, cwd);
  const info: LevelInfo = {
    level: flags.level ?? basename(path, extname(path)),
    depth: depth ?? null,
    site: flags.site ?? null,
    core: flags.core ?? null,
    slide: flags.slide ?? null,
    analyst: flags.analyst ?? defaults.analyst ?? null,
  };
  const spike = spikeFromFlags(flags, null);
  const rules = rulesFromFlags(flags, keymap, null, spike) as NonNullable<ReturnType<typeof rulesFromFlags>>;
  check();
  return createLevel(path, { info, keymap, rules, spike });
}

/**
 * Resume a level. Its details must match the flags, except the slide: another
 * slide is recorded as a slide event. `spikeBase` stands in for a level that has
 * no spike data yet (a core's marker batch).
 */
export function resumeForCounting(path: string, flags: Record<string, string | undefined>, check: () => void, cwd: string, spikeBase: Spike | null = null): OpenedLevel {
  const given: Partial<LevelInfo> = {
    level: flags.level,
    depth: finiteNumber('count', 'depth', flags.depth),
    site: flags.site,
    core: flags.core,
    analyst: flags.analyst,
  };
  const keymap = flags.keymap ? loadKeymap(flags.keymap, cwd).keymap : null;
  // One read of the file: the checks run on the level as resume reads it, before it writes.
  return resumeLevel(path, {
    reopen: flags.reopen,
    beforeWrite: (state) => {
      checkAgainstRecorded(path, state, given, keymap);
      const spike = spikeFromFlags(flags, state.spike ?? spikeBase);
      const rules = rulesFromFlags(flags, state.keymap, state.rules, spike);
      check();
      return { rules, spike: spike === spikeBase ? state.spike : spike, slide: flags.slide };
    },
  });
}

export interface ScreenOptions {
  readonly bell: boolean;
  readonly rareThreshold: number;
  readonly breakMinutes: number | null;
}

/** Flags override preferences, preferences override the defaults. */
export function screenOptions(prefs: Preferences, flags: { quiet?: boolean | undefined; rare?: string | undefined; break?: string | undefined }): ScreenOptions {
  const pick = <N extends 'rare' | 'break'>(name: N): Preferences[N] => {
    const text = flags[name];
    if (text === undefined) return prefs[name];
    const parsed = parsePref(name, text);
    if (!parsed.ok) throw new UsageError(`exine count: --${parsed.message}`);
    return parsed.value as Preferences[N];
  };
  return { bell: flags.quiet ? false : prefs.bell, rareThreshold: pick('rare'), breakMinutes: pick('break') };
}

export async function countCommand(args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseFlags('count', args, OPTIONS);
  if (positionals.length !== 1) throw new UsageError('exine count: give one session FILE (see exine count --help)');
  const path = resolve(io.cwd, positionals[0] as string);
  const { quiet, rare, break: rest, 'allow-negative-depth': allowNegative, ...flags } = values;
  const { prefs } = readPreferences(io.env);
  const screen = screenOptions(prefs, { quiet, rare, break: rest });
  const opened = openForCounting(path, { ...(flags as Record<string, string | undefined>), ...(allowNegative ? { 'allow-negative-depth': '' } : {}) }, () => requireTerminal('count', io), prefs, io.cwd);
  drawLiveOnThisTerminal();
  const { runCountScreen } = await import('../../screens/run-count-screen.js');
  return runCountScreen(opened, screen);
}
