/** What an analyst can set once instead of on every `exine count`. */
export interface Preferences {
  /** Terminal bells (new type, stop signal, break). */
  readonly bell: boolean;
  /** Types with at most this many grains are listed as rare. */
  readonly rare: number;
  /** Minutes of a sitting before the screen suggests resting the eyes; null: never. */
  readonly break: number | null;
  /** Keymap for new levels: a bundled name or a path. */
  readonly keymap: string;
  /** Recorded as the analyst of new levels; null: not recorded. */
  readonly analyst: string | null;
}

export type PrefName = keyof Preferences;

/**
 * Defaults. A rest after 50 minutes at the eyepiece is common practice for long
 * microscope work, so the reminder is on; `exine prefs set break off` turns it off.
 */
export const DEFAULT_PREFS: Preferences = { bell: true, rare: 2, break: 50, keymap: 'temperate-lowland', analyst: null };

export const PREF_NAMES = Object.keys(DEFAULT_PREFS) as PrefName[];

export const PREF_HELP: Readonly<Record<PrefName, string>> = {
  bell: 'on or off: terminal bells for a new type, a key that counts nothing, the stop signal and a break',
  rare: 'a whole number: types with at most this many grains are listed as rare',
  break: 'minutes of a sitting before a reminder to rest the eyes, or off',
  keymap: 'keymap for new levels: temperate-lowland, keypad, or a path',
  analyst: 'name recorded as the analyst of new levels, or off',
};

export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

/** A value as typed on the command line, checked for its preference. */
export function parsePref(name: PrefName, text: string): Parsed<Preferences[PrefName]> {
  const t = text.trim();
  const off = ['off', 'no', 'false', 'none', ''].includes(t.toLowerCase());
  switch (name) {
    case 'bell':
      if (['on', 'yes', 'true'].includes(t.toLowerCase())) return { ok: true, value: true };
      if (off) return { ok: true, value: false };
      return { ok: false, message: `bell must be on or off, not "${text}"` };
    case 'rare':
      if (/^\d+$/.test(t) && Number(t) >= 1 && Number(t) <= 100) return { ok: true, value: Number(t) };
      return { ok: false, message: `rare must be a whole number from 1 to 100, not "${text}"` };
    case 'break':
      if (off) return { ok: true, value: null };
      if (/^\d+$/.test(t) && Number(t) >= 1 && Number(t) <= 600) return { ok: true, value: Number(t) };
      return { ok: false, message: `break must be minutes from 1 to 600, or off, not "${text}"` };
    case 'keymap':
      if (!t) return { ok: false, message: 'keymap needs a name or a path' };
      return { ok: true, value: t };
    case 'analyst':
      return { ok: true, value: off ? null : t };
    default:
      return name satisfies never;
  }
}

export function formatPref(name: PrefName, value: Preferences[PrefName]): string {
  if (value === null) return 'off';
  if (typeof value === 'boolean') return value ? 'on' : 'off';
  return String(value);
}
