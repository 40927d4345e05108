/**
 * CSV text, fed in chunks, to sea-state records: splits rows with papaparse's core parser and
 * hands them, with their line numbers, to {@link CsvRecordReader}.
 *
 * Dialect handled here:
 * - UTF-8 text with or without a byte-order mark (removed);
 * - LF, CRLF or CR line endings, also mixed (all read as LF, including inside quoted fields);
 * - delimiter: ',', ';' or tab, detected from the header line as the one that occurs most often
 *   outside quotes (ties: tab, then ';', then ','), unless given;
 * - quoted fields with "" for a quote, on one line: every line is one row. A quote that does not
 *   close on its line (or text after a closing quote) makes that line a bad row at its own line
 *   number, and reading goes on at the next line, so one stray quote never swallows the rest of
 *   the file; data lines = rows read = records kept + rows reported bad (issue 22);
 * - decimal comma: on by default when the delimiter is ';' (the European spreadsheet convention,
 *   where ',' cannot be the decimal point's neighbour delimiter), off otherwise; a '.' is
 *   accepted in both cases.
 * Limits (limits.ts): a line longer than MAX_LINE_CHARS (1 MiB) or with more than MAX_COLUMNS
 * fields stops the import with an ImportError naming the line and the column (the character or
 * field past the limit).
 *
 * The server may instead feed {@link CsvRecordReader} with rows from papaparse's own streaming
 * API; this class exists so that line numbers are exact and the same code runs in the browser
 * (preview) and in the server.
 */
import Papa from 'papaparse';
import { CsvRecordReader, type CsvReaderOptions } from './csv-reader';
import { ImportError } from './issues';
import { groupDigits, MAX_LINE_CHARS } from './limits';
import type { ImportResult } from './validate';

/** Delimiters recognised. */
export const CSV_DELIMITERS = [',', ';', '\t'] as const;
export type CsvDelimiter = (typeof CSV_DELIMITERS)[number];

/** Longest row accepted, characters: the readers' line limit (limits.ts). */
export const MAX_CSV_ROW_CHARS = MAX_LINE_CHARS;

/**
 * The first line of `text` (from `from` on) holding anything but white space: where it starts
 * and ends (at its '\n' or '\r', or at the end of the text; `complete` tells which), or null when
 * every line is blank. A linear scan: the regular expression used before (`[^\n]*\S[^\n]*`)
 * backtracked quadratically on a long run of blanks, and 1 MB of spaces held the server for hours.
 */
export function firstContentLine(text: string, from = 0): { start: number; end: number; complete: boolean } | null {
  const nonBlank = /\S/g;
  nonBlank.lastIndex = from;
  const m = nonBlank.exec(text);
  if (m === null) return null;
  let start = m.index;
  while (start > from && !isLineEnd(text.charCodeAt(start - 1))) start--;
  let end = m.index;
  while (end < text.length && !isLineEnd(text.charCodeAt(end))) end++;
  return { start, end, complete: end < text.length };
}

function isLineEnd(c: number): boolean {
  return c === 10 || c === 13;
}

/**
 * Detects the delimiter from a header line: the one of tab, ';', ',' that occurs most often
 * outside double quotes (ties in that order; ',' when none occurs).
 * @example detectDelimiter('time;hs [m];tp [s]') // ';'
 */
export function detectDelimiter(headerLine: string): CsvDelimiter {
  let comma = 0;
  let semicolon = 0;
  let tab = 0;
  let quoted = false;
  for (let i = 0; i < headerLine.length; i++) {
    const c = headerLine[i];
    if (c === '"') quoted = !quoted;
    else if (!quoted) {
      if (c === ',') comma++;
      else if (c === ';') semicolon++;
      else if (c === '\t') tab++;
    }
  }
  if (tab > 0 && tab >= semicolon && tab >= comma) return '\t';
  if (semicolon > 0 && semicolon >= comma) return ';';
  return ',';
}

/** Options of {@link CsvTextParser}: the reader's options plus the delimiter. */
export interface CsvTextParserOptions extends CsvReaderOptions {
  /** Delimiter; default: detected from the header line. */
  delimiter?: CsvDelimiter;
}

interface PapaResult {
  data: string[][];
  errors: { row?: number; message: string }[];
  meta: { cursor: number };
}

/**
 * Streaming CSV reader: `push` text chunks in order (any sizes, any split points), then `end()`.
 *
 * @example
 * const p = new CsvTextParser({ timeZone: 'UTC' });
 * p.push('time,hs\n2020-01-01T00:00Z,1.5\n');
 * p.end().records.hs[0]; // 1.5
 */
