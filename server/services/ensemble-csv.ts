import Papa from 'papaparse';
import {
  CsvTextParser,
  ImportError,
  IssueList,
  detectDelimiter,
  firstContentLine,
  normaliseHeader,
  type CsvTextParserOptions,
  type ImportResult,
} from '../../shared/seadata';
import type { MemberColumns } from './ensemble-store';

/**
 * CSV files of ensemble forecasts (docs/domain.md#forecast-uncertainty): one more column, `member`
 * (or `ensemble member`), numbers each row's run: 0 is the control, 1..N the members. Each run is
 * read by the ordinary CSV reader on its own rows (the other runs' lines read as blank, so every
 * line number stays the file's own), and every member must have exactly the control's times.
 * All-or-nothing: any problem refuses the file, naming line, column and value.
 */

/** Header names of the member column, normalised (csv-columns.ts). */
const MEMBER_NAMES = new Set(['member', 'ensemblemember', 'memberno', 'membernumber']);
/** Highest member number accepted. */
export const MAX_CSV_MEMBER = 1000;

/** The member column's index and name in the first content line of a CSV text, or null when it has none. */
export function memberColumnOf(head: string): { index: number; name: string; delimiter: string } | null {
  const first = firstContentLine(head);
  if (!first) return null;
  const line = head.slice(first.start, first.end);
  const delimiter = detectDelimiter(line);
  const fields = splitLine(line, delimiter);
  const index = fields.findIndex((f, i) => MEMBER_NAMES.has(normaliseHeader(i === 0 ? f.replace(/^\uFEFF/, '') : f)));
  return index < 0 ? null : { index, name: fields[index].trim(), delimiter };
}

function splitLine(line: string, delimiter: string): string[] {
  return (Papa.parse<string[]>(line, { delimiter }).data[0] ?? []).map((f) => f.trim());
}

export interface EnsembleCsv {
  /** The control (member 0) as the reader gives any CSV file. */
  control: ImportResult;
  members: MemberColumns[];
}

/**
 * Reads an ensemble CSV.
 * @param text the whole file
 * @param options the CSV reader's options from the import form
 * @throws ImportError naming line, column and value of the first problems
 */
export function readEnsembleCsv(
  text: string,
  column: { index: number; name: string; delimiter: string },
  options: CsvTextParserOptions,
): EnsembleCsv {
  const lines = text.split('\n');
  const header = firstContentLine(text);
  const headerLine = header ? text.slice(0, header.start).split('\n').length : 1; // 1-based
  const issues = new IssueList();
  const runOfLine = new Int32Array(lines.length).fill(-1);
  const runs = new Set<number>();
  for (let k = headerLine; k < lines.length; k++) {
    const line = lines[k].replace(/\r$/, '');
    if (line.trim() === '') continue;
    const raw = splitLine(line, column.delimiter)[column.index] ?? '';
    const m = /^\d{1,4}$/.test(raw) ? Number(raw) : NaN;
    if (!(m <= MAX_CSV_MEMBER)) {
      issues.add(k + 1, column.name, raw, `member must be a whole number 0-${MAX_CSV_MEMBER} (0 = the control)`);
      continue;
    }
    runOfLine[k] = m;
    runs.add(m);
  }
  if (issues.total > 0) throw ImportError.fromList(issues);
  if (!runs.has(0))
    throw ImportError.single(headerLine, column.name, '', 'no rows of member 0 (the control): number the control 0 and the members 1..N');

  const readRun = (m: number) => {
    const lineOf = new Map<number, number>();
    const own = lines.map((l, k) => (k < headerLine || runOfLine[k] === m ? l : '')).join('\n');
    const parsed = new CsvTextParser({
      ...options,
      onRow: (r) => {
        if (r.kept) lineOf.set(r.timeMs, r.line);
      },
    });
    parsed.push(own);
    return { result: parsed.end(), lineOf };
  };
  const control = readRun(0);
  const times = control.result.records.timeMs;
  const members: MemberColumns[] = [];
  for (const m of [...runs].filter((r) => r > 0).sort((a, b) => a - b)) {
    const run = readRun(m);
    const r = run.result.records;
    const mismatch = new IssueList();
    for (const [t, line] of run.lineOf)
      if (!control.lineOf.has(t)) mismatch.add(line, column.name, String(m), `member ${m} has a time the control (member 0) lacks`);
    for (const [t, line] of control.lineOf) {
      if (!run.lineOf.has(t))
        mismatch.add(line, column.name, '0', `member ${m} has no row at this time of the control (${new Date(t).toISOString()})`);
    }
    if (mismatch.total > 0) throw ImportError.fromList(mismatch);
    if (r.timeMs.length !== times.length)
      throw ImportError.single(
        headerLine,
        column.name,
        String(m),
        `member ${m} has ${r.timeMs.length} records, the control ${times.length}`,
      );
    members.push({ member: m, hs: r.hs, tp: r.tp, dir: r.dir, wind: r.wind, windDir: r.windDir });
  }
  return { control: control.result, members };
}
