/** The transfer table read from a CSV file, with each problem placed by line and column. */
import Papa from 'papaparse';
import { TransferTableInput } from './transfer-table';

/** A problem in an uploaded transfer-table CSV, with its place in the file. */
export interface TransferTableCsvIssue {
  /** 1-based line number in the file; 0 for the file as a whole. */
  line: number;
  /** 1-based column number; 0 for the whole line or file. */
  column: number;
  /** The raw cell text ('' when there is none). */
  value: string;
  reason: string;
}

export interface TransferTableCsvResult {
  /** The table, or null when there is any issue. */
  table: TransferTableInput | null;
  issues: TransferTableCsvIssue[];
}

/** Largest transfer-table CSV accepted, characters. */
export const TRANSFER_CSV_MAX_CHARS = 256 * 1024;

const NUMBER_RE = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const BAND_RE = /^(\d+(?:[.,]\d+)?)\s*(?:-|–|—|to)\s*(\d+(?:[.,]\d+)?)\s*(?:s|sec|seconds)?$/i;

/**
 * Reads a transfer table from CSV text.
 *
 * Layout (one table per file):
 * ```
 * sector_from,sector_to,0-4,4-6,6-8,8-12,12-30
 * 345,15,0.55,0.62,0.70,0.78,0.80
 * 15,45,0.50,0.58,0.66,0.74,0.77
 * ...
 * ```
 * - The header row holds `sector_from`, `sector_to` (case-insensitive; a unit suffix such as
 *   `sector_from [deg]` is allowed), then one column per Tp band written `from-to` in seconds
 *   (`4-6`, `4.5-6 s`, `4 to 6`); bands are half-open [from, to).
 * - Each further row is one direction sector: its from and to in degrees "coming from", then the
 *   factor Hs_site/Hs_src for each band. Sector and band rules: {@link TransferTableInput}.
 * - Cells are read by papaparse (RFC 4180 quoting: a quoted cell may hold the delimiter, and `""`
 *   is a quote), one line at a time, so every problem keeps its line number; a quoted cell spanning
 *   lines is not supported, and a quote left open is an error at its line. Delimiter ',', ';' or
 *   tab, detected from the header line outside quotes (most frequent; ties: tab, ';', ','). With
 *   ';' or tab a decimal comma is accepted. Blank lines and lines starting with `#` are skipped;
 *   empty cells at the end of a line (spreadsheet exports) are ignored.
 *
 * Never throws: every problem comes back as an issue with its 1-based line and column
 * (column 0 = the whole line; line 0 = the whole file), and `table` is then null.
 */
