/**
 * CSV rows (already split into fields) to validated sea-state records.
 *
 * The first row that is not blank is the header. The column mapping is the one given, or the one
 * {@link detectColumns} finds in the header. Each data row is read as:
 * - time: the mapped column (or date column + ' ' + time column), parsed by `TimestampParser`:
 *   ISO 8601 with Z or an offset, or a wall-clock time in `timeZone` (default UTC); see
 *   timestamp-parser.ts for the forms and the daylight-saving rules. Times must increase.
 * - values: blanks around a value are ignored; a missing-value code (missing-codes.ts) gives NaN;
 *   any other text must be a plain decimal number (`12abc`, `0x10`, `Infinity` are refused), with
 *   a decimal comma when `decimalComma` is set. Heights are converted from `units.height`, wind
 *   speeds from `units.speed` (exact factors, units.ts) and from `anemometerHeightM` (default 10 m:
 *   no correction) to 10 m by U10 = Uz (10/z)^a (wind-height.ts). A wind of 99 (99.0) is missing.
 *   Periods are seconds, directions degrees coming from (`directionConvention` 'going-to' adds
 *   180°). Then the rules of validate.ts apply.
 * - a row with a different number of fields than the header is refused, except for extra empty
 *   fields at its end (a trailing delimiter).
 * - a row (the header too) with more than MAX_COLUMNS fields (limits.ts) refuses the whole file.
 *
 * Periods that are not mapped or missing stay NaN: nothing is derived here.
 */
import {
  detectColumns,
  detectPartitionColumns,
  detectUnits,
  type ColumnMapping,
  type DetectedColumns,
  type PartitionColumn,
} from './csv-columns';
import { ImportError, type ImportIssue } from './issues';
import { MAX_COLUMNS, tooManyColumnsReason } from './limits';
import { DEFAULT_MISSING_CODES, MissingCodes } from './missing-codes';
import { parseDecimal } from './parse-decimal';
import { SEA_VARIABLES, type SeaVariable } from './records';
import { TimestampParser, type DateOrder } from './timestamp-parser';
import { heightFactorToM, speedFactorToMs, SI_UNITS, type SeaUnits } from './units';
import { SeaRowValidator, type BadRowMode, type ImportResult } from './validate';
import { DEFAULT_WIND_EXPONENT, WIND_REFERENCE_HEIGHT_M, windHeightFactor, windHeightNote } from './wind-height';

/** Options of {@link CsvRecordReader} (all optional). */
export interface CsvReaderOptions {
  /** Column mapping; default: detected from the header row. */
  mapping?: ColumnMapping;
  /**
   * Units of the value columns. Default: what the mapped header names say (`Hs [ft]`,
   * `wind (kn)`, see `detectUnits`), else m, m/s, degrees. Keys given here win.
   */
  units?: Partial<SeaUnits>;
  /** IANA zone of timestamps without an offset; default 'UTC'. */
  timeZone?: string;
  /** Day order of year-last dates with '/' or '-' (DD/MM/YYYY is 'dmy'). */
  dateOrder?: DateOrder;
  /** Missing-value codes; default DEFAULT_MISSING_CODES (a given list replaces it). */
  missingCodes?: readonly string[];
  /** Accept ',' as the decimal separator; default false (CsvTextParser turns it on for ';' files). */
  decimalComma?: boolean;
  /** What to do with bad rows; default 'refuse'. */
  onBadRows?: BadRowMode;
  /** Height of the wind measurement above sea level, m; default 10 (already at 10 m, no correction). */
  anemometerHeightM?: number;
  /** Power-law exponent of the height correction U10 = Uz (10/z)^a; default 0.11 (open sea). */
  windExponent?: number;
  /** Direction columns give where waves and wind come from (default) or go to (then 180 deg is added). */
  directionConvention?: DirectionConvention;
  /** Called for every data row with how it was read (used by the preview). */
  onRow?: (row: CsvRowResult) => void;
}

/** Conventions of direction columns: nautical coming-from (the default) or going-to. */
export const DIRECTION_CONVENTIONS = ['coming-from', 'going-to'] as const;
export type DirectionConvention = (typeof DIRECTION_CONVENTIONS)[number];

/** The wind value 99 (also written 99.0) is a missing code of wind columns, before unit conversion. */
export const WIND_MISSING_VALUE = 99;

