/** Edits (insert, delete, change one character) from a to b. */
function distance(a: string, b: string): number {
  let prev = Array.from({ length: b.length + 1 }, (_, i) => i);
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) {
      row[j] = Math.min((prev[j] as number) + 1, (row[j - 1] as number) + 1, (prev[j - 1] as number) + (a[i - 1] === b[j - 1] ? 0 : 1));
    }
    prev = row;
  }
  return prev[b.length] as number;
}

/**
 * The known name a mistyped one most likely meant: an alias people use, the same
 * name in another case, or the closest within a third of its length; else null.
 */
export function nearestName(given: string, known: readonly string[], aliases: Readonly<Record<string, string>> = {}): string | null {
  const alias = aliases[given] ?? aliases[given.toLowerCase()];
  if (alias && known.includes(alias)) return alias;
  const lower = given.toLowerCase().replace(/[-_ ]/g, '');
  const sameWord = known.find((k) => k.toLowerCase() === lower);
  if (sameWord) return sameWord;
  let best: string | null = null;
  let bestDistance = Infinity;
  for (const k of known) {
    const d = distance(lower, k.toLowerCase());
    if (d < bestDistance) {
      best = k;
      bestDistance = d;
    }
  }
  return bestDistance <= Math.max(2, Math.floor(given.length / 3)) ? best : null;
}
