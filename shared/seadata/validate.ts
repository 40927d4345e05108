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
import type { PartitionColumn } from './csv-columns';
import { IssueList, ImportError, MAX_LISTED_ISSUES, type ImportIssue } from './issues';
import { SEA_VARIABLES, SeaRecordBuilder, type SeaRecords, type SeaVariable } from './records';

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
  /**
   * Sea-state partitions the file gave (docs/domain.md#partitions): the partitions that came in,
   * the records whose given total and partitions differed by more than 5 % (partitions scaled to
   * the total; the first lines listed), and the totals computed as sqrt(sum Hs_i^2). Absent when
   * the file has no partition column.
   */
  partitions?: {
    came: ('windSea' | 'swell1' | 'swell2')[];
    flagged: number;
    flaggedLines: number[];
    totalsFromPartitions: number;
  };
}

/** What a reader returns from `end()`. */
export interface ImportResult {
  records: SeaRecords;
  report: ImportReport;
}

function isoOrText(ms: number): string {
  return Number.isFinite(ms) && Math.abs(ms) < 8.64e15 ? new Date(ms).toISOString() : String(ms);
}

const PARTITION_WORDS = { windSea: 'wind sea', swell1: 'swell 1', swell2: 'swell 2' } as const;

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
  /** Optional partition columns (docs/domain.md#partitions), switched on by {@link SeaRowValidator.withPartitions}. */
  private partCols: PartitionColumn[] = [];
  private partRow = new Float64Array(0);
  private partFlagged = 0;
  private partFlaggedLines: number[] = [];
  private partTotals = 0;

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

  /** Reads these partition columns too (call before the first row). */
  withPartitions(columns: readonly PartitionColumn[]): void {
    this.partCols = columns.slice();
    this.partRow = new Float64Array(columns.length);
    this.builder.withExtra(columns);
  }

  /**
   * Checks and stores one partition value of the current row (index into the columns given to
   * withPartitions): Hs 0-25 m (0 = the partition is absent), Tp 0.5-40 s (0 read as absent),
   * direction 0-360 deg (360 stored as 0).
   */
  setPartitionValue(index: number, value: number, column: string, raw: string): void {
    const name = this.partCols[index];
    const qty = name.slice(name.indexOf('.') + 1);
    const reason =
      qty === 'hs'
        ? implausibleReason('hs', value)
        : qty === 'tp'
          ? value === 0
            ? null
            : implausibleReason('tp', value)
          : implausibleReason('dir', value);
    if (reason !== null) {
      this.rowIssue(column, raw, reason);
      return;
    }
    this.partRow[index] = qty === 'tp' && value === 0 ? NaN : qty === 'dir' && value === 360 ? 0 : value === 0 ? 0 : value;
  }

  /**
   * The partition rules of docs/domain.md#partitions on the current row: without a total, the
   * total is sqrt(sum Hs_i^2); with a total that differs from it by more than 5 %, the partitions
   * are scaled to the total (ratios kept) and the record is flagged. Only when every partition Hs
   * of the row is known (a fill value leaves the row as it is).
   */
  private applyPartitionRules(): void {
    const cols = this.partCols;
    let e = 0;
    for (let k = 0; k < cols.length; k++) {
      if (!cols[k].endsWith('.hs')) continue;
      const h = this.partRow[k];
      if (h !== h) return;
      e += h * h;
    }
    const sum = Math.sqrt(e);
    const total = this.row[0];
    if (total !== total) {
      this.row[0] = sum;
      this.partTotals++;
      return;
    }
    if (Math.abs(sum - total) <= 0.05 * total) return;
    this.partFlagged++;
    if (this.partFlaggedLines.length < 20) this.partFlaggedLines.push(this.line);
    if (sum > 0) {
      const scale = total / sum;
      for (let k = 0; k < cols.length; k++) if (cols[k].endsWith('.hs')) this.partRow[k] *= scale;
    }
  }

  /** Starts a data row at 1-based `line`. */
  beginRow(line: number): void {
    this.line = line;
    this.bad = false;
    this.rowIssueList = null;
    this.row.fill(NaN);
    this.partRow.fill(NaN);
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
    if (this.partCols.length > 0) this.applyPartitionRules();
    const r = this.row;
    if (r[0] === r[0] || r[1] === r[1] || r[2] === r[2] || r[3] === r[3] || r[4] === r[4] || r[5] === r[5] || r[6] === r[6]) {
      this.usable++;
    }
    // In refuse mode nothing is returned once an issue exists: stop collecting to save memory.
    if (this.mode === 'skip' || this.issues.total === 0) {
      this.builder.pushValues(timeMs, r[0], r[1], r[2], r[3], r[4], r[5], r[6]);
      for (let k = 0; k < this.partCols.length; k++) this.builder.setExtra(this.partCols[k], this.partRow[k]);
    }
    return true;
  }

  private partitionReport(): NonNullable<ImportReport['partitions']> {
    const came = (['windSea', 'swell1', 'swell2'] as const).filter((p) => this.partCols.includes(`${p}.hs`));
    this.note(`Partitions in the file: ${came.map((p) => PARTITION_WORDS[p]).join(', ') || 'none with an Hs column'}.`);
    if (this.partTotals > 0) this.note(`${this.partTotals} records without a total Hs: total = sqrt(sum of the partitions' Hs^2).`);
    if (this.partFlagged > 0) {
      this.note(
        `${this.partFlagged} records whose total Hs and partitions differed by more than 5 %: partitions scaled to the total (lines ${this.partFlaggedLines.join(', ')}${this.partFlagged > this.partFlaggedLines.length ? ', ...' : ''}).`,
      );
    }
    return { came, flagged: this.partFlagged, flaggedLines: this.partFlaggedLines.slice(), totalsFromPartitions: this.partTotals };
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
    const partitions = this.partCols.length > 0 ? this.partitionReport() : null;
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
        ...(partitions ? { partitions } : {}),
      },
    };
  }
}
