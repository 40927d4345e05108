/**
 * Strict decimal-number parsing for imported text.
 *
 * `Number()` alone is too lenient for data files: it reads '' and '  ' as 0, '0x1A' as 26,
 * 'Infinity' as Infinity and '1_000' as NaN but '1e400' as Infinity. `parseFloat` is worse: it
 * reads '12abc' as 12. So a token is first matched against one precompiled pattern (plain
 * decimal notation with an optional exponent), then converted with `Number()`.
 */

// Optional sign, digits with an optional fraction (or a bare fraction), optional exponent.
// Written so that a run of digits can be matched one way only: the earlier `\d+\.?\d*` could
// split "1111...1x" between its two digit runs in every way, quadratic in the length of the token.
const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Parses a decimal number written as text.
 *
 * Accepted: `12`, `-3.5`, `+1.6`, `.5`, `5.`, `1e3`, `2.5E-1`, with surrounding blanks.
 * With `decimalComma`, one ',' may stand for the decimal point (`1,5` → 1.5); '.' is then still
 * accepted, and a token holding both is refused (thousands separators are not supported).
 * Refused (NaN): '', '12abc', '0x1A', 'Infinity', 'NaN', '1,5' without `decimalComma`, and any
 * value that overflows to ±Infinity.
 *
 * @param text the token.
 * @param decimalComma accept ',' as the decimal separator (European CSV with ';' delimiters).
 * @returns the finite number, or NaN when the token is not a plain decimal number.
 * @example parseDecimal('1,25', true) // 1.25
 */
export function parseDecimal(text: string, decimalComma = false): number {
  let s = text.trim();
  if (s.length === 0) return NaN;
  if (decimalComma) {
    const comma = s.indexOf(',');
    if (comma !== -1) {
      if (s.indexOf(',', comma + 1) !== -1 || s.indexOf('.') !== -1) return NaN;
      s = `${s.slice(0, comma)}.${s.slice(comma + 1)}`;
    }
  }
  if (!DECIMAL.test(s)) return NaN;
  const v = Number(s);
  return Number.isFinite(v) ? v : NaN;
}
