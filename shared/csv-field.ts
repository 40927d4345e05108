/**
 * One CSV field, for every CSV the product writes (the browser's download buttons and the
 * server's workability.csv).
 *
 * - RFC 4180 (from memory): a field holding '"', ',', CR or LF is wrapped in double quotes, with
 *   each '"' doubled. A field holding ';' or tab is quoted too: spreadsheets whose list separator
 *   is ';' (most of continental Europe) split on it, and the piece after it could start a formula.
 * - CSV injection (OWASP "CSV Injection" page, from memory): a spreadsheet runs a cell that starts
 *   with '=', '+', '-' or '@' (or tab or CR, which it skips first) as a formula, so a worksite
 *   named `=HYPERLINK(...)` or `@SUM(...)` would run on the reader's machine. Such a text gets a
 *   leading apostrophe, which spreadsheets read as "this is text". Plain decimal numbers written
 *   as text ('-1.5', '+3') cannot carry a formula and are left as they are.
 * Numbers are written as JavaScript prints them (NaN and infinities as an empty field), booleans
 * as yes/no, null and undefined as an empty field.
 *
 * @example csvField('=1+2";=1+2') // "'=1+2"";=1+2" wrapped in quotes
 */
export function csvField(v: string | number | boolean | null | undefined): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  let s = FORMULA_START.test(v) && !PLAIN_NUMBER.test(v) ? `'${v}` : v;
  if (NEEDS_QUOTES.test(s)) s = `"${s.replace(/"/g, '""')}"`;
  return s;
}

const FORMULA_START = /^[=+\-@\t\r\n]/;
const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const NEEDS_QUOTES = /[",;\t\r\n]/;
