// Property tests: on arbitrary text the parsers either return valid records or throw an
// ImportError (never anything else), quickly, and what they return obeys the rules.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CsvRecordReader,
  CsvTextParser,
  HS_MAX_M,
  ImportError,
  MAX_COLUMNS,
  MAX_LINE_CHARS,
  NdbcParser,
  PERIOD_MAX_S,
  PERIOD_MIN_S,
  WIND_MAX_MS,
  previewCsv,
  shownText,
  type ImportResult,
  type SeaRecords,
} from '../../shared/seadata';

/** Runs `f`; passes when it returns or throws ImportError. */
function returnsOrImportError(f: () => ImportResult | void): ImportResult | undefined {
  try {
    return f() ?? undefined;
  } catch (e) {
    if (!(e instanceof ImportError)) throw e;
    expect(e.issues.length).toBeGreaterThan(0);
    for (const i of e.issues) expect(Number.isInteger(i.line) && i.line >= 0).toBe(true);
    return undefined;
  }
}

function checkRecords(r: SeaRecords): void {
  const n = r.timeMs.length;
  for (const col of [r.hs, r.tp, r.tz, r.te, r.dir, r.wind, r.windDir]) expect(col).toHaveLength(n);
  for (let i = 0; i < n; i++) {
    expect(Number.isFinite(r.timeMs[i])).toBe(true);
    if (i > 0) expect(r.timeMs[i]).toBeGreaterThan(r.timeMs[i - 1]);
    const ok = (x: number, lo: number, hi: number) => Number.isNaN(x) || (x >= lo && x <= hi);
    expect(ok(r.hs[i], 0, HS_MAX_M)).toBe(true);
    for (const t of [r.tp[i], r.tz[i], r.te[i]]) expect(ok(t, PERIOD_MIN_S, PERIOD_MAX_S)).toBe(true);
    expect(ok(r.dir[i], 0, 359.999999)).toBe(true);
    expect(ok(r.windDir[i], 0, 359.999999)).toBe(true);
    expect(ok(r.wind[i], 0, WIND_MAX_MS)).toBe(true);
  }
}

// Text built from the pieces real files are made of, so that the parsers go deep.
const token = fc.constantFrom(
  'YY',
  '#YY',
  'YYYY',
  'MM',
  'DD',
  'hh',
  'mm',
  'WVHT',
  'DPD',
  'APD',
  'MWD',
  'WSPD',
  'WDIR',
  'WD',
  'time',
  'hs',
  'tp',
  'Hs [m]',
  'date',
  '2016',
  '97',
  '01',
  '12',
  '31',
  '50',
  '99',
  '99.00',
  '999',
  '9999.0',
  '1.5',
  '-1',
  '360',
  '.5',
  '2020-01-01 00:00',
  '2020-01-01T00:00Z',
  '13/02/2020',
  'NaN',
  '',
  '"',
  '""',
  'x',
);
const sep = fc.constantFrom(' ', '  ', ',', ';', '\t', '\n', '\r\n', '\r', '"');
const structured = fc.array(fc.tuple(token, sep), { maxLength: 200 }).map((parts) => parts.map(([t, s]) => t + s).join(''));
const ndbcRow = fc
  .tuple(
    fc.constantFrom('2016', '16', '2016', '1899'),
    fc.constantFrom('01', '02', '12', '13'),
    fc.constantFrom('01', '15', '28', '30', '31', '00'),
    fc.constantFrom('00', '05', '12', '23', '24'),
    fc.constantFrom('00', '10', '50', '60'),
    fc.array(
      fc.oneof(
        { weight: 30, arbitrary: fc.constantFrom('99', '99.00', '999', 'MM', '1.5', '8.0', '270', '360', '0.3', '12') },
        { weight: 1, arbitrary: fc.constantFrom('-3', '400', '30', '1x', '41', '101') },
      ),
      { minLength: 12, maxLength: 14 },
    ),
  )
  .map(([y, mo, d, h, mi, values]) => [y, mo, d, h, mi, ...values].join(' '));
const ndbcLike = fc
  .tuple(
    fc.array(fc.oneof({ weight: 5, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: ndbcRow }), { maxLength: 80 }),
    fc.constantFrom('\n', '\r\n'),
  )
  .map(([rows, nl]) => {
    // Mostly well-formed hourly rows (null), some random ones.
    const lines = rows.map(
      (r, i) =>
        r ??
        `2016 01 ${String(1 + Math.floor(i / 24)).padStart(2, '0')} ${String(i % 24).padStart(2, '0')} 50 270 5.0 6.0 1.50 8.00 6.00 260 1013 10 11 999 99 99`,
    );
    return '#YY  MM DD hh mm WDIR WSPD GST  WVHT   DPD   APD MWD   PRES  ATMP  WTMP  DEWP  VIS  TIDE' + nl + lines.join(nl);
  });