/** How one data row was read. */
export interface CsvRowResult {
  /** 1-based line of the row in the file. */
  line: number;
  /** The fields as split. */
  fields: readonly string[];
  /** UTC ms, NaN when the time was refused. */
  timeMs: number;
  /** Values in SI units (NaN = missing or refused). */
  values: Record<SeaVariable, number>;
  /** Issues of this row (empty when it is clean). */
  issues: readonly ImportIssue[];
  /** True when the row became a record. */
  kept: boolean;
}

const WIND_INDEX = SEA_VARIABLES.indexOf('wind');
const DIR_INDEX = SEA_VARIABLES.indexOf('dir');
const WIND_DIR_INDEX = SEA_VARIABLES.indexOf('windDir');

interface ValueColumn {
  field: number;
  name: string;
  variable: number;
  factor: number;
}

/**
 * Streaming reader of CSV rows: `pushRow(fields, line)` for every row (header first), then
 * `end()`.
 *
 * @example
 * const r = new CsvRecordReader({ timeZone: 'Europe/Oslo', units: { speed: 'kn' } });
 * r.pushRow(['time', 'hs', 'wind'], 1);
 * r.pushRow(['2023-01-01 00:00', '1.5', '10'], 2);
 * r.end().records.wind[0]; // 5.144... (10 kn)
 */
export class CsvRecordReader {
  private readonly v: SeaRowValidator;
  private readonly times: TimestampParser;
  private readonly missing: MissingCodes;
  private readonly decimalComma: boolean;
  private readonly givenUnits: Partial<SeaUnits> | undefined;
  private readonly windToTenM: number;
  private readonly goingTo: boolean;
  private readonly onRow: CsvReaderOptions['onRow'];
  private readonly givenMapping: ColumnMapping | undefined;
  private headerNames: string[] | null = null;
  private mappingUsed: ColumnMapping | null = null;
  private timeField = -1;
  private dateField = -1;
  private timeLabel = '';
  private columns: ValueColumn[] = [];
  /** Partition columns (docs/domain.md#partitions): `variable` indexes the validator's partition columns. */
  private partColumns: ValueColumn[] = [];
  private partGoingTo: boolean[] = [];
  private fatal: ImportError | null = null;
  private ended = false;

  /** @throws RangeError for an unknown time zone or an invalid anemometer height. */
  constructor(options: CsvReaderOptions = {}) {
    this.v = new SeaRowValidator('csv', options.onBadRows ?? 'refuse', 'ascending');
    this.times = new TimestampParser({ timeZone: options.timeZone, dateOrder: options.dateOrder });
    this.decimalComma = options.decimalComma ?? false;
    this.missing = new MissingCodes(options.missingCodes ?? DEFAULT_MISSING_CODES, this.decimalComma);
    this.givenUnits = options.units;
    const heightM = options.anemometerHeightM ?? WIND_REFERENCE_HEIGHT_M;
    const exponent = options.windExponent ?? DEFAULT_WIND_EXPONENT;
    this.windToTenM = windHeightFactor(heightM, exponent);
    this.goingTo = options.directionConvention === 'going-to';
    this.onRow = options.onRow;
    this.givenMapping = options.mapping;

    this.v.note(`Times without an offset are read in ${options.timeZone ?? 'UTC'}.`);
    this.v.note(windHeightNote(heightM, exponent));
    this.v.note('A wind speed of 99 (or 99.0) is read as missing.');
    if (this.goingTo) this.v.note('Directions are going-to in the file: 180° added to give coming-from.');
    if (this.decimalComma) this.v.note('A decimal comma is accepted.');
    const codes = (options.missingCodes ?? DEFAULT_MISSING_CODES).map((c) => JSON.stringify(c)).join(', ');
    this.v.note(`Missing-value codes: ${codes}.`);
  }

  /** The header row as read (null before it). */
  get headers(): readonly string[] | null {
    return this.headerNames;
  }

  /** True once the file is refused as a whole: `end()` will throw and further rows are ignored. */
  get failed(): boolean {
    return this.fatal !== null;
  }

  /** The mapping in use (null before the header). */
  get mapping(): ColumnMapping | null {
    return this.mappingUsed;
  }

