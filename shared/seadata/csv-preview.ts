/**
 * Preview of a CSV upload: the first rows exactly as the import will read them, for the browser's
 * mapping step before anything is sent or saved.
 */
import Papa from 'papaparse';
import { detectColumns, detectUnits, type DetectedColumns } from './csv-columns';
import type { CsvReaderOptions, CsvRowResult } from './csv-reader';
import { CsvTextParser, detectDelimiter, firstContentLine, type CsvDelimiter } from './csv-text-parser';
import { ImportError, type ImportIssue } from './issues';
import { suggestDateOrder, type DateOrder } from './timestamp-parser';
import type { SeaUnits } from './units';

/** Options of {@link previewCsv}: the import options plus how much to show. */
export interface CsvPreviewOptions extends Omit<CsvReaderOptions, 'onRow' | 'onBadRows'> {
  /** Delimiter; default detected from the header line. */
  delimiter?: CsvDelimiter;
  /** Data rows to return; default 20. */
  rows?: number;
  /** Leading characters of the text to read; default 256 KiB (the rest is ignored). */
  maxChars?: number;
}

/** What {@link previewCsv} returns. */
export interface CsvPreview {
  /** Delimiter used. */
  delimiter: CsvDelimiter;
  /** Whether a decimal comma is accepted (default: delimiter ';'). */
  decimalComma: boolean;
  /** Header row as read (BOM removed, trimmed). */
  headers: string[];
  /** Mapping used: the one given, else the one detected (`time` may be missing). */
  mapping: DetectedColumns;
  /** Units used: the ones given, else suggested by the header names, else SI. */
  units: SeaUnits;
  /** Day order used for DD/MM/YYYY-like dates: given, else suggested by the rows, else undefined. */
  dateOrder: DateOrder | undefined;
  /** The first data rows as the import reads them (raw fields, SI values, issues, kept). */
  rows: CsvRowResult[];
  /** Issues about the file as a whole (no time column, mapped column absent, no usable row). */
  fileIssues: ImportIssue[];
  /** True when only a leading part of the text was read. */
  partial: boolean;
}

/**
 * Reads the start of a CSV text as the import would and returns what the mapping step shows.
 * Never throws for bad text: problems are in `rows[i].issues` and `fileIssues`.
 *
 * @param text the file's text, or its leading part (e.g. the first 256 KiB read in the browser).
 * @param options the import options chosen so far; missing ones are detected.
 * @throws RangeError for invalid options (unknown time zone, bad anemometer height).
 */
export function previewCsv(text: string, options: CsvPreviewOptions = {}): CsvPreview {
  const maxChars = options.maxChars ?? 256 * 1024;
  const wanted = options.rows ?? 20;
  let slice = text.length > maxChars ? text.slice(0, maxChars) : text;
  const partial = slice.length < text.length;
  if (partial) {
    // Read whole lines only.
    const lastNl = Math.max(slice.lastIndexOf('\n'), slice.lastIndexOf('\r'));
    if (lastNl > 0) slice = slice.slice(0, lastNl + 1);
  }
  const body = slice.charCodeAt(0) === 0xfeff ? slice.slice(1) : slice;
  const first = firstContentLine(body);
  const firstLine = first === null ? '' : body.slice(first.start, first.end);
  const delimiter = options.delimiter ?? detectDelimiter(firstLine);
  const decimalComma = options.decimalComma ?? delimiter === ';';

  // A quick split to detect what the user has not chosen yet: mapping, units, day order.
  const quick = Papa.parse<string[]>(body, { delimiter, skipEmptyLines: 'greedy' }).data;
  const headers = (quick[0] ?? []).map((h) => h.trim());
  const mapping: DetectedColumns = options.mapping ?? detectColumns(headers);
  const units: SeaUnits = { height: 'm', speed: 'm/s', direction: 'deg', ...detectUnits(mapping), ...options.units };
  let dateOrder = options.dateOrder;
  if (dateOrder === undefined && mapping.time !== undefined) {
    const ti = headers.indexOf(mapping.time);
    const di = mapping.date === undefined ? -1 : headers.indexOf(mapping.date);
    if (ti !== -1) {
      const samples = quick.slice(1).map((r) => (di === -1 ? (r[ti] ?? '') : `${r[di] ?? ''} ${r[ti] ?? ''}`));
      dateOrder = suggestDateOrder(samples);
    }
  }

  const rows: CsvRowResult[] = [];
  const rowLines = new Set<number>();
  const parser = new CsvTextParser({
    ...options,
    mapping: mapping.time === undefined ? undefined : { ...mapping, time: mapping.time },
    units,
    dateOrder,
    delimiter,
    decimalComma,
    onBadRows: 'skip',
    onRow: (r) => {
      rowLines.add(r.line);
      if (rows.length < wanted) rows.push(r);
    },
  });
  let fileIssues: ImportIssue[] = [];
  try {
    parser.push(slice);
    parser.end();
  } catch (e) {
    if (!(e instanceof ImportError)) throw e;
    // Row issues are shown with their rows; keep the ones about the file itself.
    fileIssues = e.issues.filter((i) => !rowLines.has(i.line));
  }
  return {
    delimiter,
    decimalComma,
    headers: parser.hasReader ? [...(parser.reader.headers ?? headers)] : headers,
    mapping,
    units,
    dateOrder,
    rows,
    fileIssues,
    partial,
  };
}
