// NDBC standard meteorological files: the four real files of the shared test data.
// Source of every count, first/last time and coverage figure: the table and notes of
// tests/fixtures/ndbc/README.md ("NDBC buoy test data"); missing-value counts were counted on the
// raw lines with awk (commands quoted beside each check). Values are checked against the raw
// lines, quoted beside each check.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { feedInChunks } from '../support/chunks';
import { ImportError, NdbcParser, detectFormat, looksLikeNdbc, summarise, type SeaRecords } from '../../shared/seadata';

const NDBC_DIR = path.resolve(import.meta.dirname, '../fixtures/ndbc');
const read = (name: string): string => readFileSync(path.join(NDBC_DIR, name), 'utf8');

function parse(text: string, options: ConstructorParameters<typeof NdbcParser>[0] = {}) {
  const p = new NdbcParser(options);
  p.push(text);
  return p.end();
}

/** Index of the record at `iso` (UTC), asserting there is one. */
function at(records: SeaRecords, iso: string): number {
  const i = records.timeMs.indexOf(Date.parse(iso));
  expect(i, `record at ${iso}`).toBeGreaterThanOrEqual(0);
  return i;
}

function row(records: SeaRecords, iso: string) {
  const i = at(records, iso);
  return {
    hs: records.hs[i],
    tp: records.tp[i],
    tz: records.tz[i],
    te: records.te[i],
    dir: records.dir[i],
    wind: records.wind[i],
    windDir: records.windDir[i],
  };
}

const FILES = {
  '46026h2016.txt': { rows: 8655, first: '2015-12-31T23:50:00Z', last: '2016-12-31T22:50:00Z', step: 60 },
  '44014h2017.txt': { rows: 8654, first: '2016-12-31T23:50:00Z', last: '2017-12-31T22:50:00Z', step: 60 },
  '44013.txt': { rows: 6508, first: '2022-04-21T00:00:00Z', last: '2022-06-05T13:00:00Z', step: 10 },
  '44014h1997.txt': { rows: 6984, first: '1997-01-01T00:00:00Z', last: '1997-10-18T23:00:00Z', step: 60 },
} as const;

describe('NDBC files: counts, coverage and step (README table)', () => {
  for (const [name, expected] of Object.entries(FILES)) {
    it(`${name}: ${expected.rows} records from ${expected.first} to ${expected.last}`, () => {
      // Refuse mode: the real files have no issue at all.
      const { records, report } = parse(read(name));
      const s = summarise(records);
      // README table, column "data rows": every data row is kept as a record.
      expect(s.records).toBe(expected.rows);
      expect(report.rowsRead).toBe(expected.rows);
      expect(report.issueCount).toBe(0);
      // README table, column "period" (UTC).
      expect(s.startMs).toBe(Date.parse(expected.first));
      expect(s.endMs).toBe(Date.parse(expected.last));
      // README: hourly historical files, 10-minute realtime file.
      expect(s.stepMinutes).toBe(expected.step);
      // Times strictly increase after reading (the realtime file is reversed).
      for (let i = 1; i < records.timeMs.length; i++) expect(records.timeMs[i]).toBeGreaterThan(records.timeMs[i - 1]);
      // No period is derived: Te is not in the format and stays missing everywhere.
      expect(s.missing.te).toBe(expected.rows);
      expect(s.variables).toEqual(['hs', 'tp', 'tz', 'dir', 'wind', 'windDir']);
    });
  }
});

