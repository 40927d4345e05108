/**
 * Plausibility rules for imported sea states (issue 4) and the row validator shared by the CSV
 * and NDBC readers.
 *
 * Rules (all bounds inclusive, as docs/domain.md#convention-6 treats limits):
 * - time: must parse (the reader reports the reason); times must strictly increase in file order
 *   (a repeat is "duplicated", an earlier one "out of order"). With `order: 'auto'` (NDBC) the
 *   first two accepted rows fix the direction, so newest-first realtime files are accepted and
 *   reversed; CSV files use `order: 'ascending'`.
 * - hs: 0 ≤ Hs ≤ {@link HS_MAX_M} m. 0 is accepted (flat calm, sheltered sites).
 * - tp, tz, te: {@link PERIOD_MIN_S} ≤ T ≤ {@link PERIOD_MAX_S} s.
 * - dir, windDir: 0 ≤ θ ≤ 360 degrees; 360 is accepted and stored as 0 (both mean north; storage
 *   is [0, 360) per docs/domain.md#units).
 * - wind: 0 ≤ U ≤ {@link WIND_MAX_MS} m/s (checked after unit conversion and height correction).
 * - a file with no usable record (no row with a valid time and at least one value) is refused in
 *   both modes.
 *
 * Order is checked against the last *accepted* row: after one row with a wrong time, later
 * correct rows are still accepted. A row with a typo far in the future, however, makes the rows
 * after it "out of order"; the report then shows where it starts.
 *
 * Modes: `refuse` (default of the API): any issue throws {@link ImportError} from `finish()` and
 * nothing is returned. `skip`: a row with any issue is dropped whole (not just the bad value, so a
 * stored record never mixes read and discarded values) and listed in the report.
 */
import { IssueList, ImportError, MAX_LISTED_ISSUES, type ImportIssue } from './issues';
import { SEA_VARIABLES, SeaRecordBuilder, type SeaRecords, type SeaVariable } from './records';
import type { ExtraColumn } from './extra-columns';

/** Largest accepted significant wave height, m (issue 4). */
export const HS_MAX_M = 25;
/** Shortest accepted wave period, s (issue 4). */
export const PERIOD_MIN_S = 0.5;
/** Longest accepted wave period, s (issue 4). */
export const PERIOD_MAX_S = 40;
/** Largest accepted wind speed at 10 m, m/s (above any recorded 10-min mean; common practice, no source). */
export const WIND_MAX_MS = 100;

/** What to do with rows that break a rule. */
export const BAD_ROW_MODES = ['refuse', 'skip'] as const;
export type BadRowMode = (typeof BAD_ROW_MODES)[number];

/** Required direction of time in the file. */
export type TimeOrder = 'ascending' | 'auto';

/**
 * Why a value of `variable` is implausible, or null when it is acceptable. NaN (missing) is
 * acceptable. Units: SI as in `SeaRecords`.
 */
export function implausibleReason(variable: SeaVariable, value: number): string | null {
  if (Number.isNaN(value)) return null;
  if (!Number.isFinite(value)) return 'not a finite number';
  switch (variable) {
    case 'hs':
      if (value < 0) return 'negative significant wave height';
      if (value > HS_MAX_M) return `significant wave height above ${HS_MAX_M} m`;
      return null;
    case 'tp':
    case 'tz':
    case 'te':
      if (value < PERIOD_MIN_S || value > PERIOD_MAX_S) return `period outside ${PERIOD_MIN_S}-${PERIOD_MAX_S} s`;
      return null;
    case 'dir':
    case 'windDir':
      if (value < 0 || value > 360) return 'direction outside 0-360 degrees';
      return null;
    case 'wind':
      if (value < 0) return 'negative wind speed';
      if (value > WIND_MAX_MS) return `wind speed above ${WIND_MAX_MS} m/s`;
      return null;
  }
}

