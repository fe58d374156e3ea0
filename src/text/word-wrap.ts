/**
 * A text cut at word breaks into lines of at most `width` characters, as a
 * person reads it: a message is never cut mid-sentence. A word longer than the
 * width (a path, a hash) is split. At most `maxLines` lines; the last one ends
 * in "…" when words were left over.
 */
export function wordWrap(text: string, width: number, maxLines = Number.POSITIVE_INFINITY): string[] {
  const w = Math.max(1, width);
  const lines: string[] = [];
  let current = '';
  for (const word of text.split(' ')) {
    let rest = [...word];
    const used = [...current].length;
    if (used > 0 && used + 1 + rest.length <= w) {
      current += ` ${word}`;
      continue;
    }
    if (used > 0) lines.push(current);
    while (rest.length > w) {
      lines.push(rest.slice(0, w).join(''));
      rest = rest.slice(w);
    }
    current = rest.join('');
  }
  lines.push(current);
  if (lines.length <= maxLines) return lines;
  const kept = lines.slice(0, Math.max(1, maxLines));
  const last = [...(kept[kept.length - 1] as string)];
  kept[kept.length - 1] = `${last.slice(0, Math.max(0, w - 1)).join('')}…`;
  return kept;
}