describe('46026h2016.txt (2007+ layout, #YY + #yr units line)', () => {
  const { records } = parse(read('46026h2016.txt'));

  it('reads values as written on the raw lines', () => {
    // line 3: "2015 12 31 23 50  28  1.1  1.8  1.15 11.43  7.93 287 1021.7  10.7  12.9 999.0 99.0 99.00"
    expect(row(records, '2015-12-31T23:50:00Z')).toEqual({ hs: 1.15, tp: 11.43, tz: 7.93, te: NaN, dir: 287, wind: 1.1, windDir: 28 });
    // last line: "2016 12 31 22 50  43  3.0  3.7  2.25 13.79  8.48 277 1013.9   9.8  10.8 999.0 99.0 99.00"
    expect(row(records, '2016-12-31T22:50:00Z')).toEqual({ hs: 2.25, tp: 13.79, tz: 8.48, te: NaN, dir: 277, wind: 3.0, windDir: 43 });
  });

  it('turns 99.00 / 999 wave codes into missing values and keeps the wind of that row', () => {
    // line 136: "2016 01 06 14 50 211  9.2 12.4 99.00 99.00 99.00 999 1002.7  11.8  13.1 999.0 99.0 99.00"
    expect(row(records, '2016-01-06T14:50:00Z')).toEqual({ hs: NaN, tp: NaN, tz: NaN, te: NaN, dir: NaN, wind: 9.2, windDir: 211 });
    // README: "WVHT, DPD, APD and MWD 99.9 % (8 rows coded 99.00/999)"; WDIR and WSPD 100 %.
    // awk '{a+=($9>=99)} END{print a}' on the data lines gives 8 for each wave column.
    const s = summarise(records);
    expect([s.missing.hs, s.missing.tp, s.missing.tz, s.missing.dir]).toEqual([8, 8, 8, 8]);
    expect([s.missing.wind, s.missing.windDir]).toEqual([0, 0]);
  });

  it('has the README value ranges', () => {
    // README: "WVHT 0.68–6.12 m", "DPD 3.7–23.5 s", "MWD 41–353°", "WSPD 0–18.1 m/s"
    // (the README rounds DPD to 0.1 s: the raw maximum is 23.53).
    const range = (a: Float64Array) => {
      const v = Array.from(a).filter((x) => !Number.isNaN(x));
      return [Math.min(...v), Math.max(...v)];
    };
    expect(range(records.hs)).toEqual([0.68, 6.12]);
    const [tpMin, tpMax] = range(records.tp);
    expect(tpMin).toBeCloseTo(3.7, 1);
    expect(tpMax).toBeCloseTo(23.5, 1);
    expect(range(records.dir)).toEqual([41, 353]);
    expect(range(records.wind)).toEqual([0, 18.1]);
  });
});

describe('44014h2017.txt (held-out year)', () => {
  const { records } = parse(read('44014h2017.txt'));

  it('reads 99 as a valid direction (README pitfall)', () => {
    // "2017 01 13 17 50 336  6.4  8.1  0.99 11.43  5.29  99 1029.3  13.3  15.3 999.0 99.0 99.00"
    expect(row(records, '2017-01-13T17:50:00Z')).toEqual({ hs: 0.99, tp: 11.43, tz: 5.29, te: NaN, dir: 99, wind: 6.4, windDir: 336 });
    // README: "44014h2017 has 30 MWD values of 99" (awk '$12==99' also counts 30).
    expect(Array.from(records.dir).filter((d) => d === 99)).toHaveLength(30);
  });

  it('turns WSPD 99.0 into a missing value but keeps WDIR', () => {
    // line 424: "2017 01 18 12 50 233 99.0 99.0  1.25  4.76  4.36 173 1011.6  13.5  13.7 999.0 99.0 99.00"
    expect(row(records, '2017-01-18T12:50:00Z')).toEqual({ hs: 1.25, tp: 4.76, tz: 4.36, te: NaN, dir: 173, wind: NaN, windDir: 233 });
    // README: "WSPD and GST 100 % (1 row 99.0)".
    expect(summarise(records).missing.wind).toBe(1);
  });

  it('has the README gap: 27 h from 2017-05-30 04:50 to 2017-05-31 07:50', () => {
    const i = at(records, '2017-05-30T04:50:00Z');
    expect(records.timeMs[i + 1]).toBe(Date.parse('2017-05-31T07:50:00Z'));
  });
});