export class CsvTextParser {
  private readonly options: CsvTextParserOptions;
  private readerInstance: CsvRecordReader | null = null;
  private parser: Papa.Parser | null = null;
  private delim: CsvDelimiter | null;
  private pending = '';
  private carryCr = false;
  private started = false;
  private line = 1;
  private fatal: ImportError | null = null;
  private ended = false;

  /** @throws RangeError for invalid options (time zone, anemometer height). */
  constructor(options: CsvTextParserOptions = {}) {
    this.options = options;
    this.delim = options.delimiter ?? null;
    if (this.delim !== null) this.start(this.delim);
    // Validate the options now rather than at the first row.
    else new CsvRecordReader({ ...options, onRow: undefined });
  }

  /** The delimiter in use (null until the header line is complete). */
  get delimiter(): CsvDelimiter | null {
    return this.delim;
  }

  /** The row reader (headers, mapping), once the delimiter is known. */
  get reader(): CsvRecordReader {
    if (this.readerInstance === null) throw new Error('CsvTextParser: the header line has not been read yet');
    return this.readerInstance;
  }

  /** True once the header line has been read. */
  get hasReader(): boolean {
    return this.readerInstance !== null;
  }

  /** Lines read so far (for progress reports). */
  get linesRead(): number {
    return this.line - 1;
  }

  /**
   * True once the file is known to be refused as a whole (a row over the limits, no time column,
   * a mapped column absent): `end()` will throw, and further text is not read.
   */
  get failed(): boolean {
    return this.fatal !== null || (this.readerInstance?.failed ?? false);
  }

  /** Feeds the next piece of text. */
  push(chunk: string): void {
    if (this.ended) throw new Error('CsvTextParser: push after end');
    if (this.failed || chunk.length === 0) return;
    let text = this.carryCr ? `\r${chunk}` : chunk;
    this.carryCr = text.charCodeAt(text.length - 1) === 13;
    if (this.carryCr) text = text.slice(0, -1);
    if (text.indexOf('\r') !== -1) text = text.replace(/\r\n?/g, '\n');
    if (!this.started && text.length > 0) {
      this.started = true;
      if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
    }
    this.pending += text;
    this.parse(false);
  }

  /**
   * Ends the file.
   * @throws ImportError as {@link CsvRecordReader.end}, or for a row over the limits (limits.ts).
   */
  end(): ImportResult {
    if (this.ended) throw new Error('CsvTextParser: end called twice');
    if (this.carryCr) {
      this.carryCr = false;
      this.pending += '\n';
    }
    if (!this.failed) this.parse(true);
    this.ended = true;
    if (this.fatal !== null) throw this.fatal;
    if (this.readerInstance === null) throw ImportError.single(0, '', '', 'empty file: no header row');
    return this.readerInstance.end();
  }

  private start(delimiter: CsvDelimiter): void {
    this.delim = delimiter;
    const decimalComma = this.options.decimalComma ?? delimiter === ';';
    this.readerInstance = new CsvRecordReader({ ...this.options, decimalComma });
    this.parser = new Papa.Parser({ delimiter, newline: '\n', quoteChar: '"' });
  }

  private parse(final: boolean): void {
    if (this.parser === null) {
      // Wait for the first non-blank line to choose the delimiter. Blank lines before it are
      // dropped (and counted), so that only the header line itself is held.
      const first = firstContentLine(this.pending);
      if (first === null || (!first.complete && !final)) {
        const keep = first === null ? this.pending.lastIndexOf('\n') + 1 : first.start;
        if (keep > 0) {
          this.line += countLineFeeds(this.pending, 0, keep);
          this.pending = this.pending.slice(keep);
        }
        if (this.pending.length > MAX_CSV_ROW_CHARS) this.tooLong();
        return;
      }
      this.start(this.options.delimiter ?? detectDelimiter(this.pending.slice(first.start, first.end)));
    }
    // Whole lines only (everything at the end): a row never runs past its line.
    const cut = final ? this.pending.length : this.pending.lastIndexOf('\n') + 1;
    if (cut > 0) {
      const text = this.pending.slice(0, cut);
      this.pending = this.pending.slice(cut);
      this.readLines(text);
      if (this.failed) {
        this.pending = '';
        return;
      }
    }
    if (this.pending.length > MAX_CSV_ROW_CHARS) this.tooLong();
  }

