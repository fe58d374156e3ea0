/** Fixed-width cells for terminal tables. */
export function fit(text: string, width: number): string {
  const chars = [...text];
  if (chars.length <= width) return text + ' '.repeat(width - chars.length);
  return `${chars.slice(0, Math.max(0, width - 1)).join('')}…`;
}

export function right(text: string, width: number): string {
  const n = [...text].length;
  return n >= width ? text : ' '.repeat(width - n) + text;
}

export function pct(value: number | null): string {
  return value === null ? '–' : value.toFixed(1);
}

export function ci(low: number | null, high: number | null): string {
  return low === null || high === null ? '–' : `${low.toFixed(1)}–${high.toFixed(1)}`;
}

export function bar(fraction: number, width: number): string {
  const filled = Math.max(0, Math.min(width, Math.round(fraction * width)));
  return `${'#'.repeat(filled)}${'.'.repeat(width - filled)}`;
}

/** "1 sitting", "2 sittings". */
export function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}