/** The summary of an import, stored as the dataset's import report. */
export interface ImportReport {
  format: 'csv' | 'ndbc';
  mode: BadRowMode;
  /** Data rows read (header, units, comment and blank lines excluded). */
  rowsRead: number;
  /** Records kept. */
  records: number;
  /** Rows dropped for an issue (`skip` mode). */
  rowsSkipped: number;
  /** True when the file was newest-first and the records were reversed. */
  newestFirst: boolean;
  /** The first issues (at most MAX_LISTED_ISSUES), in file order. */
  issues: ImportIssue[];
  /** Total number of issues. */
  issueCount: number;
  /** Decisions applied to the whole file (units, corrections, dropped columns). */
  notes: string[];
}

/** What a reader returns from `end()`. */
export interface ImportResult {
  records: SeaRecords;
  report: ImportReport;
}

function isoOrText(ms: number): string {
  return Number.isFinite(ms) && Math.abs(ms) < 8.64e15 ? new Date(ms).toISOString() : String(ms);
}

/**
 * Row-by-row validator and record collector. A reader calls, per data row:
 * `beginRow(line)`, then `setValue(...)` for each mapped value (or `rowIssue(...)` for a parse
 * error), then `commitRow(timeMs, ...)`. At the end, `finish()` returns the records or throws.
 */
export class SeaRowValidator {
  private readonly issues = new IssueList();
  private readonly builder = new SeaRecordBuilder(4096);
  private readonly row = new Float64Array(SEA_VARIABLES.length);
  private line = 0;
  private bad = false;
  private rowIssueList: ImportIssue[] | null = null;
  private rowsRead = 0;
  private skipped = 0;
  private usable = 0;
  private lastMs = NaN;
  private lastLine = 0;
  private direction: 0 | 1 | -1 = 0; // 0 unknown, 1 ascending, -1 descending
  private readonly notes: string[] = [];
  private extraNames: ExtraColumn[] = [];
  private extraRow = new Float64Array(0);
  private extraCheck: (column: ExtraColumn, value: number) => string | null = () => null;

  constructor(
    private readonly format: 'csv' | 'ndbc',
    private readonly mode: BadRowMode,
    order: TimeOrder,
  ) {
    if (order === 'ascending') this.direction = 1;
  }

  /** Time of the last accepted row, UTC ms (NaN before the first). */
  get lastAcceptedMs(): number {
    return this.lastMs;
  }

  /** Issues of the row being read (empty when it is clean). */
  get currentRowIssues(): readonly ImportIssue[] {
    return this.rowIssueList ?? [];
  }

  /** The values of the row being read, in SEA_VARIABLES order (NaN = missing). */
  get currentRowValues(): Float64Array {
    return this.row;
  }

  /** Starts a data row at 1-based `line`. */
  beginRow(line: number): void {
    this.line = line;
    this.bad = false;
    this.rowIssueList = null;
    this.row.fill(NaN);
    this.extraRow.fill(NaN);
    this.rowsRead++;
  }

  /** Records an issue of the current row and marks the row bad. */
  rowIssue(column: string, value: string, reason: string): void {
    this.bad = true;
    this.issues.add(this.line, column, value, reason);
    (this.rowIssueList ??= []).push({ line: this.line, column, value, reason });
  }

  /** Records an issue that concerns the file as a whole (line 0) or a header line. */
  fileIssue(line: number, column: string, value: string, reason: string): void {
    this.issues.add(line, column, value, reason);
  }

  /** Adds a note to the report (decisions applied to the whole file). */
  note(text: string): void {
    if (!this.notes.includes(text)) this.notes.push(text);
  }

  /**
   * Checks and stores one value of the current row.
   * @param index position in SEA_VARIABLES.
   * @param value SI value, NaN when missing.
   * @param column header name, for the report.
   * @param raw the raw text, for the report.
   */
  setValue(index: number, value: number, column: string, raw: string): void {
    const variable = SEA_VARIABLES[index];
    const reason = implausibleReason(variable, value);
    if (reason !== null) {
      this.rowIssue(column, raw, reason);
      return;
    }
    // 360 degrees is north: stored as 0 so directions stay in [0, 360); -0 is stored as 0.
    this.row[index] = value === 0 || ((variable === 'dir' || variable === 'windDir') && value === 360) ? 0 : value;
  }

