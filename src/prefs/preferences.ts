import { mkdirSync, readFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';
import { ExineError } from '../errors.js';
import { writeFileAtomic } from '../io/write-atomic.js';
import { DEFAULT_PREFS, PREF_NAMES, type PrefName, type Preferences } from './pref-values.js';
import { storedPrefProblem } from './stored-prefs.js';

// A small JSON file in the folder the `conf` package used before (same place, same format), read
// and checked by hand: conf brought a JSON-schema validator and a semver parser that cost about
// 40 ms at every start of the counting screen.

/** The user's config folder for exine, per platform; EXINE_CONFIG_DIR overrides it (tests point it at a temp folder). */
export function configDir(env: NodeJS.ProcessEnv): string {
  if (env.EXINE_CONFIG_DIR) return env.EXINE_CONFIG_DIR;
  const home = homedir();
  if (process.platform === 'darwin') return join(home, 'Library', 'Preferences', 'exine');
  if (process.platform === 'win32') return join(env.APPDATA || join(home, 'AppData', 'Roaming'), 'exine', 'Config');
  return join(env.XDG_CONFIG_HOME || join(home, '.config'), 'exine');
}

const fileOf = (env: NodeJS.ProcessEnv) => join(configDir(env), 'config.json');

const unreadable = (why: string, path: string) =>
  new ExineError(`preferences cannot be read: ${why} in ${path}; fix or delete the file (exine prefs set writes good values)`);

/** The stored values, checked: a hand-edited file with a bad value is refused, never cleared. */
function readStored(path: string): Record<string, unknown> {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return {};
    throw new ExineError(`preferences cannot be read: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message} for ${path}; fix or delete the file (exine prefs path shows where)`);
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw unreadable(`not valid JSON (${(error as Error).message.split('\n')[0]})`, path);
  }
  const problem = storedPrefProblem(value);
  if (problem) throw unreadable(problem, path);
  return value as Record<string, unknown>;
}

export interface PrefsView {
  readonly prefs: Preferences;
  /** The preferences set by the user (the others are defaults). */
  readonly set: ReadonlySet<PrefName>;
  readonly path: string;
}

export function readPreferences(env: NodeJS.ProcessEnv = process.env): PrefsView {
  const path = fileOf(env);
  const stored = readStored(path);
  const set = new Set(PREF_NAMES.filter((n) => Object.hasOwn(stored, n)));
  const prefs = { ...DEFAULT_PREFS } as Record<PrefName, unknown>;
  for (const n of set) prefs[n] = stored[n];
  return { prefs: prefs as unknown as Preferences, set, path };
}

/** Fields this exine does not know (written by a later one) are kept as they are. */
function update(env: NodeJS.ProcessEnv, change: (stored: Record<string, unknown>) => void): void {
  const path = fileOf(env);
  const stored = readStored(path);
  change(stored);
  try {
    mkdirSync(configDir(env), { recursive: true });
  } catch (error) {
    throw new ExineError(`cannot create the preferences folder ${configDir(env)}: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}`);
  }
  writeFileAtomic(path, `${JSON.stringify(stored, undefined, '\t')}\n`, true);
}

export function writePreference<N extends PrefName>(name: N, value: Preferences[N], env: NodeJS.ProcessEnv = process.env): void {
  update(env, (stored) => {
    stored[name] = value;
  });
}

export function clearPreference(name: PrefName, env: NodeJS.ProcessEnv = process.env): void {
  update(env, (stored) => {
    delete stored[name];
  });
}
