/** Edit distance (insert, delete, substitute, swap of neighbours), for "did you mean". */
function distance(a: string, b: string): number {
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) => [i, ...Array<number>(b.length).fill(0)]);
  for (let j = 0; j <= b.length; j++) (d[0] as number[])[j] = j;
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const row = d[i] as number[];
      const up = d[i - 1] as number[];
      row[j] = Math.min(up[j] as number + 1, row[j - 1] as number + 1, up[j - 1] as number + (a[i - 1] === b[j - 1] ? 0 : 1));
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) row[j] = Math.min(row[j] as number, (d[i - 2] as number[])[j - 2] as number + 1);
    }
  }
  return (d[a.length] as number[])[b.length] as number;
}

/** The known name closest to a misspelt one, or null when none is close (at most a third of its letters off, and 3). */
export function nearestName(name: string, known: readonly string[]): string | null {
  const lower = name.toLowerCase();
  let best: string | null = null;
  let bestD = Infinity;
  for (const k of known) {
    const dist = distance(lower, k.toLowerCase());
    if (dist < bestD) [best, bestD] = [k, dist];
  }
  return best !== null && bestD <= Math.min(3, Math.max(1, Math.ceil(name.length / 3))) ? best : null;
}

/** ` (did you mean "sum"?)`, or nothing. */
export function hint(name: string, known: readonly string[]): string {
  const near = nearestName(name, known);
  return near ? `; did you mean "${near}"?` : '';
}
