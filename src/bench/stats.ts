export function quantile(sorted: readonly number[], q: number): number {
  if (sorted.length === 0) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.round(q * (sorted.length - 1))));
  return sorted[i] as number;
}

export function summarise(samples: readonly number[]): { p50: number; p99: number; median: number } {
  const sorted = [...samples].sort((a, b) => a - b);
  return { p50: quantile(sorted, 0.5), p99: quantile(sorted, 0.99), median: quantile(sorted, 0.5) };
}

export const ms = (ns: bigint | number) => Number(ns) / 1e6;
export const fmt = (v: number, unit = 'ms') => `${v < 0.1 ? v.toFixed(4) : v < 10 ? v.toFixed(3) : v.toFixed(1)} ${unit}`;
export const ratio = (a: number, b: number) => `${(a / b).toFixed(2)}x`;
