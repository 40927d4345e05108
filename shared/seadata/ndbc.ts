/**
 * NDBC standard meteorological text files ("stdmet") to sea-state records, read incrementally.
 *
 * Format (NDBC "Measurement Descriptions and Units" and "Important NDBC Web Site Changes", as
 * summarised in the project's NDBC test-data README): whitespace-separated columns, times in UTC.
 * Header variants recognised from the first non-blank line:
 * - ≤ 1998: `YY MM DD hh WD WSPD GST WVHT DPD APD MWD BAR ...`: 2-digit year, no minute, 16 columns;
 * - 1999-2004: `YYYY MM DD hh WD ...` (2000-2004 add TIDE);
 * - 2005-2006: `YYYY MM DD hh mm WD ...` (minute column added);
 * - 2007 on: `#YY MM DD hh mm WDIR WSPD GST WVHT DPD APD MWD PRES ...` plus a `#yr mo dy hr mn`
 *   units line; the `#YY` column holds a 4-digit year;
 * - realtime (45-day files): as 2007 plus PTDY (19 columns), newest row first, `MM` = missing.
 * Columns are found by name, so their order and count may vary; every data row must have as many
 * fields as the header. Lines starting with '#' after the header are comments (the units line).
 * A header line met again later (files joined end to end) is read anew. LF and CRLF line endings
 * are both accepted, also mixed in one file (the 1997 test file switches from LF to CRLF).
 *
 * Mapping (docs/domain.md#ndbc): WVHT → hs (m), DPD (dominant period) → tp (s),
 * APD (average period) → tz (s), MWD → dir (deg, from), WSPD → wind (m/s), WDIR or WD → windDir
 * (deg, from). Te is not in the format and stays NaN; no period is derived here (the import
 * service derives missing periods and marks them as derived). Other columns are ignored.
 *
 * Missing values, checked per column and numerically (the NDBC README's pitfalls: 99 is a valid
 * direction and 999.0 a valid pressure, so "all nines" is never a rule): `MM` anywhere; WVHT, DPD,
 * APD ≥ 99; WSPD ≥ 99; WDIR/WD, MWD ≥ 999.
 *
 * Years below 100 are read as 1900 + YY (NDBC wrote 2-digit years only up to 1998).
 *
 * Rows are kept as records even when every mapped value is missing (a buoy row with no data is a
 * "no data" hour, docs/domain.md#convention-12; the 1997 test file has 67 such rows), and realtime
 * 10-minute rows are kept whether they carry waves or wind only: the record count equals the data
 * row count of the file.
 *
 * Wind: NDBC gives WSPD at the anemometer height (about 4-5 m on many buoys). By default the
 * value is kept as is; with `anemometerHeightM` it is brought to 10 m by the 1/7 power law
 * (docs/domain.md#ndbc), see `windSpeedAt10m`.
 *
 * Limits (limits.ts): a line longer than MAX_LINE_CHARS (1 MiB) or with more than MAX_COLUMNS
 * fields refuses the whole file, naming the line and the character or field past the limit.
 *
 * Rows are checked with the rules of validate.ts; the file may be oldest-first (historical) or
 * newest-first (realtime): the first two rows fix the direction and the records are always
 * returned oldest-first.
 */
import { ImportError } from './issues';
import { groupDigits, MAX_COLUMNS, MAX_LINE_CHARS, tooManyColumnsReason } from './limits';
import { SeaRowValidator, type BadRowMode, type ImportResult } from './validate';
import { parseDecimal } from './parse-decimal';
import { windHeightFactor } from './wind-height';

/** Options of {@link NdbcParser}. */
export interface NdbcParserOptions {
  /** What to do with bad rows; default 'refuse'. */
  onBadRows?: BadRowMode;
  /** Anemometer height above sea level, m (> 0); when set, WSPD is corrected to 10 m. */
  anemometerHeightM?: number;
}

const WS = /\s+/;

// Positions in SEA_VARIABLES: hs 0, tp 1, tz 2, te 3, dir 4, wind 5, windDir 6.
interface MappedColumn {
  /** Field index in the row. */
  field: number;
  /** Header name as written. */
  name: string;
  /** Index in SEA_VARIABLES. */
  variable: number;
  /** Values at or above this are NDBC's missing code. */
  missingFrom: number;
  /** Multiplier applied after the missing check (wind height correction). */
  factor: number;
}

// NDBC column names → SEA_VARIABLES index and missing threshold (README pitfalls).
const NDBC_COLUMNS: Record<string, { variable: number; missingFrom: number }> = {
  WVHT: { variable: 0, missingFrom: 99 },
  DPD: { variable: 1, missingFrom: 99 },
  APD: { variable: 2, missingFrom: 99 },
  AVP: { variable: 2, missingFrom: 99 }, // older name of APD (from memory)
  MWD: { variable: 4, missingFrom: 999 },
  WSPD: { variable: 5, missingFrom: 99 },
  WDIR: { variable: 6, missingFrom: 999 },
  WD: { variable: 6, missingFrom: 999 },
};