describe('44013.txt (realtime: 19 columns, MM, newest first)', () => {
  const { records, report } = parse(read('44013.txt'));

  it('reverses the newest-first file and says so', () => {
    expect(report.newestFirst).toBe(true);
    expect(report.notes.join(' ')).toMatch(/newest-first/);
  });

  it('reads rows with and without waves (MM = missing)', () => {
    // line 3 (newest): "2022 06 05 13 00 280  3.0  4.0    MM    MM    MM  MM 1015.2    MM  13.9    MM   MM +1.6    MM"
    expect(row(records, '2022-06-05T13:00:00Z')).toEqual({ hs: NaN, tp: NaN, tz: NaN, te: NaN, dir: NaN, wind: 3, windDir: 280 });
    // line 4: "2022 06 05 12 50 270  3.0  4.0   0.5     7   3.5 100 1015.3    MM  13.8    MM   MM   MM    MM"
    expect(row(records, '2022-06-05T12:50:00Z')).toEqual({ hs: 0.5, tp: 7, tz: 3.5, te: NaN, dir: 100, wind: 3, windDir: 270 });
    // line 5: "2022 06 05 12 40 280  4.0  5.0   0.5    MM   3.5 100 1015.2    MM  13.8    MM   MM   MM    MM"
    expect(row(records, '2022-06-05T12:40:00Z')).toEqual({ hs: 0.5, tp: NaN, tz: 3.5, te: NaN, dir: 100, wind: 4, windDir: 280 });
  });

  it('wraps a 360 degree wind direction to 0', () => {
    // line 2449: "2022 05 19 09 50 360  2.0  5.0   0.3    11   5.5 173 1011.9    MM  11.1    MM   MM   MM    MM"
    expect(row(records, '2022-05-19T09:50:00Z')).toEqual({ hs: 0.3, tp: 11, tz: 5.5, te: NaN, dir: 173, wind: 2, windDir: 0 });
  });

  it('counts MM per column as on the raw lines', () => {
    // awk on the data lines: WVHT MM 4791, DPD MM 5439, APD MM 4805, MWD MM 4813, WSPD MM 15, WDIR MM 100.
    // Consistent with README: WVHT, APD, MWD on 26 % of rows, DPD on 16 %, WSPD 99.8 %, WDIR 98.5 %.
    const s = summarise(records);
    expect(s.missing).toEqual({ hs: 4791, tp: 5439, tz: 4805, te: 6508, dir: 4813, wind: 15, windDir: 100 });
  });
});

describe('44014h1997.txt (pre-1999: YY, no minute, 16 columns, mixed LF/CRLF)', () => {
  const text = read('44014h1997.txt');
  const { records } = parse(text);

  it('really is the old variant with CRLF lines (guards the fixture)', () => {
    expect(text.startsWith('YY MM DD hh WD   WSPD GST  WVHT')).toBe(true);
    expect(text).toContain('\r\n');
  });

  it('reads 2-digit years as 19YY and rows on both sides of the LF/CRLF switch', () => {
    // line 1417 (LF):   "97 02 28 23  79  3.9  4.3  1.19  9.09  5.07 139 1023.5  10.1   8.8 999.0 99.0"
    expect(row(records, '1997-02-28T23:00:00Z')).toEqual({ hs: 1.19, tp: 9.09, tz: 5.07, te: NaN, dir: 139, wind: 3.9, windDir: 79 });
    // line 1418 (CRLF): "97 03 01 00  52  6.3  7.4  1.08  7.14  4.77 146 1024.2  10.0   8.8 999.0 99.0"
    expect(row(records, '1997-03-01T00:00:00Z')).toEqual({ hs: 1.08, tp: 7.14, tz: 4.77, te: NaN, dir: 146, wind: 6.3, windDir: 52 });
    // last line (CRLF): "97 10 18 23  37  9.9 11.6  2.91  7.69  6.17  60 1011.7  19.9  20.7 999.0 99.0"
    expect(row(records, '1997-10-18T23:00:00Z')).toEqual({ hs: 2.91, tp: 7.69, tz: 6.17, te: NaN, dir: 60, wind: 9.9, windDir: 37 });
  });

  it('reads a value written without a leading zero', () => {
    // line 3974: "97 06 15 12  21  6.0  7.3   .86  7.69  6.07 167 1011.3  16.7  16.0 999.0 99.0"
    expect(row(records, '1997-06-15T12:00:00Z').hs).toBe(0.86);
  });

  it('keeps an all-missing row as a no-data record', () => {
    // line 2: "97 01 01 00 999 99.0 99.0 99.00 99.00 99.00 999 9999.0 999.0 999.0 999.0 99.0"
    expect(row(records, '1997-01-01T00:00:00Z')).toEqual({ hs: NaN, tp: NaN, tz: NaN, te: NaN, dir: NaN, wind: NaN, windDir: NaN });
  });

  it('wraps MWD 360 to 0', () => {
    // "97 01 08 12 316 11.1 13.0  2.35  7.14  5.24 360 1021.7   2.7   9.7 999.0 99.0"
    expect(row(records, '1997-01-08T12:00:00Z').dir).toBe(0);
  });

  it('is hourly without gaps (README: "hourly at hh:00 with no gaps")', () => {
    for (let i = 1; i < records.timeMs.length; i++) expect(records.timeMs[i] - records.timeMs[i - 1]).toBe(3_600_000);
  });

  it('counts the missing codes as on the raw lines', () => {
    // awk on the data lines: WVHT/DPD/APD >= 99: 151 each; MWD >= 999: 129; WSPD >= 99: 81; WD >= 999: 81.
    // Consistent with README: WVHT/DPD/APD 97.8 %, MWD 98.2 %, WD/WSPD 98.8 % of 6984.
    const s = summarise(records);
    expect(s.missing).toEqual({ hs: 151, tp: 151, tz: 151, te: 6984, dir: 129, wind: 81, windDir: 81 });
  });
});

