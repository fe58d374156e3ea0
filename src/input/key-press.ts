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

/** The flags Ink passes beside the input string (a subset of its Key type). */
export interface InkKeyFlags {
  readonly return?: boolean;
  readonly tab?: boolean;
  readonly backspace?: boolean;
  readonly delete?: boolean;
  readonly escape?: boolean;
  readonly ctrl?: boolean;
  readonly meta?: boolean;
  readonly upArrow?: boolean;
  readonly downArrow?: boolean;
  readonly leftArrow?: boolean;
  readonly rightArrow?: boolean;
}

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

/**
 * Split what one Ink input callback delivered into single keys, in order.
 * Ink hands a burst of keys (key repeat, paste, fast typing) to one callback
 * as one string with control bytes embedded, and its flags then describe
 * nothing; a lone special key arrives as an empty string plus a flag.
 */
export function splitKeys(input: string, flags: InkKeyFlags): KeyPress[] {
  if (flags.ctrl && input === 'c') return [{ kind: 'interrupt' }];
  if (flags.ctrl && input === 'f') return [{ kind: 'finish' }];
  if (input === '') {
    if (flags.return) return [{ kind: 'enter' }];
    if (flags.tab) return [{ kind: 'tab' }];
    // Ink 6.8 reports the Backspace key (0x7f) as "delete".
    if (flags.backspace || flags.delete) return [{ kind: 'backspace' }];
    if (flags.escape) return [{ kind: 'escape' }];
    if (flags.upArrow) return [{ kind: 'up' }];
    if (flags.downArrow) return [{ kind: 'down' }];
    if (flags.leftArrow) return [{ kind: 'left' }];
    if (flags.rightArrow) return [{ kind: 'right' }];
    return [{ kind: 'ignored', what: 'special key' }];
  }
  if (flags.ctrl) return [{ kind: 'ignored', what: `Ctrl-${input}` }];
  // Alt/Meta combinations arrive with the escape stripped; never count them as a taxon.
  if (flags.meta && !flags.escape) return [{ kind: 'ignored', what: `Alt-${input}` }];
  const keys: KeyPress[] = [];
  for (const char of input) {
    const control = CONTROL[char];
    if (control) keys.push(control);
    else if ((char.codePointAt(0) ?? 0) < 0x20) keys.push({ kind: 'ignored', what: `control 0x${(char.codePointAt(0) ?? 0).toString(16)}` });
    else keys.push({ kind: 'char', char });
  }
  return keys;
}
