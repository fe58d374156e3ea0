/** The frequency counts the richness and coverage estimators are built on. */
export interface Frequencies {
  /** Grains. */
  readonly n: number;
  /** Types observed. */
  readonly s: number;
  /** Types seen exactly once (singletons) and exactly twice (doubletons). */
  readonly f1: number;
  readonly f2: number;
  /** The positive counts themselves: Chao1's variance needs them when no type is estimated unseen. */
  readonly counts: readonly number[];
}

export function frequencies(counts: readonly number[]): Frequencies {
  let n = 0;
  let s = 0;
  let f1 = 0;
  let f2 = 0;
  const seen: number[] = [];
  for (const c of counts) {
    if (c <= 0) continue;
    seen.push(c);
    n += c;
    s++;
    if (c === 1) f1++;
    else if (c === 2) f2++;
  }
  return { n, s, f1, f2, counts: seen };
}
