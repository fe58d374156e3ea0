import type { CoreLevel } from './core-level.js';
import { coreModel, type CoreModel } from './core-model.js';
import type { OverviewRow } from './overview.js';
import { readCoreFolder, type CoreFolder } from './read-core.js';

/** The core view's reader: the first read, then refreshes that re-read only the files that changed. */
export interface CoreSource {
  read(): CoreModel;
  /** The model again when anything in the folder changed since the last read, else null. */
  refresh(): CoreModel | null;
}

const sameFolder = (a: CoreFolder, b: CoreFolder) =>
  a.config === b.config && a.levels.length === b.levels.length && a.levels.every((l, i) => l === b.levels[i]) && a.planned.join() === b.planned.join();

export function fileCoreSource(dir: string): CoreSource {
  let folder: CoreFolder | null = null;
  // Rows of levels whose read did not change are kept; a new read of a level makes a new row.
  const rows = new WeakMap<CoreLevel, OverviewRow>();
  const read = () => {
    folder = readCoreFolder(dir, folder ?? undefined);
    return coreModel(folder, rows);
  };
  return {
    read,
    refresh: () => {
      const before = folder;
      const next = readCoreFolder(dir, before ?? undefined);
      // readCoreFolder parses core.json again each time: the same text keeps the same levels.
      if (before && JSON.stringify(before.config) === JSON.stringify(next.config)) {
        const same = { ...next, config: before.config };
        if (sameFolder(before, same)) return null;
        folder = same;
      } else folder = next;
      return coreModel(folder, rows);
    },
  };
}
