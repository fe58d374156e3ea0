/**
 * What a screen shows, as plain values: lines of text with their emphasis. The
 * pure views build these; one Ink renderer (styled-text.tsx) draws them, so a
 * view can be tested without a terminal.
 */

/** A role, not a colour: the theme gives it a colour, or none under NO_COLOR. */
export type Tone = 'accent' | 'warning' | 'error' | 'ok' | 'zero' | 'dim';

export interface Span {
  readonly text: string;
  readonly bold?: boolean;
  readonly inverse?: boolean;
  readonly tone?: Tone | undefined;
}

export interface Line {
  readonly spans: readonly Span[];
  /** Ink's default wraps a line too long for its box; a header truncates instead. */
  readonly wrap?: 'wrap' | 'truncate-end';
}

/** A panel of lines in a column `width` wide (and `height` high, when it is fixed). */
export interface Panel {
  readonly width: number;
  readonly height?: number;
  readonly lines: readonly Line[];
}

export type Style = Omit<Span, 'text'>;

export function line(text: string, style: Style = {}, wrap?: Line['wrap']): Line {
  return wrap ? { spans: [{ text, ...style }], wrap } : { spans: [{ text, ...style }] };
}

/** A header line: one line that never wraps. */
export function truncated(text: string, style: Style = {}): Line {
  return line(text, style, 'truncate-end');
}

/** Prepared lines whose first is the panel's title. */
export function titled(lines: readonly string[]): Line[] {
  return lines.map((text, i) => line(text, i === 0 ? { bold: true } : {}));
}

/** The words of a line, as the terminal shows them. */
export function textOf(l: Line): string {
  return l.spans.map((s) => s.text).join('');
}
