/**
 * CSV text, fed in chunks, to sea-state records: splits rows with papaparse's core parser and
 * hands them, with their line numbers, to {@link CsvRecordReader}.
 *
 * Dialect handled here:
 * - UTF-8 text with or without a byte-order mark (removed);
 * - LF, CRLF or CR line endings, also mixed (all read as LF, including inside quoted fields);
 * - delimiter: ',', ';' or tab, detected from the header line as the one that occurs most often
 *   outside quotes (ties: tab, then ';', then ','), unless given;
 * - quoted fields with "" for a quote, also spanning lines (the line number of a row is the line
 *   where it starts);
 * - decimal comma: on by default when the delimiter is ';' (the European spreadsheet convention,
 *   where ',' cannot be the decimal point's neighbour delimiter), off otherwise; a '.' is
 *   accepted in both cases.
 * Limits (limits.ts): a row longer than MAX_LINE_CHARS (1 MiB; usually an unterminated quote)
 * or with more than MAX_COLUMNS fields stops the import with an ImportError naming the line and
 * the column (the opening quote, or the character or field past the limit).
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
    const res = (this.parser as Papa.Parser).parse(this.pending, 0, !final) as PapaResult;
    const rowProblems = new Map<number, string>();
    for (const e of res.errors) if (typeof e.row === 'number' && !rowProblems.has(e.row)) rowProblems.set(e.row, e.message);
    const reader = this.reader;
    const rows = res.data;
    for (let r = 0; r < rows.length && !reader.failed; r++) {
      const fields = rows[r];
      let lines = 1;
      let chars = fields.length - 1; // the delimiters
      for (let i = 0; i < fields.length; i++) {
        const f = fields[i];
        chars += f.length;
        if (f.length > 0 && f.indexOf('\n') !== -1) for (let k = 0; k < f.length; k++) if (f.charCodeAt(k) === 10) lines++;
      }
      if (chars > MAX_CSV_ROW_CHARS) {
        // A whole row over the limit that arrived within one piece of text.
        this.fatal = ImportError.single(this.line, String(MAX_CSV_ROW_CHARS + 1), fields.slice(0, 8).join(this.delim ?? ','), this.tooLongReason());
        this.pending = '';
        return;
      }
      const problem = rowProblems.get(r);
      reader.pushRow(fields, this.line, problem === undefined ? undefined : `malformed CSV: ${problem}`);
      this.line += lines;
    }
    this.pending = final ? '' : this.pending.slice(res.meta.cursor);
    if (this.pending.length > MAX_CSV_ROW_CHARS) this.tooLong();
  }

  /**
   * Refuses the row held in `pending` (it starts at line `this.line`) for running past the limit:
   * at its last opening quote when a quote is left open (the usual cause), else at the first
   * character past the limit.
   */
  private tooLong(): void {
    const s = this.pending;
    let open = -1;
    for (let i = s.indexOf('"'); i !== -1; i = s.indexOf('"', i + 1)) open = open === -1 ? i : -1;
    const at = open !== -1 ? open : Math.min(MAX_CSV_ROW_CHARS, s.length - 1);
    const lineStart = s.lastIndexOf('\n', at - 1) + 1;
    this.fatal = ImportError.single(
      this.line + countLineFeeds(s, 0, lineStart),
      String(at - lineStart + 1),
      s.slice(0, 80),
      open !== -1
        ? `a quote opened here is never closed: the row runs on for more than ${ROW_LIMIT_WORDS}`
        : this.tooLongReason(),
    );
    this.pending = '';
  }

  private tooLongReason(): string {
    return `a row longer than ${ROW_LIMIT_WORDS} without a line break`;
  }
}

const ROW_LIMIT_WORDS = `1 MiB (${groupDigits(MAX_CSV_ROW_CHARS)} characters)`;

function countLineFeeds(s: string, from: number, to: number): number {
  let n = 0;
  for (let i = s.indexOf('\n', from); i !== -1 && i < to; i = s.indexOf('\n', i + 1)) n++;
  return n;
}
