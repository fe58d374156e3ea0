/** Compact numbers for narrow panels: 950, 12.3k, 193k, 1.25M. */
export function compact(n: number): string {
  const a = Math.abs(n);
  if (a < 1000) return String(Math.round(n));
  if (a < 10_000) return `${(n / 1000).toFixed(2)}k`;
  if (a < 1_000_000) return `${(n / 1000).toFixed(a < 100_000 ? 1 : 0)}k`;
  return `${(n / 1_000_000).toFixed(2)}M`;
}

/** A number as typed, without float noise: 0.1 + 0.2 → "0.3", 5 → "5". */
export function shortNumber(n: number): string {
  return String(Number(n.toFixed(4)));
}

/** Grains per minute, or "–" when there is no rate. */
export function perMinute(v: number | null): string {
  return v === null ? '–' : v.toFixed(1);
}

/** A value of a rule in its own unit, short. */
export function ruleValue(rule: string, v: number | null): string {
  if (v === null) return '–';
  switch (rule) {
    case 'precision':
      return String(Number(v.toFixed(1)));
    case 'coverage':
      return v >= 1 ? '1' : v.toFixed(3).replace(/^0/, '').replace(/0+$/, '');
    case 'conc-error':
      return `${(100 * v).toFixed(0)}%`;
    default:
      return String(v);
  }
}
