import { nearestName as nearestSpelling } from '../keymap/nearest-name.js';

/**
 * The known name a mistyped one most likely meant: an alias people use (a flag's
 * name for a field, say), the same word in another case or with dashes, or the
 * closest spelling (keymap/nearest-name.ts); else null.
 */
export function nearestName(given: string, known: readonly string[], aliases: Readonly<Record<string, string>> = {}): string | null {
  const alias = aliases[given] ?? aliases[given.toLowerCase()];
  if (alias && known.includes(alias)) return alias;
  const bare = given.toLowerCase().replace(/[-_ ]/g, '');
  return known.find((k) => k.toLowerCase() === bare) ?? nearestSpelling(given, known);
}
