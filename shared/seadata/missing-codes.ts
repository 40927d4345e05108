/**
 * Missing-value codes of CSV files.
 *
 * A code that reads as a number is compared numerically with the cell's number before any unit
 * conversion, so '-999' also matches '-999.0' and '-999,00' (with a decimal comma). Any other code
 * is compared as text, ignoring case and surrounding blanks ('NaN' matches 'nan' and ' NAN ').
 * The empty cell is missing only when '' is in the list.
 *
 * Defaults ({@link DEFAULT_MISSING_CODES}): '' (empty cell), NaN, NA, N/A, null, None, '-', '--',
 * MM (NDBC realtime), and the numbers -9999, -999, -99, 999, 9999, 99999. None of these numbers
 * is a plausible value of any variable (heights ≤ 25 m, periods ≤ 40 s, directions ≤ 360°,
 * wind ≤ 100 m/s, none negative), so treating them as missing cannot hide a real value. 99 is
 * deliberately not a default: it is a valid direction. A list given by the user replaces the
 * defaults (the upload form starts from them).
 */
import { parseDecimal } from './parse-decimal';

/** Default missing-value codes (see the module comment). */
export const DEFAULT_MISSING_CODES: readonly string[] = [
  '',
  'NaN',
  'NA',
  'N/A',
  'null',
  'None',
  '-',
  '--',
  'MM',
  '-9999',
  '-999',
  '-99',
  '999',
  '9999',
  '99999',
];

/** Matcher for a list of missing-value codes. */
export class MissingCodes {
  private readonly numbers = new Set<number>();
  private readonly texts = new Set<string>();
  /** True when an empty cell is missing. */
  readonly emptyIsMissing: boolean;

  /**
   * @param codes the codes (see the module comment).
   * @param decimalComma read numeric codes with a decimal comma too.
   */
  constructor(codes: readonly string[] = DEFAULT_MISSING_CODES, decimalComma = false) {
    let empty = false;
    for (const code of codes) {
      const t = code.trim();
      if (t === '') {
        empty = true;
        continue;
      }
      const v = parseDecimal(t, decimalComma);
      if (Number.isNaN(v)) this.texts.add(t.toLowerCase());
      else this.numbers.add(v);
    }
    this.emptyIsMissing = empty;
  }

  /** True when the number `value` (as read, before unit conversion) is a missing code. */
  isMissingNumber(value: number): boolean {
    return this.numbers.size > 0 && this.numbers.has(value);
  }

  /** True when the non-numeric, non-empty, trimmed text is a missing code. */
  isMissingText(trimmed: string): boolean {
    return this.texts.size > 0 && this.texts.has(trimmed.toLowerCase());
  }
}
