/**
 * Characters a terminal may act on or that a person cannot see: C0 and C1
 * controls, DEL, format characters (bidirectional overrides, zero-width marks,
 * the byte-order mark), lone surrogates and line separators.
 */
export const UNSEEN = /[\p{Cc}\p{Cf}\p{Cs}\p{Zl}\p{Zp}]/u;
const UNSEEN_ALL = new RegExp(UNSEEN.source, 'gu');

/**
 * Text from a file, made safe to print: every unseen character becomes a visible
 * escape such as \u{1b}, so a keymap or a level from elsewhere cannot act on the
 * analyst's terminal (clipboard, title, clear screen) or hide what it says.
 */
export function visible(text: string): string {
  return UNSEEN.test(text) ? text.replace(UNSEEN_ALL, (c) => `\\u{${(c.codePointAt(0) ?? 0).toString(16)}}`) : text;
}

/** Does the text hold a character that `visible` would escape? */
export const hasUnseen = (text: string): boolean => UNSEEN.test(text);