  /**
   * Switches on optional columns (water level, current: docs/domain.md#tide) before the first row;
   * their values are checked by `checkExtra` and kept with the row's record.
   */
  withExtra(columns: readonly ExtraColumn[], check: (column: ExtraColumn, value: number) => string | null): void {
    this.extraNames = columns.slice();
    this.extraRow = new Float64Array(columns.length);
    this.extraCheck = check;
    this.builder.withExtra(columns);
  }

  /** Checks and stores one optional value of the current row (`index` in the `withExtra` list). */
  setExtraValue(index: number, value: number, column: string, raw: string): void {
    const reason = this.extraCheck(this.extraNames[index], value);
    if (reason !== null) {
      this.rowIssue(column, raw, reason);
      return;
    }
    this.extraRow[index] = value === 0 ? 0 : value;
  }

  /**
   * Ends the current row: checks its time against the last accepted row and keeps it when the
   * row has no issue. A NaN `timeMs` marks an unparseable time whose issue the reader has added.
   * @returns true when the row became a record.
   */
  commitRow(timeMs: number, timeColumn: string, timeRaw: string): boolean {
    if (Number.isNaN(timeMs) && !this.bad) this.rowIssue(timeColumn, timeRaw, 'unparseable time');
    if (!this.bad && !Number.isNaN(this.lastMs)) {
      if (timeMs === this.lastMs) {
        this.rowIssue(timeColumn, timeRaw, `duplicated time: same as line ${this.lastLine}`);
      } else {
        if (this.direction === 0) this.direction = timeMs > this.lastMs ? 1 : -1;
        const ok = this.direction === 1 ? timeMs > this.lastMs : timeMs < this.lastMs;
        if (!ok) {
          const rel = this.direction === 1 ? 'earlier than' : 'later than';
          const how = this.direction === 1 ? 'times must increase' : 'the file is newest-first (from its first two rows)';
          this.rowIssue(timeColumn, timeRaw, `time out of order: ${rel} line ${this.lastLine} (${isoOrText(this.lastMs)}); ${how}`);
        }
      }
    }
    if (this.bad) {
      this.skipped++;
      return false;
    }
    this.lastMs = timeMs;
    this.lastLine = this.line;
    const r = this.row;
    if (r[0] === r[0] || r[1] === r[1] || r[2] === r[2] || r[3] === r[3] || r[4] === r[4] || r[5] === r[5] || r[6] === r[6]) {
      this.usable++;
    }
    // In refuse mode nothing is returned once an issue exists: stop collecting to save memory.
    if (this.mode === 'skip' || this.issues.total === 0) {
      this.builder.pushValues(timeMs, r[0], r[1], r[2], r[3], r[4], r[5], r[6]);
      for (let k = 0; k < this.extraNames.length; k++) this.builder.setExtra(this.extraNames[k], this.extraRow[k]);
    }
    return true;
  }

  /**
   * Ends the import.
   * @throws ImportError in `refuse` mode when any issue was found, and in both modes when no
   *   usable record remains.
   */
  finish(): ImportResult {
    if (this.usable === 0) {
      // The file-level reason goes first, so that it is listed even when the list is full.
      const noRecord: ImportIssue = {
        line: 0,
        column: '',
        value: '',
        reason: 'no usable record: no row has a valid time and at least one sea-state value',
      };
      const listed = [noRecord, ...this.issues.items.slice(0, MAX_LISTED_ISSUES - 1)];
      throw new ImportError(listed, this.issues.total + 1);
    }
    if (this.mode === 'refuse' && this.issues.total > 0) throw ImportError.fromList(this.issues);
    const newestFirst = this.direction === -1;
    if (newestFirst) {
      this.builder.reverse();
      this.note('The file is newest-first; records were reversed to oldest-first.');
    }
    const records = this.builder.finish();
    return {
      records,
      report: {
        format: this.format,
        mode: this.mode,
        rowsRead: this.rowsRead,
        records: records.timeMs.length,
        rowsSkipped: this.skipped,
        newestFirst,
        issues: this.issues.items.slice(),
        issueCount: this.issues.total,
        notes: this.notes.slice(),
      },
    };
  }
}