const csvValue = fc.oneof(
  { weight: 20, arbitrary: fc.constantFrom('1.5', '0', '8', '270', '360', '', 'NaN', '-999', '"2,5"', '12.25') },
  { weight: 1, arbitrary: fc.constantFrom('-1', '26', '1e3', '12abc', '""', '1,5', '0x1', 'Infinity') },
);
const csvLike = fc
  .tuple(
    fc.constantFrom(',', ';', '\t'),
    fc.constantFrom('\n', '\r\n'),
    fc.array(
      fc.tuple(
        fc.oneof({ weight: 10, arbitrary: fc.constant(1) }, { weight: 1, arbitrary: fc.integer({ min: -2, max: 2 }) }),
        fc.oneof(
          { weight: 10, arbitrary: fc.array(csvValue, { minLength: 4, maxLength: 4 }) },
          { weight: 1, arbitrary: fc.array(csvValue, { maxLength: 6 }) },
        ),
      ),
      { maxLength: 60 },
    ),
  )
  .map(([d, nl, rows]) => {
    let h = 0;
    const lines = rows.map(([dt, values]) => {
      h += dt;
      const t = new Date(Date.UTC(2023, 9, 29) + h * 3_600_000).toISOString().slice(0, 16).replace('T', ' ');
      return [t, ...values].join(d);
    });
    return ['\uFEFFtime', 'Hs [m]', 'Tp', 'dir', 'wind'].join(d) + nl + lines.join(nl);
  });
const anyText = fc.oneof(fc.string({ maxLength: 400 }), fc.string({ unit: 'binary', maxLength: 400 }), structured, ndbcLike, csvLike);
const modes = fc.constantFrom('refuse' as const, 'skip' as const);

function feed(p: { push(s: string): void }, text: string, cut: number): void {
  const k = Math.min(cut, text.length);
  p.push(text.slice(0, k));
  p.push(text.slice(k));
}

/**
 * Feeds `text` cut at `cut` to a streaming parser and ends it: valid records or an ImportError,
 * within 10 s.
 */
function parsesOrRefuses(p: NdbcParser | CsvTextParser, text: string, cut: number): void {
  const t0 = performance.now();
  const r = returnsOrImportError(() => {
    feed(p, text, cut);
    return p.end();
  });
  if (r !== undefined) checkRecords(r.records);
  expect(performance.now() - t0).toBeLessThan(10_000); // hang detection only (issue 8: never hangs), not a speed target
}

describe('parsers on arbitrary text', () => {
  it('NdbcParser returns valid records or throws ImportError', () => {
    fc.assert(
      fc.property(anyText, modes, fc.nat(500), (text, onBadRows, cut) => {
        parsesOrRefuses(new NdbcParser({ onBadRows }), text, cut);
      }),
      { numRuns: 600 },
    );
  });

  it('CsvTextParser returns valid records or throws ImportError', () => {
    fc.assert(
      fc.property(
        anyText,
        modes,
        fc.nat(500),
        fc.constantFrom(undefined, 'Europe/Oslo', 'America/New_York'),
        (text, onBadRows, cut, timeZone) => {
          parsesOrRefuses(new CsvTextParser({ onBadRows, timeZone }), text, cut);
        },
      ),
      { numRuns: 600 },
    );
  });

  it('CsvRecordReader on arbitrary rows returns valid records or throws ImportError', () => {
    const field = fc.oneof(fc.string({ maxLength: 12 }), token);
    fc.assert(
      fc.property(fc.array(fc.array(field, { maxLength: 6 }), { maxLength: 40 }), modes, (rows, onBadRows) => {
        const r = new CsvRecordReader({ onBadRows });
        const res = returnsOrImportError(() => {
          rows.forEach((row, i) => r.pushRow(row, i + 1));
          return r.end();
        });
        if (res !== undefined) checkRecords(res.records);
      }),
      { numRuns: 600 },
    );
  });

  it('previewCsv never throws on text', () => {
    fc.assert(
      fc.property(anyText, (text) => {
        const p = previewCsv(text);
        expect(Array.isArray(p.rows)).toBe(true);
      }),
      { numRuns: 400 },
    );
  });

  it('a 2 MB line without any newline is refused quickly, not buffered forever', () => {
    const t0 = performance.now();
    const p = new CsvTextParser();
    const chunk = '"' + 'x'.repeat(65_535);
    for (let i = 0; i < 32; i++) p.push(chunk);
    expect(() => p.end()).toThrow(ImportError);
    expect(performance.now() - t0).toBeLessThan(10_000); // hang detection only, not a speed target
  });
});

