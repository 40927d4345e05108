// Property tests: on arbitrary text the parsers either return valid records or throw an
// ImportError (never anything else), quickly, and what they return obeys the rules.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CsvRecordReader,
  CsvTextParser,
  HS_MAX_M,
  ImportError,
  NdbcParser,
  PERIOD_MAX_S,
  PERIOD_MIN_S,
  WIND_MAX_MS,
  previewCsv,
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
  'YY', '#YY', 'YYYY', 'MM', 'DD', 'hh', 'mm', 'WVHT', 'DPD', 'APD', 'MWD', 'WSPD', 'WDIR', 'WD', 'time', 'hs', 'tp',
  'Hs [m]', 'date', '2016', '97', '01', '12', '31', '50', '99', '99.00', '999', '9999.0', '1.5', '-1', '360', '.5',
  '2020-01-01 00:00', '2020-01-01T00:00Z', '13/02/2020', 'NaN', '', '"', '""', 'x',
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
  .tuple(fc.array(fc.oneof({ weight: 5, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: ndbcRow }), { maxLength: 80 }), fc.constantFrom('\n', '\r\n'))
  .map(([rows, nl]) => {
    // Mostly well-formed hourly rows (null), some random ones.
    const lines = rows.map((r, i) =>
      r ?? `2016 01 ${String(1 + Math.floor(i / 24)).padStart(2, '0')} ${String(i % 24).padStart(2, '0')} 50 270 5.0 6.0 1.50 8.00 6.00 260 1013 10 11 999 99 99`,
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
        fc.oneof({ weight: 10, arbitrary: fc.array(csvValue, { minLength: 4, maxLength: 4 }) }, { weight: 1, arbitrary: fc.array(csvValue, { maxLength: 6 }) }),
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

describe('parsers on arbitrary text', () => {
  it('NdbcParser returns valid records or throws ImportError', () => {
    fc.assert(
      fc.property(anyText, modes, fc.nat(500), (text, onBadRows, cut) => {
        const t0 = performance.now();
        const p = new NdbcParser({ onBadRows });
        const r = returnsOrImportError(() => {
          feed(p, text, cut);
          return p.end();
        });
        if (r !== undefined) checkRecords(r.records);
        expect(performance.now() - t0).toBeLessThan(10_000); // hang detection only (issue 8: never hangs), not a speed target
      }),
      { numRuns: 600 },
    );
  });

  it('CsvTextParser returns valid records or throws ImportError', () => {
    fc.assert(
      fc.property(anyText, modes, fc.nat(500), fc.constantFrom(undefined, 'Europe/Oslo', 'America/New_York'), (text, onBadRows, cut, timeZone) => {
        const t0 = performance.now();
        const p = new CsvTextParser({ onBadRows, timeZone });
        const r = returnsOrImportError(() => {
          feed(p, text, cut);
          return p.end();
        });
        if (r !== undefined) checkRecords(r.records);
        expect(performance.now() - t0).toBeLessThan(10_000); // hang detection only (issue 8: never hangs), not a speed target
      }),
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
