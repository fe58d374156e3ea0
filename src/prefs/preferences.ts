import Conf from 'conf';
import { z } from 'zod';
import { ExineError } from '../errors.js';
import { describeIssue } from '../validation/describe-issue.js';
import { DEFAULT_PREFS, PREF_NAMES, type PrefName, type Preferences } from './pref-values.js';

// Checked when read: a hand-edited file with a bad value is refused, never cleared. (zod rather
// than conf's own JSON-schema option, whose validator takes about 40 ms to build at every start.)
const STORED = z
  .object({
    bell: z.boolean(),
    rare: z.number().int().min(1).max(100),
    break: z.number().int().min(1).max(600).nullable(),
    keymap: z.string().min(1),
    analyst: z.string().nullable(),
  })
  .partial()
  .loose();

/** The preference store: the user's config folder, or EXINE_CONFIG_DIR (tests point it at a temp folder). */
function store(env: NodeJS.ProcessEnv): Conf<Partial<Preferences>> {
  try {
    return new Conf<Partial<Preferences>>({
      projectName: 'exine',
      projectSuffix: '',
      ...(env.EXINE_CONFIG_DIR ? { cwd: env.EXINE_CONFIG_DIR } : {}),
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

export function readPreferences(env: NodeJS.ProcessEnv = process.env): PrefsView {
  const conf = store(env);
  const checked = STORED.safeParse(conf.store, { reportInput: true });
  if (!checked.success) {
    throw new ExineError(`preferences cannot be read: ${describeIssue(checked.error.issues[0])} in ${conf.path}; fix or delete the file (exine prefs set writes good values)`);
  }
  const set = new Set(PREF_NAMES.filter((n) => conf.has(n)));
  const prefs = { ...DEFAULT_PREFS } as Record<PrefName, unknown>;
  for (const n of set) prefs[n] = conf.get(n);
  return { prefs: prefs as unknown as Preferences, set, path: conf.path };
}

export function writePreference<N extends PrefName>(name: N, value: Preferences[N], env: NodeJS.ProcessEnv = process.env): void {
  store(env).set(name, value as never);
}

export function clearPreference(name: PrefName, env: NodeJS.ProcessEnv = process.env): void {
  store(env).delete(name);
}