// Long runs of one piece of text: what makes a backtracking pattern or a growing buffer misbehave.
// Before the limits and the linear scans, 1 MB of spaces held the CSV reader for hours (its
// header search was a regular expression that backtracked quadratically), a 1 MB run of digits
// took minutes in the number pattern, a header of unclosed brackets in the header normaliser,
// and an NDBC line without a line break was buffered to the end of the file.
const NDBC_HEADER = '#YY  MM DD hh mm WDIR WSPD GST  WVHT   DPD   APD MWD   PRES  ATMP  WTMP  DEWP  VIS  TIDE';
const piece = fc.constantFrom(
  ' ',
  '\t',
  '\n',
  '\r\n',
  '\r',
  ',',
  ';',
  '"',
  '""',
  '[',
  '(',
  '{',
  '1',
  '1 ',
  '1,',
  '.',
  'e',
  '-',
  'x',
  '#',
  '\u00a0',
  '\uFEFF',
  '"a",',
  'hs [',
  '2020-01-01 ',
  '\u0000',
  '🌊',
);
const longRun = fc.tuple(piece, fc.integer({ min: 20_000, max: 300_000 })).map(([p, n]) => p.repeat(Math.ceil(n / p.length)));
const placements: ((run: string) => string)[] = [
  (run) => run,
  (run) => `time,${run}\n2020-01-01T00:00Z,1\n`,
  (run) => `time,hs\n2020-01-01T00:00Z,${run}\n2020-01-01T01:00Z,1\n`,
  (run) => `time,hs\n${run}`,
  (run) => `${run}time,hs\n2020-01-01T00:00Z,1\n`,
  (run) => `${NDBC_HEADER}\n${run}`,
  (run) => `${NDBC_HEADER}\n2016 01 01 00 50 ${run}\n`,
  (run) => `#YY MM DD hh ${run}\n`,
];
const longText = fc.tuple(fc.nat(placements.length - 1), longRun).map(([i, run]) => placements[i](run));

/** Feeds the text in 64 KiB pieces, as the server's file stream does. */
function feedInChunks(p: { push(s: string): void }, text: string): void {
  for (let i = 0; i < text.length; i += 65_536) p.push(text.slice(i, i + 65_536));
}

// A generous bound per case, for hang detection only (not a speed target): the inputs are at most
// about 300k characters, read in milliseconds; the quadratic paths took from seconds to hours.
const PER_CASE_MS = 5_000;
const NEVER_HANGS = { numRuns: 40, interruptAfterTimeLimit: 120_000, markInterruptAsFailure: true };

describe('parsers on long runs of one character (never hang)', () => {
  it('CsvTextParser and NdbcParser answer each case within a bounded time', () => {
    fc.assert(
      fc.property(longText, modes, (text, onBadRows) => {
        for (const make of [() => new CsvTextParser({ onBadRows }), () => new NdbcParser({ onBadRows })]) {
          const t0 = performance.now();
          const p = make();
          const r = returnsOrImportError(() => {
            feedInChunks(p, text);
            return p.end();
          });
          if (r !== undefined) checkRecords(r.records);
          expect(performance.now() - t0).toBeLessThan(PER_CASE_MS);
        }
      }),
      NEVER_HANGS,
    );
  });

  it('previewCsv answers each case within a bounded time', () => {
    fc.assert(
      fc.property(longText, (text) => {
        const t0 = performance.now();
        expect(Array.isArray(previewCsv(text).rows)).toBe(true);
        expect(performance.now() - t0).toBeLessThan(PER_CASE_MS);
      }),
      NEVER_HANGS,
    );
  });
});

