/** More planned levels than this is a typo in the step, not a core. */
export const MAX_PLANNED = 5000;

/** Depths with a few decimals, so 0.1 steps do not drift (0.30000000000000004). */
const tidy = (n: number) => Number(n.toFixed(6));

/**
 * The planned depths from "FROM:TO:STEP" (FROM, FROM+STEP … up to TO) or a comma
 * list "4,12,20.5"; ascending, each once. A message says what is wrong otherwise.
 */
export function parsePlannedDepths(text: string): { ok: true; depths: number[] } | { ok: false; message: string } {
  const number = (s: string) => (s.trim() === '' ? NaN : Number(s));
  const range = text.split(':');
  let depths: number[];
  if (range.length === 3) {
    const [from, to, step] = range.map(number) as [number, number, number];
    if (![from, to, step].every(Number.isFinite) || from < 0 || step <= 0 || to < from) {
      return { ok: false, message: `"${text}" is not FROM:TO:STEP with 0 ≤ FROM ≤ TO and STEP above 0 (e.g. 4:200:8)` };
    }
    const n = Math.floor(tidy((to - from) / step)) + 1;
    if (n > MAX_PLANNED) return { ok: false, message: `"${text}" plans ${n} levels; at most ${MAX_PLANNED}` };
    depths = Array.from({ length: n }, (_, i) => tidy(from + i * step));
  } else if (range.length === 1) {
    depths = text.split(',').map(number);
    const bad = depths.findIndex((d) => !Number.isFinite(d) || d < 0);
    if (bad >= 0) return { ok: false, message: `"${text.split(',')[bad]?.trim()}" is not a depth (a number of 0 or more); give FROM:TO:STEP or a list like 4,12,20` };
    if (depths.length > MAX_PLANNED) return { ok: false, message: `${depths.length} planned levels; at most ${MAX_PLANNED}` };
  } else {
    return { ok: false, message: `"${text}" is not FROM:TO:STEP (e.g. 4:200:8) or a list like 4,12,20` };
  }
  return { ok: true, depths: [...new Set(depths)].sort((a, b) => a - b) };
}