describe('chunked input gives the same result as one chunk', () => {
  for (const name of Object.keys(FILES)) {
    it(`${name} in random chunks of 7-4000 characters`, () => {
      const text = read(name);
      const whole = parse(text);
      fc.assert(
        fc.property(fc.array(fc.integer({ min: 7, max: 4000 }), { minLength: 1, maxLength: 50 }), (sizes) => {
          const got = feedInChunks(new NdbcParser(), text, sizes);
          expect(got.records).toEqual(whole.records);
          expect(got.report).toEqual(whole.report);
        }),
        { numRuns: 5 },
      );
    });
  }

  it('a CRLF split between \\r and \\n is still one line ending', () => {
    const text = read('44014h1997.txt');
    const cut = text.indexOf('\r\n') + 1;
    const p = new NdbcParser();
    p.push(text.slice(0, cut));
    p.push(text.slice(cut));
    expect(p.end().records).toEqual(parse(text).records);
  });
});

describe('header variants', () => {
  // Built from the header lines of NDBC's layouts (README "Header history") with one data line
  // each; the values are those of 44014h1997.txt line 3 "97 01 01 01  13 11.4 13.3  1.31 ...".
  const expected = { hs: 1.31, tp: 4, tz: 3.75, te: NaN, dir: 5, wind: 11.4, windDir: 13 };

  it.each([
    {
      layout: '1999-2004: YYYY, no minute, TIDE',
      header: 'YYYY MM DD hh WD  WSPD GST  WVHT  DPD   APD  MWD  BAR    ATMP  WTMP  DEWP  VIS  TIDE',
      line: '2003 01 01 01  13 11.4 13.3  1.31  4.00  3.75   5 1021.2   9.1   9.7 999.0 99.0 99.00',
      time: '2003-01-01T01:00:00Z',
    },
    {
      layout: '2005-2006: YYYY with minute column',
      header: 'YYYY MM DD hh mm  WD  WSPD GST  WVHT  DPD   APD  MWD  BAR    ATMP  WTMP  DEWP  VIS  TIDE',
      line: '2005 07 04 01 50  13 11.4 13.3  1.31  4.00  3.75   5 1021.2   9.1   9.7 999.0 99.0 99.00',
      time: '2005-07-04T01:50:00Z',
    },
  ])('$layout', ({ header, line, time }) => {
    const { records } = parse(`${header}\n${line}\n`);
    expect(row(records, time)).toEqual(expected);
  });

  it('two files joined end to end: the second header is read anew', () => {
    const text =
      'YY MM DD hh WD   WSPD GST  WVHT  DPD   APD  MWD  BAR    ATMP  WTMP  DEWP  VIS\n' +
      '98 12 31 23  13 11.4 13.3  1.31  4.00  3.75   5 1021.2   9.1   9.7 999.0 99.0\n' +
      'YYYY MM DD hh WD  WSPD GST  WVHT  DPD   APD  MWD  BAR    ATMP  WTMP  DEWP  VIS\n' +
      '1999 01 01 00  13 11.4 13.3  1.31  4.00  3.75   5 1021.2   9.1   9.7 999.0 99.0\n';
    const { records } = parse(text);
    expect(Array.from(records.timeMs)).toEqual([Date.parse('1998-12-31T23:00:00Z'), Date.parse('1999-01-01T00:00:00Z')]);
  });

  it('a UTF-8 byte-order mark before the header is ignored', () => {
    const text = '\uFEFF' + read('46026h2016.txt').slice(0, 2000);
    const lastNl = text.lastIndexOf('\n');
    expect(parse(text.slice(0, lastNl + 1)).records.hs[0]).toBe(1.15);
  });
});