  /**
   * Feeds one row.
   * @param fields the fields of the row, unquoted.
   * @param line 1-based line number of the row's start in the file.
   * @param problem set when the CSV splitter found the row malformed (e.g. a bad quote): the row
   *   is then refused with this reason.
   */
  pushRow(fields: readonly string[], line: number, problem?: string): void {
    if (this.ended) throw new Error('CsvRecordReader: pushRow after end');
    if (this.fatal !== null) return;
    if (fields.length > MAX_COLUMNS) {
      const shown = fields.slice(0, 8).join(', ');
      this.fatal = ImportError.single(line, String(MAX_COLUMNS + 1), shown, tooManyColumnsReason(fields.length));
      return;
    }
    if (isBlankRow(fields)) return;
    if (this.headerNames === null) {
      this.readHeader(fields, line);
      return;
    }
    this.readRow(fields, line, problem);
  }

  /**
   * A line the splitter could not read as a row (a quote not closed on its line): a bad row at
   * `line` with the reason at `column` (1-based character); on the header line the file is refused.
   */
  pushBadLine(line: number, text: string, column: number, reason: string): void {
    if (this.ended) throw new Error('CsvRecordReader: pushBadLine after end');
    if (this.fatal !== null) return;
    if (this.headerNames === null) {
      this.fatal = ImportError.single(line, String(column), text.slice(0, 80), `header row: ${reason}`);
      return;
    }
    const v = this.v;
    v.beginRow(line);
    v.rowIssue(String(column), text, reason);
    const kept = v.commitRow(NaN, this.timeLabel, '');
    if (this.onRow !== undefined) {
      const values = {} as Record<SeaVariable, number>;
      SEA_VARIABLES.forEach((name) => (values[name] = NaN));
      this.onRow({ line, fields: [text], timeMs: NaN, values, issues: v.currentRowIssues.slice(), kept });
    }
  }

  /**
   * Ends the file.
   * @throws ImportError when there is no header, the mapping does not fit the header, no row is
   *   usable, or (in `refuse` mode) any row has an issue.
   */
  end(): ImportResult {
    if (this.ended) throw new Error('CsvRecordReader: end called twice');
    this.ended = true;
    if (this.fatal !== null) throw this.fatal;
    if (this.headerNames === null) throw ImportError.single(0, '', '', 'empty file: no header row');
    return this.v.finish();
  }

  private readHeader(fields: readonly string[], line: number): void {
    const headers = fields.map((f, i) => (i === 0 ? f.replace(/^\uFEFF/, '') : f).trim());
    this.headerNames = headers;
    const mapping: DetectedColumns = this.givenMapping ?? detectColumns(headers);
    if (mapping.time === undefined) {
      this.fatal = ImportError.single(line, '', headers.join(', '), 'no time column recognised: choose it in the column mapping');
      return;
    }
    const find = (name: string): number => {
      const exact = headers.indexOf(name.trim());
      if (exact !== -1) return exact;
      const lower = name.trim().toLowerCase();
      return headers.findIndex((h) => h.toLowerCase() === lower);
    };
    const absent: string[] = [];
    this.timeField = find(mapping.time);
    if (this.timeField === -1) absent.push(mapping.time);
    if (mapping.date !== undefined) {
      this.dateField = find(mapping.date);
      if (this.dateField === -1) absent.push(mapping.date);
    }
    this.timeLabel = mapping.date === undefined ? mapping.time : `${mapping.date} + ${mapping.time}`;
    const units: SeaUnits = { ...SI_UNITS, ...detectUnits(mapping), ...this.givenUnits };
    this.v.note(`Units: height ${units.height}, wind speed ${units.speed}, directions degrees (coming from), periods s.`);
    const columns: ValueColumn[] = [];
    SEA_VARIABLES.forEach((variable, index) => {
      const name = mapping[variable];
      if (name === undefined) return;
      const field = find(name);
      if (field === -1) {
        absent.push(name);
        return;
      }
      let factor = 1;
      if (variable === 'hs') factor = heightFactorToM(units.height);
      else if (variable === 'wind') factor = speedFactorToMs(units.speed) * this.windToTenM;
      columns.push({ field, name: headers[field], variable: index, factor });
    });
    if (absent.length > 0) {
      this.fatal = ImportError.single(line, absent.join(', '), absent.join(', '), 'mapped column not in the header row');
      return;
    }
    if (columns.length === 0) {
      this.fatal = ImportError.single(
        line,
        '',
        headers.join(', '),
        'no sea-state column recognised: map at least one of Hs, Tp, Tz, Te, direction, wind',
      );
      return;
    }
    this.columns = columns;
    // Partitions in the columns left over (NDBC files never have them).
    const parts = detectPartitionColumns(headers, mapping);
    const partNames = Object.keys(parts) as PartitionColumn[];
    if (partNames.length > 0) {
      this.v.withPartitions(partNames);
      this.partColumns = partNames.map((name, k) => {
        const field = find(parts[name]!);
        return { field, name: headers[field], variable: k, factor: name.endsWith('.hs') ? heightFactorToM(units.height) : 1 };
      });
      this.partGoingTo = partNames.map((name) => this.goingTo && name.endsWith('.dir'));
    }
    this.mappingUsed = { ...mapping, time: mapping.time };
    const unmapped = SEA_VARIABLES.filter((x) => mapping[x] === undefined);
    if (unmapped.length > 0) this.v.note(`Not in the file: ${unmapped.join(', ')} (left missing, nothing derived here).`);
  }

