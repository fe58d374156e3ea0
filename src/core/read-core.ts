import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { ExineError } from '../errors.js';
import { readLevel } from '../session/session-files.js';
import { CORE_FILE, parseCoreFile, type CoreConfig } from './core-file.js';
import { depthFromFileName } from './level-name.js';
import { byDepth, judgeLevel, stillPlanned, type CoreLevel } from './core-level.js';

export interface CoreFolder {
  readonly dir: string;
  readonly config: CoreConfig;
  /** Every level file in the folder, by depth. */
  readonly levels: readonly CoreLevel[];
  /** Planned depths with no level file yet, ascending. */
  readonly planned: readonly number[];
}

export const isCoreFolder = (dir: string): boolean => existsSync(join(dir, CORE_FILE));

/** Read and check DIR/core.json; one line naming the file, field and line when it is wrong. */
export function readCoreConfig(dir: string): CoreConfig {
  const path = join(dir, CORE_FILE);
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') throw new ExineError(`${dir} is not a core folder: it has no ${CORE_FILE} (exine core init ${dir} --site … --core … makes one)`);
    throw new ExineError(`${path}: cannot be read (${code ?? String(error)})`);
  }
  const result = parseCoreFile(text, path);
  if (!result.ok) throw new ExineError(result.message);
  return result.config;
}

/** The session files of a folder: *.jsonl, not the backups, locks and markers beside them. */
export function levelFilesIn(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true })
    .filter((e) => e.isFile() && e.name.endsWith('.jsonl') && !e.name.startsWith('.'))
    .map((e) => e.name)
    .sort();
}

function readOne(dir: string, config: CoreConfig, file: string, before: CoreLevel | undefined): CoreLevel {
  const path = join(dir, file);
  let size = -1;
  let mtimeMs = -1;
  try {
    const st = statSync(path);
    size = st.size;
    mtimeMs = st.mtimeMs;
  } catch {
    // Gone between the listing and now: readLevel says so below.
  }
  // Same size and time as at the last read, and read against the same core.json: nothing to do.
  if (before && before.size === size && before.mtimeMs === mtimeMs && size >= 0) return before;
  try {
    const { state, warnings } = readLevel(path);
    return { file, path, depth: state.header.depth, state, error: null, warnings, ...judgeLevel(config, state), size, mtimeMs };
  } catch (error) {
    if (!(error instanceof ExineError)) throw error;
    return { file, path, depth: depthFromFileName(file), state: null, error: error.message, warnings: [], outside: false, differences: [], overrides: [], size, mtimeMs };
  }
}

/**
 * The core in DIR: its core.json (read again every time, so a hand edit takes
 * effect at the next command) and every level file in the folder. With `previous`
 * (an earlier read of the same folder), a level whose file has the same size and
 * modification time is not read again, unless core.json changed.
 */
export function readCoreFolder(dir: string, previous?: CoreFolder): CoreFolder {
  const config = readCoreConfig(dir);
  const reuse = previous && previous.dir === dir && JSON.stringify(previous.config) === JSON.stringify(config);
  const known = new Map(reuse ? previous.levels.map((l) => [l.file, l]) : []);
  const levels = levelFilesIn(dir)
    .map((file) => readOne(dir, config, file, known.get(file)))
    .sort(byDepth);
  return { dir, config, levels, planned: stillPlanned(config, levels) };
}
