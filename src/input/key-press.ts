import { hasUnseen } from '../text/visible.js';

/** One key as the counting screen sees it, after a chunk of terminal input is split. */
export type KeyPress =
  | { readonly kind: 'char'; readonly char: string }
  | { readonly kind: 'backspace' }
  | { readonly kind: 'tab' }
  | { readonly kind: 'enter' }
  | { readonly kind: 'escape' }
  | { readonly kind: 'interrupt' }
  | { readonly kind: 'finish' }
  | { readonly kind: 'up' }
  | { readonly kind: 'down' }
  | { readonly kind: 'left' }
  | { readonly kind: 'right' }
  | { readonly kind: 'ignored'; readonly what: string };

const CONTROL: Readonly<Record<string, KeyPress>> = {
  '\r': { kind: 'enter' },
  '\n': { kind: 'enter' },
  '\t': { kind: 'tab' },
  '\x7f': { kind: 'backspace' },
  '\b': { kind: 'backspace' },
  '\x03': { kind: 'interrupt' },
  '\x06': { kind: 'finish' },
  '\x1b': { kind: 'escape' },
};

/** Escape sequences of the cursor keys, with or without modifiers ("\x1b[1;5A"), and their SS3 forms. */
const ARROWS: Readonly<Record<string, KeyPress>> = { A: { kind: 'up' }, B: { kind: 'down' }, C: { kind: 'right' }, D: { kind: 'left' } };

/** The end of a CSI ("\x1b[…final") or SS3 ("\x1bO" + one byte) sequence starting at `i`, or -1. */
function sequenceEnd(data: string, i: number): number {
  const kind = data[i + 1];
  if (kind === 'O') return i + 2 < data.length ? i + 3 : -1;
  if (kind !== '[') return -1;
  for (let j = i + 2; j < data.length; j++) {
    const c = data.charCodeAt(j);
    // Legacy function keys repeat the bracket: "\x1b[[A".
    if ((c >= 0x30 && c <= 0x3f) || (c >= 0x20 && c <= 0x2f) || (c === 0x5b && j === i + 2)) continue;
    return c >= 0x40 && c <= 0x7e ? j + 1 : -1;
  }
  return -1;
}

function charKey(char: string): KeyPress {
  const control = CONTROL[char];
  if (control) return control;
  // Controls, direction overrides, zero-width marks: no key a person means, and never text for a note.
  if (hasUnseen(char)) return { kind: 'ignored', what: `invisible character U+${(char.codePointAt(0) ?? 0).toString(16).toUpperCase().padStart(4, '0')}` };
  return { kind: 'char', char };
}

/**
 * Split raw terminal input into single keys, in order: every code point is a key,
 * except the escape sequences of the cursor and function keys. An Esc followed by
 * a key in the same read is two keys, Esc and that key (Ink's own key parsing would
 * read it as Alt+key and drop the Esc). Ink hands its input events over as such
 * strings: a run of text, one escape sequence, or a lone Esc.
 */
export function splitRaw(data: string): KeyPress[] {
  const keys: KeyPress[] = [];
  let i = 0;
  while (i < data.length) {
    if (data[i] === '\x1b') {
      const end = sequenceEnd(data, i);
      if (end !== -1) {
        const seq = data.slice(i, end);
        keys.push(ARROWS[seq.at(-1) as string] && /^\x1b(\[(1;\d+)?|O)[ABCD]$/.test(seq) ? (ARROWS[seq.at(-1) as string] as KeyPress) : { kind: 'ignored', what: 'special key' });
        i = end;
        continue;
      }
      keys.push({ kind: 'escape' });
      i++;
      continue;
    }
    const char = String.fromCodePoint(data.codePointAt(i) ?? 0);
    keys.push(charKey(char));
    i += char.length;
  }
  return keys;
}