interface NdbcHeader {
  fieldCount: number;
  hasMinute: boolean;
  timeLabel: string;
  columns: MappedColumn[];
}

/** Tokens of a header line, or null when the line is not an NDBC stdmet header. */
function headerTokens(line: string): string[] | null {
  const t = line.trim().replace(/^#/, '').trim().split(WS);
  if (t.length < 5) return null;
  if ((t[0] !== 'YY' && t[0] !== 'YYYY') || t[1] !== 'MM' || t[2] !== 'DD' || t[3] !== 'hh') return null;
  return t;
}

/**
 * True when the text starts like an NDBC standard meteorological file: its first non-blank line
 * is a `YY`/`YYYY`/`#YY` header with `MM DD hh` and at least one of WVHT, WSPD. For format
 * auto-detection on the first few hundred bytes of an upload.
 */
export function looksLikeNdbc(firstLines: string): boolean {
  const text = firstLines.charCodeAt(0) === 0xfeff ? firstLines.slice(1) : firstLines;
  for (const raw of text.split('\n', 20)) {
    if (raw.trim() === '') continue;
    const t = headerTokens(raw);
    return t !== null && (t.includes('WVHT') || t.includes('WSPD'));
  }
  return false;
}

/**
 * Streaming NDBC reader: `push` chunks of text in order (any sizes, any split points), then
 * `end()`. Never needs the whole file in one string.
 *
 * @example
 * const p = new NdbcParser({ onBadRows: 'skip' });
 * for await (const chunk of stream) p.push(chunk);
 * const { records, report } = p.end();
 */
export class NdbcParser {
  private readonly v: SeaRowValidator;
  private readonly windFactor: number;
  private rest = '';
  private line = 0;
  private started = false;
  private header: NdbcHeader | null = null;
  private fatal: ImportError | null = null;
  private ended = false;

  /** @throws RangeError for an invalid `anemometerHeightM`. */
  constructor(options: NdbcParserOptions = {}) {
    this.v = new SeaRowValidator('ndbc', options.onBadRows ?? 'refuse', 'auto');
    this.v.note('NDBC times are UTC.');
    this.v.note(
      'Mapping: WVHT to Hs, DPD (dominant period) to Tp, APD (average period) to Tz, MWD to direction (NDBC gives it at the dominant period), WSPD/WDIR to wind; Te is not in the format.',
    );
    if (options.anemometerHeightM === undefined) {
      this.windFactor = 1;
      this.v.note('Wind speed kept at the anemometer height (no height given).');
    } else {
      this.windFactor = windHeightFactor(options.anemometerHeightM);
      this.v.note(
        `Wind speed corrected from ${options.anemometerHeightM} m to 10 m by the 1/7 power law (factor ${this.windFactor.toFixed(4)}).`,
      );
    }
  }

  /** Lines read so far (for progress reports). */
  get linesRead(): number {
    return this.line;
  }

  /** True once the file is refused as a whole: `end()` will throw, and further text is not read. */
  get failed(): boolean {
    return this.fatal !== null;
  }

  /** Feeds the next piece of text. */
  push(chunk: string): void {
    if (this.ended) throw new Error('NdbcParser: push after end');
    if (this.fatal !== null || chunk.length === 0) return;
    let text = this.rest + chunk;
    if (!this.started) {
      this.started = true;
      if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
    }
    let start = 0;
    let nl = text.indexOf('\n', start);
    while (nl !== -1) {
      this.readLine(text, start, nl);
      if (this.fatal !== null) {
        this.rest = '';
        return;
      }
      start = nl + 1;
      nl = text.indexOf('\n', start);
    }
    this.rest = text.slice(start);
    // A line still open past the limit is refused now rather than buffered to the end of the file.
    if (this.rest.length > MAX_LINE_CHARS) {
      this.tooLong(this.line + 1, this.rest);
      this.rest = '';
    }
  }

  /**
   * Ends the file and returns the records (oldest first) and the import report.
   * @throws ImportError when the file is not NDBC stdmet, has no usable record, or (in `refuse`
   *   mode) has any issue.
   */
  end(): ImportResult {
    if (this.ended) throw new Error('NdbcParser: end called twice');
    if (this.fatal === null && this.rest.length > 0) {
      const text = this.rest;
      this.rest = '';
      this.readLine(text, 0, text.length);
    }
    this.ended = true;
    if (this.fatal !== null) throw this.fatal;
    if (this.header === null) {
      throw ImportError.single(0, '', '', 'empty file: no NDBC header line found');
    }
    return this.v.finish();
  }

  private readLine(text: string, start: number, endExcl: number): void {
    this.line++;
    let end = endExcl;
    if (end > start && text.charCodeAt(end - 1) === 13) end--; // CR of CRLF
    const line = text.slice(start, end);
    if (line.length > MAX_LINE_CHARS) {
      this.tooLong(this.line, line);
      return;
    }
    if (line.trim() === '') return;
    const first = line.trimStart();
    const c0 = first.charCodeAt(0);
    const isDigit = c0 >= 48 && c0 <= 57;
    if (!isDigit) {
      const tokens = headerTokens(line);
      if (tokens !== null) {
        this.readHeader(tokens);
        return;
      }
      if (this.header === null) {
        this.fatal = ImportError.single(
          this.line,
          '',
          line,
          'not an NDBC standard meteorological file: the first line must be a YY/YYYY/#YY MM DD hh header',
        );
        return;
      }
      if (c0 === 35) return; // '#': comment or units line
    }
    if (this.header === null) {
      this.fatal = ImportError.single(this.line, '', line, 'data before the NDBC header line');
      return;
    }
    this.readRow(line);
  }

  private tooLong(line: number, text: string): void {
    this.fatal = ImportError.single(
      line,
      String(MAX_LINE_CHARS + 1),
      text.slice(0, 80),
      `a line longer than 1 MiB (${groupDigits(MAX_LINE_CHARS)} characters) without a line break`,
    );
  }

  private tooManyFields(tokens: string[]): boolean {
    if (tokens.length <= MAX_COLUMNS) return false;
    this.fatal = ImportError.single(this.line, String(MAX_COLUMNS + 1), tokens.slice(0, 8).join(' '), tooManyColumnsReason(tokens.length));
    return true;
  }

  private readHeader(tokens: string[]): void {
    if (this.tooManyFields(tokens)) return;
    const hasMinute = tokens[4] === 'mm';
    const timeCount = hasMinute ? 5 : 4;
    const columns: MappedColumn[] = [];
    const seen = new Set<number>();
    for (let i = timeCount; i < tokens.length; i++) {
      const spec = NDBC_COLUMNS[tokens[i]];
      if (spec === undefined || seen.has(spec.variable)) continue;
      seen.add(spec.variable);
      columns.push({
        field: i,
        name: tokens[i],
        variable: spec.variable,
        missingFrom: spec.missingFrom,
        factor: spec.variable === 5 ? this.windFactor : 1,
      });
    }
    if (columns.length === 0) {
      this.fatal = ImportError.single(this.line, '', tokens.join(' '), 'NDBC header without any of WVHT, DPD, APD, MWD, WSPD, WDIR');
      return;
    }
    this.header = {
      fieldCount: tokens.length,
      hasMinute,
      timeLabel: tokens.slice(0, timeCount).join(' '),
      columns,
    };
  }

  private readRow(line: string): void {
    const h = this.header as NdbcHeader;
    const v = this.v;
    const f = line.trim().split(WS);
    if (this.tooManyFields(f)) return;
    v.beginRow(this.line);
    const timeRaw = f.slice(0, h.hasMinute ? 5 : 4).join(' ');
    if (f.length !== h.fieldCount) {
      v.rowIssue('', line.trim(), `expected ${h.fieldCount} fields as in the header, found ${f.length}`);
      v.commitRow(NaN, h.timeLabel, timeRaw);
      return;
    }
    const timeMs = this.rowTime(f, h.hasMinute);
    if (Number.isNaN(timeMs)) v.rowIssue(h.timeLabel, timeRaw, 'unparseable time');
    for (const c of h.columns) {
      const tok = f[c.field];
      if (tok === 'MM') continue;
      const x = parseDecimal(tok);
      if (Number.isNaN(x)) {
        v.rowIssue(c.name, tok, 'not a number');
        continue;
      }
      if (x >= c.missingFrom) continue;
      v.setValue(c.variable, x * c.factor, c.name, tok);
    }
    v.commitRow(timeMs, h.timeLabel, timeRaw);
  }

  /** UTC ms of the row's time fields, or NaN. */
  private rowTime(f: string[], hasMinute: boolean): number {
    let year = intField(f[0]);
    const month = intField(f[1]);
    const day = intField(f[2]);
    const hour = intField(f[3]);
    const minute = hasMinute ? intField(f[4]) : 0;
    if (year >= 0 && year < 100) year += 1900;
    if (!(year >= 1900 && year <= 2300) || !(month >= 1 && month <= 12) || !(hour >= 0 && hour <= 23) || !(minute >= 0 && minute <= 59)) {
      return NaN;
    }
    const t = Date.UTC(year, month - 1, day, hour, minute);
    // Rejects days past the month's end (Date.UTC would roll 31 April over to 1 May).
    if (!(day >= 1) || new Date(t).getUTCDate() !== day) return NaN;
    return t;
  }
}

/** A non-negative integer written with digits only, else NaN. */
function intField(s: string): number {
  if (s === undefined || s.length === 0 || s.length > 4) return NaN;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 48 || c > 57) return NaN;
  }
  return +s;
}