describe('wind height correction: U10 = Uz (10/z)^a (Hsu, Meindl & Gilhousen 1994, J. Appl. Meteor. 33, 757)', () => {
  // A real NDBC record, copied unchanged into tests/fixtures/ndbc/ (NOAA NDBC station 46026, public
  // domain): "2015 12 31 23 50  28  1.1 ..." has WSPD 1.1 m/s and "2016 01 01 00 50 100  1.3 ..." 1.3 m/s.
  // The anemometer of NDBC 3-m discus buoys is about 4.1 m above the sea (from memory; check the
  // station page). By hand, a = 0.11 (open sea, Hsu, Meindl & Gilhousen 1994):
  //   ln(10/4.1) = ln(2.439024) = 0.891598;  0.11 * 0.891598 = 0.0980758;  exp(0.0980758) = 1.103046
  //   U10 = 1.1 * 1.103046 = 1.21335 m/s;  1.3 * 1.103046 = 1.43396 m/s.
  // With a = 1/7 (over land): exp(0.891598/7) = exp(0.127371) = 1.135838;  1.1 * 1.135838 = 1.24942 m/s.
  const fixture = readFileSync(path.resolve(import.meta.dirname, '../fixtures/ndbc/46026h2016.txt'), 'utf8');

  it('multiplies WSPD by (10/4.1)^0.11 at the default exponent', () => {
    const { records, report } = parse(fixture, { anemometerHeightM: 4.1 });
    expect(Math.abs(records.wind[0] - 1.21335)).toBeLessThan(5e-5);
    expect(Math.abs(records.wind[1] - 1.43396)).toBeLessThan(5e-5);
    expect(report.notes.join(' ')).toMatch(/4\.1 m to 10 m: U10 = Uz \(10\/z\)\^a with a = 0\.11 \(factor 1\.1030\)/);
  });

  it('uses 1/7 when chosen', () => {
    const { records, report } = parse(fixture, { anemometerHeightM: 4.1, windExponent: 1 / 7 });
    expect(Math.abs(records.wind[0] - 1.24942)).toBeLessThan(5e-5);
    expect(report.notes.join(' ')).toMatch(/a = 1\/7 \(over land\)/);
  });

  it('10 m means already at 10 m: no change', () => {
    const { records } = parse(fixture, { anemometerHeightM: 10 });
    expect(records.wind[0]).toBe(1.1);
  });

  it('keeps WSPD when no height is given (the preview), and says so', () => {
    const { records, report } = parse(fixture);
    expect(records.wind[0]).toBe(1.1);
    expect(report.notes.join(' ')).toMatch(/kept at the anemometer height/);
  });

  it('refuses an impossible height or exponent', () => {
    expect(() => new NdbcParser({ anemometerHeightM: 0 })).toThrow(RangeError);
    expect(() => new NdbcParser({ anemometerHeightM: Number.NaN })).toThrow(RangeError);
    expect(() => new NdbcParser({ anemometerHeightM: 4, windExponent: 1.5 })).toThrow(RangeError);
  });
});

