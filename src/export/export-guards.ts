import type { LevelState } from '../model/level-state.js';

export interface GuardedLevel {
  readonly state: LevelState;
  readonly source: string;
}

export interface GuardOptions {
  /** The core the levels should all be of (a core folder's core.json), or null: they should agree among themselves. */
  readonly core: { readonly site: string; readonly core: string } | null;
  readonly mixedCores: boolean;
  /** null: unfinished levels are not judged (files named one by one). */
  readonly includeUnfinished: boolean | null;
}

/** "a, b, c and 4 more": a message stays one line. */
export function nameFiles(names: readonly string[], shown = 6): string {
  if (names.length <= shown) return names.length === 1 ? (names[0] as string) : `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`;
  return `${names.slice(0, shown).join(', ')} and ${names.length - shown} more`;
}

const coreName = (s: LevelState) => [s.header.site, s.header.core].filter(Boolean).join(' ') || '(no core recorded)';

/**
 * Why these levels must not be exported together, in one line naming the files,
 * or null. The same session twice is always refused: it would count its grains twice.
 */
export function exportRefusal(levels: readonly GuardedLevel[], options: GuardOptions): string | null {
  const bySession = new Map<string, string[]>();
  for (const l of levels) bySession.set(l.state.header.session, [...(bySession.get(l.state.header.session) ?? []), l.source]);
  const twice = [...bySession.values()].find((files) => files.length > 1);
  if (twice) return `${nameFiles(twice)} are the same session (one file copied?); its grains would count twice: keep one of them out of the export`;

  if (!options.mixedCores) {
    const want = options.core ? [options.core.site, options.core.core].join(' ') : levels[0] ? coreName(levels[0].state) : '';
    const others = levels.filter((l) => coreName(l.state) !== want);
    if (others.length) {
      return `${nameFiles(others.map((l) => `${l.source} (${coreName(l.state)})`))} ${others.length === 1 ? 'is' : 'are'} not of core ${want}; export one core at a time, or add --mixed-cores`;
    }
  }
  if (options.includeUnfinished === false) {
    const open = levels.filter((l) => !l.state.finishedAt || !l.state.rulesMet);
    if (open.length) {
      return `${nameFiles(open.map((l) => `${l.source} (${!l.state.finishedAt ? 'not finished' : 'rules not met'})`))}: only finished levels that met their stop rules go into a core export; finish them, or add --include-unfinished`;
    }
  }
  return null;
}