  private readRow(fields: readonly string[], line: number, problem: string | undefined): void {
    const v = this.v;
    v.beginRow(line);
    if (problem !== undefined) v.rowIssue('', fields.join(' | '), problem);
    const headerCount = (this.headerNames as string[]).length;
    let fieldsOk = fields.length === headerCount;
    if (fields.length > headerCount) {
      fieldsOk = true;
      for (let i = headerCount; i < fields.length; i++) if (fields[i].trim() !== '') fieldsOk = false;
    }
    let timeRaw = '';
    let timeMs = NaN;
    if (!fieldsOk) {
      v.rowIssue('', fields.join(' | '), `expected ${headerCount} fields as in the header, found ${fields.length}`);
    } else {
      timeRaw = this.dateField === -1 ? fields[this.timeField] : `${fields[this.dateField].trim()} ${fields[this.timeField].trim()}`;
      timeMs = this.times.parse(timeRaw, v.lastAcceptedMs);
      if (Number.isNaN(timeMs)) v.rowIssue(this.timeLabel, timeRaw, this.times.error);
      for (const c of this.columns) this.readValue(fields[c.field], c);
      for (const c of this.partColumns) this.readPartition(fields[c.field], c);
    }
    const kept = v.commitRow(timeMs, this.timeLabel, timeRaw);
    if (this.onRow !== undefined) {
      const row = v.currentRowValues;
      const values = {} as Record<SeaVariable, number>;
      SEA_VARIABLES.forEach((name, i) => (values[name] = row[i]));
      this.onRow({ line, fields, timeMs, values, issues: v.currentRowIssues.slice(), kept });
    }
  }

  /** A partition value: the same text rules as the other columns; Hs in the height unit, directions as the convention says. */
  private readPartition(raw: string, c: ValueColumn): void {
    const x = this.numberOf(raw, c);
    if (x === null) return;
    const value = this.partGoingTo[c.variable] && x >= 0 && x <= 360 ? (x + 180) % 360 : x * c.factor;
    this.v.setPartitionValue(c.variable, value, c.name, raw);
  }

  /** The number in a field, or null when it is missing (a code or an allowed blank) or not a number (the row's issue then added). */
  private numberOf(raw: string, c: ValueColumn): number | null {
    const s = raw.trim();
    if (s === '') {
      if (!this.missing.emptyIsMissing) this.v.rowIssue(c.name, raw, 'empty value (not in the missing-value codes)');
      return null;
    }
    const x = parseDecimal(s, this.decimalComma);
    if (Number.isNaN(x)) {
      if (!this.missing.isMissingText(s)) this.v.rowIssue(c.name, raw, 'not a number');
      return null;
    }
    return this.missing.isMissingNumber(x) ? null : x;
  }

  private readValue(raw: string, c: ValueColumn): void {
    const x = this.numberOf(raw, c);
    if (x === null) return;
    if (c.variable === WIND_INDEX && x === WIND_MISSING_VALUE) return;
    if (this.goingTo && (c.variable === DIR_INDEX || c.variable === WIND_DIR_INDEX) && x >= 0 && x <= 360) {
      // Going-to to coming-from; out-of-range values pass unchanged so the range check names them.
      this.v.setValue(c.variable, (x + 180) % 360, c.name, raw);
      return;
    }
    this.v.setValue(c.variable, x * c.factor, c.name, raw);
  }
}

function isBlankRow(fields: readonly string[]): boolean {
  for (let i = 0; i < fields.length; i++) if (fields[i].trim() !== '') return false;
  return true;
}