describe('format detection', () => {
  it('recognises every NDBC layout and not a CSV', () => {
    for (const name of Object.keys(FILES)) {
      const head = read(name).slice(0, 400);
      expect(looksLikeNdbc(head), name).toBe(true);
      expect(detectFormat(head)).toBe('ndbc');
    }
    expect(looksLikeNdbc('time,hs,tp\n2020-01-01T00:00Z,1,8\n')).toBe(false);
    expect(detectFormat('YY,MM,DD,hh,WVHT\n')).toBe('csv');
    expect(looksLikeNdbc('')).toBe(false);
  });
});

describe('bad NDBC text', () => {
  const HEADER =
    '#YY  MM DD hh mm WDIR WSPD GST  WVHT   DPD   APD MWD   PRES  ATMP  WTMP  DEWP  VIS  TIDE\n' +
    '#yr  mo dy hr mn degT m/s  m/s     m   sec   sec degT   hPa  degC  degC  degC   mi    ft\n';
  // A valid line of 46026h2016.txt: "2016 01 01 00 50 100  1.3  2.0  1.21 13.79  8.40 276 1021.7  10.3  12.9 999.0 99.0 99.00"
  const good = (t: string) => `${t} 100  1.3  2.0  1.21 13.79  8.40 276 1021.7  10.3  12.9 999.0 99.0 99.00\n`;

  function issuesOf(text: string) {
    try {
      parse(text);
    } catch (e) {
      expect(e).toBeInstanceOf(ImportError);
      return (e as ImportError).issues;
    }
    throw new Error('expected an ImportError');
  }

  it('refuses text that is not NDBC, naming the line', () => {
    const issues = issuesOf('time,hs\n2020-01-01,1\n');
    expect(issues[0]).toMatchObject({ line: 1, value: 'time,hs' });
  });

  it('refuses an empty file', () => {
    expect(issuesOf('')[0].reason).toMatch(/empty file/);
    expect(issuesOf('\n\n')[0].reason).toMatch(/empty file/);
  });

  it('names line and column of an implausible value (MWD 400)', () => {
    const text =
      HEADER + good('2016 01 01 00 50') + '2016 01 01 01 50 100  1.3  2.0  1.21 13.79  8.40 400 1021.7  10.3  12.9 999.0 99.0 99.00\n';
    expect(issuesOf(text)).toEqual([{ line: 4, column: 'MWD', value: '400', reason: 'direction outside 0-360 degrees' }]);
  });

  it('names a short row, a bad number and a bad date', () => {
    const text =
      HEADER +
      good('2016 01 01 00 50') +
      '2016 01 01 01 50 100  1.3\n' +
      '2016 01 01 02 50 100  1.3  2.0  1.2x 13.79  8.40 276 1021.7  10.3  12.9 999.0 99.0 99.00\n' +
      good('2016 02 30 03 50');
    const issues = issuesOf(text);
    expect(issues.map((i) => [i.line, i.column])).toEqual([
      [4, ''],
      [5, 'WVHT'],
      [6, 'YY MM DD hh mm'],
    ]);
    expect(issues[2].reason).toBe('unparseable time');
  });

  it('skip mode keeps the good rows of a newest-first file and lists the bad one', () => {
    const text = HEADER + good('2016 01 01 02 50') + good('2016 01 01 01 50') + good('2016 01 01 03 50') + good('2016 01 01 00 50');
    const p = new NdbcParser({ onBadRows: 'skip' });
    p.push(text);
    const { records, report } = p.end();
    expect(Array.from(records.timeMs)).toEqual([
      Date.parse('2016-01-01T00:50:00Z'),
      Date.parse('2016-01-01T01:50:00Z'),
      Date.parse('2016-01-01T02:50:00Z'),
    ]);
    expect(report.rowsSkipped).toBe(1);
    expect(report.issues[0]).toMatchObject({ line: 5, column: 'YY MM DD hh mm', value: '2016 01 01 03 50' });
    expect(report.issues[0].reason).toMatch(/out of order/);
  });
});
