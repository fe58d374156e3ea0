import { UsageError } from '../../errors.js';
import { formatPref, parsePref, PREF_HELP, PREF_NAMES, type PrefName } from '../../prefs/pref-values.js';
import { clearPreference, readPreferences, writePreference } from '../../prefs/preferences.js';
import { isBundledKeymap, loadKeymap, resolveKeymapPath } from '../../keymap/load-keymap.js';
import { fit } from '../../text/cells.js';
import type { Io } from '../io.js';
import { parseFlags } from '../parse-flags.js';

const nameOf = (text: string | undefined): PrefName => {
  if (text && (PREF_NAMES as string[]).includes(text)) return text as PrefName;
  throw new UsageError(`exine prefs: ${text ? `unknown preference "${text}"` : 'name a preference'} (one of ${PREF_NAMES.join(', ')})`);
};

export function prefsCommand(args: string[], io: Io): number {
  const { positionals } = parseFlags('prefs', args, {});
  const [verb, name, ...rest] = positionals;
  if (verb === undefined || verb === 'show') {
    const { prefs, set, path } = readPreferences(io.env);
    // Columns as wide as their widest value: a long keymap path is shown whole and the rest stays aligned.
    const values = PREF_NAMES.map((n) => formatPref(n, prefs[n]));
    const valueWidth = Math.max(...values.map((v) => [...v].length));
    const lines = PREF_NAMES.map((n, i) => `${fit(n, 8)} ${fit(values[i] as string, valueWidth)}  ${fit(set.has(n) ? 'set' : 'default', 7)}  ${PREF_HELP[n]}`);
    io.stdout.write(`${lines.join('\n')}\n(stored in ${path}; flags of exine count override these)\n`);
    return 0;
  }
  if (verb === 'path') {
    io.stdout.write(`${readPreferences(io.env).path}\n`);
    return 0;
  }
  if (verb === 'set') {
    const pref = nameOf(name);
    if (rest.length === 0) throw new UsageError(`exine prefs: give a value for ${pref} (${PREF_HELP[pref]})`);
    const parsed = parsePref(pref, rest.join(' '));
    if (!parsed.ok) throw new UsageError(`exine prefs: ${parsed.message}`);
    let value = parsed.value;
    if (pref === 'keymap') {
      // Checked now, and kept as an absolute path: a count started from another folder finds the same file.
      const path = resolveKeymapPath(value as string, io.cwd);
      loadKeymap(value as string, io.cwd);
      value = isBundledKeymap(path) ? (value as string) : path;
    }
    writePreference(pref, value, io.env);
    io.stdout.write(`${pref} = ${formatPref(pref, value)}\n`);
    return 0;
  }
  if (verb === 'unset') {
    const pref = nameOf(name);
    clearPreference(pref, io.env);
    io.stdout.write(`${pref} is back to its default\n`);
    return 0;
  }
  throw new UsageError(`exine prefs: unknown action "${verb}" (show, set NAME VALUE, unset NAME, path)`);
}