describe('size limits (shared/seadata/limits.ts)', () => {
  function refusal(p: { push(s: string): void; end(): unknown }, text: string) {
    feedInChunks(p, text);
    try {
      p.end();
    } catch (e) {
      if (e instanceof ImportError) return e;
      throw e;
    }
    throw new Error('expected an ImportError');
  }

  it('refuses a CSV row over the line limit at its line, with the character past the limit', () => {
    const e = refusal(new CsvTextParser(), `time,hs\n2020-01-01T00:00Z,1\n${'1'.repeat(MAX_LINE_CHARS + 10)}\n`);
    expect(e.issues[0]).toMatchObject({ line: 3, column: String(MAX_LINE_CHARS + 1) });
    expect(e.message).toMatch(/line 3, column 1048577: a row longer than 1 MiB/);
  });

  it('names the opening quote of a row that never closes it, at its own line', () => {
    const e = refusal(new CsvTextParser(), `time,hs\n2020-01-01T00:00Z,1\n2020-01-01T01:00Z,"1\n${'2\n'.repeat(MAX_LINE_CHARS / 2 + 10)}`);
    expect(e.issues[0]).toMatchObject({ line: 3, column: '19' });
    expect(e.issues[0].reason).toMatch(/quote opened here is not closed on its line/);
  });

  it('refuses a header of two million delimiters, and a row wider than the column limit', () => {
    const wide = refusal(new CsvTextParser(), ','.repeat(2_000_000));
    expect(wide.issues[0].line).toBe(1);
    expect(wide.issues[0].reason).toMatch(/longer than 1 MiB/);
    const columns = refusal(new CsvTextParser(), `time,hs${','.repeat(MAX_COLUMNS)}\n2020-01-01T00:00Z,1\n`);
    expect(columns.issues[0]).toMatchObject({ line: 1, column: String(MAX_COLUMNS + 1) });
    expect(columns.message).toMatch(/16,386 fields in one row, more than the 16,384 columns/);
    const row = refusal(new CsvTextParser(), `time,hs\n2020-01-01T00:00Z,1${',1'.repeat(MAX_COLUMNS)}\n`);
    expect(row.issues[0]).toMatchObject({ line: 2, column: String(MAX_COLUMNS + 1) });
  });

  it('refuses an NDBC line over the line limit or the column limit', () => {
    const long = refusal(new NdbcParser(), `${NDBC_HEADER}\n${'1 '.repeat(MAX_LINE_CHARS)}`);
    expect(long.issues[0]).toMatchObject({ line: 2, column: String(MAX_LINE_CHARS + 1) });
    const wide = refusal(new NdbcParser(), `${NDBC_HEADER}\n${'1 '.repeat(MAX_COLUMNS + 1)}\n`);
    expect(wide.issues[0]).toMatchObject({ line: 2, column: String(MAX_COLUMNS + 1) });
  });

  it('shows control characters, NUL included, as control pictures and never cuts a surrogate pair', () => {
    expect(shownText('a\u0000b\u0007\u007f\tc')).toBe('a\u2400b\u2407\u2421\tc');
    expect(shownText(`${'x'.repeat(79)}🌊🌊`)).toBe(`${'x'.repeat(79)}…`);
    expect(shownText('lone \ud800 half')).toBe('lone \ufffd half');
  });
});

// Issue 22, item 3: one stray quote used to swallow the rest of a CSV file, so "skip bad rows"
// lost good rows without reporting them. Whatever the lines hold, in skip mode every data line
// is either a kept record or a row reported bad, and "rows read" is the number of data lines.
describe('CSV skip mode accounts for every data line', () => {
  const tail = fc.constantFrom(
    ',1.5',
    ',"1.5"',
    ',"1.5',
    ',1.5"',
    ',"1"5',
    '"',
    ',',
    ',x',
    ',""',
    ',"a""b"',
    ' ,2',
    ',"2" ',
    ';',
    ',-1',
    ',"',
  );
  const goodTime = (k: number) => new Date(Date.UTC(2020, 0, 1) + k * 3_600_000).toISOString().slice(0, 16).replace('T', ' ');
  const line = fc.oneof(
    { weight: 4, arbitrary: fc.array(tail, { minLength: 1, maxLength: 3 }).map((parts) => (k: number) => goodTime(k) + parts.join('')) },
    {
      weight: 1,
      arbitrary: fc
        .array(fc.constantFrom('x', '"', '""', ',', ' ', '1', 'a"b', '"x",'), { minLength: 1, maxLength: 6 })
        .map((parts) => () => `x${parts.join('')}`),
    },
  );
  const eol = fc.constantFrom('\n', '\r\n', '\r');

  it('records kept + rows reported bad = data lines = rows read (any chunking)', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(line, eol), { minLength: 1, maxLength: 80 }), fc.integer({ min: 1, max: 300 }), (spec, chunk) => {
        const lines = spec.map(([make], k) => make(k));
        const text = `time,hs\n${spec.map(([, e], k) => lines[k] + e).join('')}`;
        const p = new CsvTextParser({ onBadRows: 'skip', timeZone: 'UTC' });
        for (let i = 0; i < text.length; i += chunk) p.push(text.slice(i, i + chunk));
        let result: ImportResult;
        try {
          result = p.end();
        } catch (e) {
          // Only "no usable record" may refuse a file in skip mode; every line is still listed.
          expect(e).toBeInstanceOf(ImportError);
          expect((e as ImportError).issues[0].reason).toMatch(/no usable record/);
          return;
        }
        expect(result.report.rowsRead).toBe(lines.length);
        expect(result.records.timeMs.length + result.report.rowsSkipped).toBe(lines.length);
      }),
      { numRuns: 300 },
    );
  });
});
