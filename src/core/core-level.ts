import { checkKeymapValue } from '../keymap/parse-keymap.js';
import type { Keymap } from '../keymap/keymap.js';
import type { LevelState } from '../model/level-state.js';
import { describeRules, sameRules } from '../rules/rule-set.js';
import type { CoreConfig } from './core-file.js';

/** One level file of a core folder, as read. */
export interface CoreLevel {
  /** File name inside the folder, and its full path. */
  readonly file: string;
  readonly path: string;
  /** Depth recorded in the level (null when the file records none or cannot be read). */
  readonly depth: number | null;
  /** The folded level, or null when the file cannot be read; then `error` says why in one line. */
  readonly state: LevelState | null;
  readonly error: string | null;
  /** Read anyway, but worth saying (a torn last line that exine count will repair). */
  readonly warnings: readonly string[];
  /** True when the level was not made in this core: it keeps its own keymap and rules. */
  readonly outside: boolean;
  /** Why it is outside, in words ("core TM-1", "own keymap \"tiny\"", "own rules: …"); empty when it inherits. */
  readonly differences: readonly string[];
  /** The flags that overrode the core's settings when the level was created here. */
  readonly overrides: readonly string[];
  /** For a re-read that skips files that did not change. */
  readonly size: number;
  readonly mtimeMs: number;
}

/** How a level stands against the core it sits in. Pure. */
export function judgeLevel(config: CoreConfig, state: LevelState): Pick<CoreLevel, 'outside' | 'differences' | 'overrides'> {
  const h = state.header;
  const made = h.fromCore ?? null;
  const differences: string[] = [];
  if (h.site !== config.site || h.core !== config.core) differences.push(`core ${[h.site, h.core].filter(Boolean).join(' ') || '(none recorded)'}`);
  // Compared as read, defaults filled in: a level recorded before an action existed (cf.) is the same keymap.
  const recorded = checkKeymapValue(h.keymap, 'recorded in line 1');
  const asRead = (k: Keymap) => JSON.stringify(k);
  if ((recorded.ok ? asRead(recorded.keymap) : JSON.stringify(h.keymap)) !== asRead(config.keymap)) {
    if (!made?.overrides.includes('keymap')) differences.push(`own keymap "${h.keymap.name}"`);
  }
  if (!made && !sameRules(h.rules, config.rules)) differences.push(`own rules: ${describeRules(h.rules)}`);
  if (!made && differences.length === 0) differences.push('not made in this core (copied in)');
  return { outside: !made || differences.length > 0, differences, overrides: made?.overrides ?? [] };
}

/** Levels by depth (a level with no depth last), then by file name. */
export function byDepth(a: CoreLevel, b: CoreLevel): number {
  const da = a.depth ?? Infinity;
  const db = b.depth ?? Infinity;
  return da === db ? a.file.localeCompare(b.file) : da - db;
}

/** Planned depths that no level in the folder has yet. */
export function stillPlanned(config: CoreConfig, levels: readonly CoreLevel[]): number[] {
  const counted = new Set(levels.map((l) => l.depth));
  return config.depths.filter((d) => !counted.has(d));
}

/** Where a level stands: planned (no file yet) is the core view's; a file is one of the other three. */
export type LevelStatus = 'planned' | 'in progress' | 'rules met' | 'finished';

export function statusOf(state: Pick<LevelState, 'finishedAt' | 'rulesMet'>): Exclude<LevelStatus, 'planned'> {
  if (state.finishedAt) return 'finished';
  return state.rulesMet ? 'rules met' : 'in progress';
}
