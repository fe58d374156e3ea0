import { stringify } from 'csv-stringify/sync';

export type Cell = string | number | null;

/**
 * A text cell that a spreadsheet would run as a formula gets a leading
 * apostrophe (OWASP CSV injection guidance). Numbers are left alone, so
 * negative values stay numbers.
 */
export function neutraliseText(value: string): string {
  return /^[=+\-@\t\r\n\0]/.test(value) ? `'${value}` : value;
}

/** RFC 4180 CSV: header row, CRLF line ends, quoting by csv-stringify. */
export function toCsv(columns: readonly string[], rows: readonly (readonly Cell[])[]): string {
  return stringify([[...columns], ...rows.map((r) => r.map((c) => (c === null ? '' : c)))], {
    record_delimiter: 'windows',
    // With CRLF records, csv-stringify would leave a lone LF or CR unquoted; RFC 4180 quotes both.
    quoted_match: /[\r\n]/,
    cast: { string: (value) => neutraliseText(value) },
  });
}