  /**
   * Reads whole lines: a line whose quotes do not close on it ({@link quoteProblem}) is a bad row
   * at its own line number and the next line is read on its own; runs of good lines go to the
   * splitter, one row per line.
   */
  private readLines(text: string): void {
    const reader = this.reader;
    const delim = this.delim as CsvDelimiter;
    let runStart = 0;
    let runLine = this.line;
    let line = this.line;
    let nextQuote = text.indexOf('"');
    let pos = 0;
    while (pos < text.length && !this.failed) {
      let end = text.indexOf('\n', pos);
      if (end === -1) end = text.length;
      if (nextQuote !== -1 && nextQuote < end) {
        const problem = quoteProblem(text.slice(pos, end), delim);
        if (problem !== null) {
          if (pos > runStart) this.splitRun(text.slice(runStart, pos - 1), runLine);
          if (!this.failed) reader.pushBadLine(line, text.slice(pos, end), problem.column, problem.reason);
          runStart = end + 1;
          runLine = line + 1;
        }
        nextQuote = text.indexOf('"', end);
      }
      pos = end + 1;
      line++;
    }
    if (!this.failed && runStart < text.length) {
      const runEnd = text.charCodeAt(text.length - 1) === 10 ? text.length - 1 : text.length;
      if (runEnd > runStart) this.splitRun(text.slice(runStart, runEnd), runLine);
    }
    this.line = line;
  }

  /** Splits lines that all close their quotes (one row per line) and hands the rows on. */
  private splitRun(text: string, firstLine: number): void {
    const res = (this.parser as Papa.Parser).parse(text, 0, false) as PapaResult;
    const rowProblems = new Map<number, string>();
    for (const e of res.errors) if (typeof e.row === 'number' && !rowProblems.has(e.row)) rowProblems.set(e.row, e.message);
    const reader = this.reader;
    const rows = res.data;
    for (let r = 0; r < rows.length && !reader.failed; r++) {
      const fields = rows[r];
      let chars = fields.length - 1; // the delimiters
      for (let i = 0; i < fields.length; i++) chars += fields[i].length;
      if (chars > MAX_CSV_ROW_CHARS) {
        // A whole row over the limit that arrived within one piece of text.
        this.fatal = ImportError.single(
          firstLine + r,
          String(MAX_CSV_ROW_CHARS + 1),
          fields.slice(0, 8).join(this.delim ?? ','),
          this.tooLongReason(),
        );
        return;
      }
      const problem = rowProblems.get(r);
      reader.pushRow(fields, firstLine + r, problem === undefined ? undefined : `malformed CSV: ${problem}`);
    }
  }

  /** Refuses the line held in `pending` (line `this.line`) for running past the limit. */
  private tooLong(): void {
    const s = this.pending;
    this.fatal = ImportError.single(this.line, String(MAX_CSV_ROW_CHARS + 1), s.slice(0, 80), this.tooLongReason());
    this.pending = '';
  }

  private tooLongReason(): string {
    return `a row longer than ${ROW_LIMIT_WORDS} without a line break`;
  }
}

const ROW_LIMIT_WORDS = `1 MiB (${groupDigits(MAX_CSV_ROW_CHARS)} characters)`;

/**
 * Where a line leaves a quote open, or has text after a closing quote, for delimiter `delim`:
 * the 1-based column and the reason, or null when every quoted field closes on the line. A quote
 * opens a field only at the field's start (elsewhere it is plain text); "" inside a quoted field
 * is one quote; spaces may follow a closing quote before the delimiter.
 * @example quoteProblem('2020-01-01 00:00,"1.5', ',') // { column: 18, reason: 'a quote opened here is not closed on its line' }
 */
export function quoteProblem(line: string, delim: string): { column: number; reason: string } | null {
  const n = line.length;
  let i = 0;
  for (;;) {
    if (line.charCodeAt(i) === 34) {
      const open = i;
      i++;
      for (;;) {
        const q = line.indexOf('"', i);
        if (q === -1) return { column: open + 1, reason: 'a quote opened here is not closed on its line' };
        if (line.charCodeAt(q + 1) === 34) {
          i = q + 2;
          continue;
        }
        i = q + 1;
        break;
      }
      while (i < n && line[i] !== delim && (line[i] === ' ' || line[i] === '\t')) i++;
      if (i >= n) return null;
      if (line[i] !== delim) return { column: i + 1, reason: 'text after the closing quote of a field' };
      i++;
    } else {
      const next = line.indexOf(delim, i);
      if (next === -1) return null;
      i = next + 1;
    }
  }
}

function countLineFeeds(s: string, from: number, to: number): number {
  let n = 0;
  for (let i = s.indexOf('\n', from); i !== -1 && i < to; i = s.indexOf('\n', i + 1)) n++;
  return n;
}