export function parseTransferTableCsv(text: string): TransferTableCsvResult {
  const issues: TransferTableCsvIssue[] = [];
  const fail = (line: number, column: number, value: string, reason: string) => {
    if (issues.length < 200) issues.push({ line, column, value, reason });
  };
  if (typeof text !== 'string' || text.length > TRANSFER_CSV_MAX_CHARS) {
    fail(0, 0, '', `The file must be text of at most ${TRANSFER_CSV_MAX_CHARS / 1024} kB`);
    return { table: null, issues };
  }
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const content: { line: number; raw: string }[] = [];
  lines.forEach((raw, i) => {
    const trimmed = raw.trim();
    if (trimmed !== '' && !trimmed.startsWith('#')) content.push({ line: i + 1, raw });
  });
  if (content.length === 0) {
    fail(0, 0, '', 'The file is empty');
    return { table: null, issues };
  }

  const header = content[0];
  const delimiter = detectDelimiter(header.raw);
  const decimalComma = delimiter !== ',';
  /** The line's cells, or null (with the issue reported) when its quotes do not close. */
  const split = (line: number, raw: string): string[] | null => {
    const parsed = Papa.parse<string[]>(raw, { delimiter, quoteChar: '"', escapeChar: '"' });
    const quote = parsed.errors.find((e) => e.type === 'Quotes');
    if (quote) {
      fail(line, 0, '', 'A quoted cell is not closed on this line');
      return null;
    }
    const cells = (parsed.data[0] ?? []).map((c) => c.trim());
    while (cells.length > 0 && cells[cells.length - 1] === '') cells.pop();
    return cells;
  };
  const toNumber = (cell: string): number | null => {
    const s = decimalComma ? cell.replace(',', '.') : cell;
    return NUMBER_RE.test(s) ? Number(s) : null;
  };

  const head = split(header.line, header.raw) ?? [];
  if (!/^sector[\s_-]*from\b/i.test(head[0] ?? '')) fail(header.line, 1, head[0] ?? '', 'The first header must be sector_from');
  if (!/^sector[\s_-]*to\b/i.test(head[1] ?? '')) fail(header.line, 2, head[1] ?? '', 'The second header must be sector_to');
  const bands: [number, number][] = [];
  for (let c = 2; c < head.length; c++) {
    const m = BAND_RE.exec(head[c]);
    if (!m) {
      fail(header.line, c + 1, head[c], 'Expected a Tp band in seconds written from-to, such as 4-6');
      continue;
    }
    bands.push([Number(m[1].replace(',', '.')), Number(m[2].replace(',', '.'))]);
  }
  if (head.length <= 2) fail(header.line, 0, '', 'No Tp band columns after sector_from and sector_to');

  const sectors: [number, number][] = [];
  const factors: number[][] = [];
  const rowLines: number[] = [];
  for (const row of content.slice(1)) {
    const cells = split(row.line, row.raw);
    if (cells === null) continue;
    if (cells.length !== head.length) {
      fail(row.line, 0, '', `Expected ${head.length} cells as in the header, found ${cells.length}`);
      continue;
    }
    const nums = cells.map(toNumber);
    let ok = true;
    nums.forEach((n, c) => {
      if (n === null) {
        ok = false;
        fail(row.line, c + 1, cells[c], c < 2 ? 'Expected a direction in degrees' : 'Expected a factor (a number)');
      }
    });
    if (!ok) continue;
    sectors.push([nums[0]!, nums[1]!]);
    factors.push(nums.slice(2) as number[]);
    rowLines.push(row.line);
  }
  if (content.length === 1) fail(0, 0, '', 'No direction sector rows below the header');
  if (issues.length > 0) return { table: null, issues };

  const table = { directionSectorsDeg: sectors, tpBandsS: bands, factors };
  const parsed = TransferTableInput.safeParse(table);
  if (parsed.success) return { table: parsed.data, issues };
  for (const issue of parsed.error.issues) {
    const [key, a, b] = issue.path as (string | number)[];
    if (key === 'directionSectorsDeg' && typeof a === 'number') {
      const col = typeof b === 'number' ? b + 1 : 1;
      fail(rowLines[a] ?? 0, col, String(sectors[a]?.[col - 1] ?? ''), issue.message);
    } else if (key === 'tpBandsS' && typeof a === 'number') {
      fail(header.line, a + 3, head[a + 2] ?? '', issue.message);
    } else if (key === 'factors' && typeof a === 'number') {
      const col = typeof b === 'number' ? b + 3 : 0;
      fail(rowLines[a] ?? 0, col, typeof b === 'number' ? String(factors[a]?.[b] ?? '') : '', issue.message);
    } else {
      fail(0, 0, '', issue.message);
    }
  }
  issues.sort((a, b) => a.line - b.line || a.column - b.column);
  return { table: null, issues };
}

/** The delimiter of the header line: the most frequent of tab, ';' and ',' outside quotes. */
function detectDelimiter(line: string): ',' | ';' | '\t' {
  const unquoted = line.replace(/"(?:[^"]|"")*"/g, '');
  const count = (c: string) => unquoted.split(c).length - 1;
  const tab = count('\t');
  const semicolon = count(';');
  const comma = count(',');
  if (tab > 0 && tab >= semicolon && tab >= comma) return '\t';
  if (semicolon > 0 && semicolon >= comma) return ';';
  return ',';
}
