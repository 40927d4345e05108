/**
 * Size limits of the sea-state readers, so that a hostile or broken upload is refused with a
 * line and column instead of filling memory or holding the server's event loop.
 *
 * Both limits are far above any honest file:
 * - A sea-state row is a time and at most a few dozen values, under 1 kB; an NDBC stdmet line is
 *   under 100 characters. One line (a CSV row, quoted line breaks included) may be 1 MiB: a line
 *   without any line break is buffered whole before it can be split, so this bounds that buffer
 *   and the field array made from it.
 * - A CSV row may hold 16,384 fields (2^14): the widest sheet common spreadsheet programs allow
 *   (from memory), so no spreadsheet export is wider. Without a limit, a header
 *   of a million delimiters would make every row a million-field array.
 * Lengths are counted in UTF-16 code units of the decoded text (JavaScript string length), which
 * equals bytes for ASCII text.
 */

/** Longest line (CSV: row) accepted, in characters: 1 MiB. */
export const MAX_LINE_CHARS = 1 << 20;

/** Most fields in one CSV row or NDBC line. */
export const MAX_COLUMNS = 16_384;

/** `12345` as `12,345` for messages. */
export function groupDigits(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** Reason of an issue for a row with more fields than {@link MAX_COLUMNS}. */
export function tooManyColumnsReason(found: number): string {
  return `${groupDigits(found)} fields in one row, more than the ${groupDigits(MAX_COLUMNS)} columns a file may have`;
}
