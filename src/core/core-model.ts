import type { CoreConfig } from './core-file.js';
import type { CoreLevel } from './core-level.js';
import { nextLevel, type NextLevel } from './next-level.js';
import { overviewRows, type OverviewRow } from './overview.js';
import { stripsOf, type Strip } from './strips.js';

/** Everything the core view shows, from one read of the folder. Pure. */
export interface CoreModel {
  readonly dir: string;
  readonly config: CoreConfig;
  readonly rows: readonly OverviewRow[];
  readonly next: NextLevel;
  readonly strips: readonly Strip[];
}

export function coreModel(folder: { readonly dir: string; readonly config: CoreConfig; readonly levels: readonly CoreLevel[]; readonly planned: readonly number[] }, cache?: WeakMap<CoreLevel, OverviewRow>): CoreModel {
  const rows = overviewRows(folder.config, folder.levels, folder.planned, cache);
  return { dir: folder.dir, config: folder.config, rows, next: nextLevel(rows), strips: stripsOf(folder.config, rows) };
}
