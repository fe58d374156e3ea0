import Conf from 'conf';
import { ExineError } from '../errors.js';
import { DEFAULT_PREFS, PREF_NAMES, type PrefName, type Preferences } from './pref-values.js';

// Also checked by conf when the file is read: a hand-edited file with a bad value is refused, never cleared.
const SCHEMA = {
  bell: { type: 'boolean' },
  rare: { type: 'integer', minimum: 1, maximum: 100 },
  break: { type: ['integer', 'null'], minimum: 1, maximum: 600 },
  keymap: { type: 'string', minLength: 1 },
  analyst: { type: ['string', 'null'] },
} as const;

/** The preference store: the user's config folder, or EXINE_CONFIG_DIR (tests point it at a temp folder). */
function store(): Conf<Partial<Preferences>> {
  try {
    return new Conf<Partial<Preferences>>({
      projectName: 'exine',
      projectSuffix: '',
      ...(process.env.EXINE_CONFIG_DIR ? { cwd: process.env.EXINE_CONFIG_DIR } : {}),
      schema: SCHEMA as never,
      clearInvalidConfig: false,
    });
  } catch (error) {
    throw new ExineError(`preferences cannot be read: ${(error as Error).message.split('\n')[0]}; fix or delete the file (exine prefs path shows where)`);
  }
}

export interface PrefsView {
  readonly prefs: Preferences;
  /** The preferences set by the user (the others are defaults). */
  readonly set: ReadonlySet<PrefName>;
  readonly path: string;
}

export function readPreferences(): PrefsView {
  const conf = store();
  const set = new Set(PREF_NAMES.filter((n) => conf.has(n)));
  const prefs = { ...DEFAULT_PREFS } as Record<PrefName, unknown>;
  for (const n of set) prefs[n] = conf.get(n);
  return { prefs: prefs as unknown as Preferences, set, path: conf.path };
}

export function writePreference<N extends PrefName>(name: N, value: Preferences[N]): void {
  store().set(name, value as never);
}

export function clearPreference(name: PrefName): void {
  store().delete(name);
}
