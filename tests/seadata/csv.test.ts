// CSV import: dialects, times, units, missing codes, chunking and line numbers.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { feedInChunks } from '../support/chunks';
import { issuesOf, parse } from './csv-helpers';
import { CsvRecordReader, CsvTextParser, DEFAULT_MISSING_CODES, ImportError, detectColumns, detectDelimiter } from '../../shared/seadata';

const iso = (ms: Float64Array) => Array.from(ms, (t) => new Date(t).toISOString());
/** `count` whole hours in a row from `first` (an ISO time), as ISO strings. */
const hoursFrom = (first: string, count: number) =>
  Array.from({ length: count }, (_, k) => new Date(Date.parse(first) + k * 3_600_000).toISOString());

describe('dialects', () => {
  it('comma, LF', () => {
    const { records } = parse('time,hs,tp,dir\n2020-01-01T00:00Z,1.5,8.2,270\n2020-01-01T01:00Z,1.6,8.4,275\n');
    expect(iso(records.timeMs)).toEqual(['2020-01-01T00:00:00.000Z', '2020-01-01T01:00:00.000Z']);
    expect(Array.from(records.hs)).toEqual([1.5, 1.6]);
    expect(Array.from(records.tp)).toEqual([8.2, 8.4]);
    expect(Array.from(records.dir)).toEqual([270, 275]);
    // Not mapped: left missing, nothing derived.
    expect(Array.from(records.tz)).toEqual([NaN, NaN]);
    expect(Array.from(records.te)).toEqual([NaN, NaN]);
  });

  it('UTF-8 BOM and CRLF', () => {
    const { records } = parse('\uFEFFtime,Hs\r\n2020-01-01 00:00,1.5\r\n2020-01-01 01:00,1.6\r\n');
    expect(Array.from(records.hs)).toEqual([1.5, 1.6]);
    expect(iso(records.timeMs)[1]).toBe('2020-01-01T01:00:00.000Z');
  });

  it('old Mac CR-only line endings', () => {
    const { records } = parse('time,hs\r2020-01-01 00:00,1.5\r2020-01-01 01:00,1.6\r');
    expect(Array.from(records.hs)).toEqual([1.5, 1.6]);
  });

  it('semicolons with a decimal comma (on by default for ;)', () => {
    const { records, report } = parse('time;hs;tp\n2020-01-01 00:00;1,5;8,25\n2020-01-01 01:00;1.6;9\n');
    expect(Array.from(records.hs)).toEqual([1.5, 1.6]);
    expect(Array.from(records.tp)).toEqual([8.25, 9]);
    expect(report.notes.join(' ')).toMatch(/decimal comma/);
  });

  it('refuses a thousands separator even with a decimal comma', () => {
    const issues = issuesOf('time;hs\n2020-01-01 00:00;1.000,5\n');
    expect(issues.some((i) => i.line === 2 && i.column === 'hs' && i.reason === 'not a number')).toBe(true);
  });

  it('tabs', () => {
    const { records } = parse('time\ths\twind\n2020-01-01 00:00\t1.5\t7.5\n');
    expect(Array.from(records.wind)).toEqual([7.5]);
  });

  it('quoted fields: quoted header, delimiter and quotes inside', () => {
    const text =
      '"time","Hs [m]","note, free text","Tp (s)"\n' +
      '"2020-01-01 00:00","1.5","calm, ""glassy""","8"\n' +
      '"2020-01-01 01:00" ,"1.6","x","9"\n' +
      '"2020-01-01 02:00","-1","x","9"\n';
    const issues = issuesOf(text);
    expect(issues).toEqual([{ line: 4, column: 'Hs [m]', value: '-1', reason: 'negative significant wave height' }]);
    const { records } = parse(text, { onBadRows: 'skip' });
    expect(Array.from(records.hs)).toEqual([1.5, 1.6]);
    expect(Array.from(records.tp)).toEqual([8, 9]);
  });

  // Issue 22, item 3: a quote left open on line 3 used to swallow every later line into one bad
  // row, so "skip bad rows" lost 49 good rows without a word. Every line is one row now (RFC 4180
  // allows line breaks inside quotes, but no sea-state column holds one: common practice, no source).
  it('a quote not closed on its line is a bad row at that line; skip mode reads on from the next line', () => {
    const times = Array.from({ length: 50 }, (_, k) =>
      new Date(Date.UTC(2020, 0, 1) + k * 3_600_000).toISOString().slice(0, 16).replace('T', ' '),
    );
    const lines = ['time,hs', ...times.map((t, k) => (k === 1 ? `${t},"1.1` : `${t},1.${k % 10}`))];
    const text = lines.join('\n') + '\n';
    const issues = issuesOf(text);
    expect(issues).toEqual([{ line: 3, column: '18', value: `${times[1]},"1.1`, reason: 'a quote opened here is not closed on its line' }]);
    const { records, report } = parse(text, { onBadRows: 'skip' });
    // 50 data lines (lines 2-51): 49 kept, 1 reported bad.
    expect(report.rowsRead).toBe(50);
    expect(report.rowsSkipped).toBe(1);
    expect(records.timeMs).toHaveLength(49);
    // The same in small pieces.
    const chunked = new CsvTextParser({ onBadRows: 'skip' });
    for (let i = 0; i < text.length; i += 7) chunked.push(text.slice(i, i + 7));
    expect(chunked.end().report).toEqual(report);
    // A line break inside quotes is two bad lines, not one row.
    const split = issuesOf('time,hs,note\n2020-01-01 00:00,1,"two\nlines"\n2020-01-01 01:00,1,x\n');
    expect(split.map((i) => i.line)).toEqual([2, 3]);
    expect(split[0]).toMatchObject({ column: '20', reason: 'a quote opened here is not closed on its line' });
    expect(issuesOf('time,hs\n2020-01-01 00:00,"1"5\n2020-01-01 01:00,1\n')).toEqual([
      { line: 2, column: '21', value: '2020-01-01 00:00,"1"5', reason: 'text after the closing quote of a field' },
    ]);
  });

  it('detects the delimiter from the header line, ignoring quoted ones', () => {
    expect(detectDelimiter('time,hs,tp')).toBe(',');
    expect(detectDelimiter('time;hs [m];tp [s]')).toBe(';');
    expect(detectDelimiter('time\ths\ttp')).toBe('\t');
    expect(detectDelimiter('"a;b;c",hs,tp')).toBe(',');
  });

  it('blank lines are skipped and do not shift line numbers', () => {
    const issues = issuesOf('\ntime,hs\n\n2020-01-01 00:00,1\n\n2020-01-01 01:00,30\n');
    expect(issues).toEqual([{ line: 6, column: 'hs', value: '30', reason: 'significant wave height above 25 m' }]);
  });

  it('a trailing delimiter (extra empty field) is accepted', () => {
    const { records } = parse('time,hs,\n2020-01-01 00:00,1.5,\n');
    expect(Array.from(records.hs)).toEqual([1.5]);
  });
});

describe('timestamps', () => {
  it('ISO 8601 with Z and offsets', () => {
    // Each text names the same instant 2020-06-01T12:00Z, one hour apart so the order holds.
    const { records } = parse(
      'time,hs\n' +
        '2020-06-01T12:00:00Z,1\n' +
        '2020-06-01T14:00:00+01:00,1\n' +
        '2020-06-01T19:30+0530,1\n' +
        '2020-06-01 12:00:00-03,1\n' +
        '2020-06-01 16:00 UTC,1\n' +
        '2020-06-01T17:00:00.500Z,1\n',
    );
    expect(iso(records.timeMs)).toEqual([
      '2020-06-01T12:00:00.000Z',
      '2020-06-01T13:00:00.000Z',
      '2020-06-01T14:00:00.000Z',
      '2020-06-01T15:00:00.000Z',
      '2020-06-01T16:00:00.000Z',
      '2020-06-01T17:00:00.500Z',
    ]);
  });

  it('an offset in the text wins over the time-zone option', () => {
    const { records } = parse('time,hs\n2020-06-01T12:00Z,1\n', { timeZone: 'Europe/Oslo' });
    expect(iso(records.timeMs)).toEqual(['2020-06-01T12:00:00.000Z']);
  });

  it('year-first forms without an offset, default UTC', () => {
    const { records } = parse('time,hs\n2020/01/31 06:00,1\n2020.01.31 07:00,1\n2020-01-31 08:00:30,1\n2020-02-01,1\n');
    expect(iso(records.timeMs)).toEqual([
      '2020-01-31T06:00:00.000Z',
      '2020-01-31T07:00:00.000Z',
      '2020-01-31T08:00:30.000Z',
      '2020-02-01T00:00:00.000Z',
    ]);
  });

  // EU summer time (Directive 2000/84/EC, Art. 2-3): it begins at 01:00 UTC on the last Sunday
  // of March and ends at 01:00 UTC on the last Sunday of October; Norway applies the same
  // rule (CET = UTC+1, CEST = UTC+2). 2023: 26 March and 29 October.
  it('local times in Europe/Oslo across the spring-forward change', () => {
    const { records } = parse('time,hs\n2023-03-26 00:00,1\n2023-03-26 01:00,1\n2023-03-26 03:00,1\n2023-03-26 04:00,1\n', {
      timeZone: 'Europe/Oslo',
    });
    // 00:00 and 01:00 CET, then 03:00 and 04:00 CEST: four hours in a row.
    expect(iso(records.timeMs)).toEqual(hoursFrom('2023-03-25T23:00:00.000Z', 4));
  });

  it('a wall time in the spring-forward gap does not exist', () => {
    const issues = issuesOf('time,hs\n2023-03-26 01:00,1\n2023-03-26 02:30,1\n', { timeZone: 'Europe/Oslo' });
    expect(issues).toHaveLength(1);
    expect(issues[0]).toMatchObject({ line: 3, column: 'time', value: '2023-03-26 02:30' });
    expect(issues[0].reason).toMatch(/does not exist/);
  });

  it('the repeated hour of the fall-back change reads as consecutive UTC hours', () => {
    const { records } = parse('time,hs\n2023-10-29 01:00,1\n2023-10-29 02:00,2\n2023-10-29 02:00,3\n2023-10-29 03:00,4\n', {
      timeZone: 'Europe/Oslo',
    });
    // 01:00 CEST, 02:00 CEST, 02:00 CET, 03:00 CET.
    expect(iso(records.timeMs)).toEqual(hoursFrom('2023-10-28T23:00:00.000Z', 4));
  });

  it('a single 02:30 on the fall-back day is the first (summer-time) occurrence', () => {
    const { records } = parse('time,hs\n2023-10-29 02:30,1\n', { timeZone: 'Europe/Oslo' });
    expect(iso(records.timeMs)).toEqual(['2023-10-29T00:30:00.000Z']);
  });

  it('winter and summer offsets far from the changes (America/New_York: EST -5, EDT -4)', () => {
    const { records } = parse('time,hs\n2021-01-15 12:00,1\n2021-07-15 12:00,1\n', { timeZone: 'America/New_York' });
    expect(iso(records.timeMs)).toEqual(['2021-01-15T17:00:00.000Z', '2021-07-15T16:00:00.000Z']);
  });

  it('separate date and time columns', () => {
    const text = 'Date,Time,Hs\n2020-01-01,00:00,1\n2020-01-01,01:00,2\n';
    expect(detectColumns(['Date', 'Time', 'Hs'])).toEqual({ date: 'Date', time: 'Time', hs: 'Hs' });
    const { records } = parse(text);
    expect(iso(records.timeMs)).toEqual(['2020-01-01T00:00:00.000Z', '2020-01-01T01:00:00.000Z']);
  });

  it('DD/MM/YYYY only with a chosen day order; dotted dates are day first', () => {
    const text = 'time,hs\n01/02/2020 00:00,1\n13/02/2020 00:00,1\n';
    const issues = issuesOf(text);
    expect(issues.filter((i) => /ambiguous/.test(i.reason)).map((i) => i.line)).toEqual([2, 3]);
    expect(iso(parse(text, { dateOrder: 'dmy' }).records.timeMs)).toEqual(['2020-02-01T00:00:00.000Z', '2020-02-13T00:00:00.000Z']);
    expect(iso(parse('time,hs\n02/01/2020 00:00,1\n', { dateOrder: 'mdy' }).records.timeMs)).toEqual(['2020-02-01T00:00:00.000Z']);
    expect(iso(parse('time,hs\n01.02.2020 06:00,1\n').records.timeMs)).toEqual(['2020-02-01T06:00:00.000Z']);
  });

  it('refuses impossible dates and garbage', () => {
    const text = 'time,hs\n2020-02-30 00:00,1\n2020-01-01 24:00,1\n2020-13-01,1\nyesterday,1\n,1\n0099-01-01,1\n';
    const issues = issuesOf(text, { onBadRows: 'refuse' });
    // The refusal itself (line 0), then every data line in its time column.
    expect(issues.map((i) => [i.line, i.column])).toEqual([[0, ''], ...[2, 3, 4, 5, 6, 7].map((line) => [line, 'time'])]);
    expect(issues[4].reason).toBe('unparseable time');
    expect(issues[5].reason).toBe('missing time');
  });
});

describe('units', () => {
  // 1 ft = 0.3048 m exactly (international foot, 1959; NIST SP 811 app. B, from memory).
  // 1 kn = 1852 m / 3600 s exactly (international nautical mile = 1852 m; NIST SP 811, from memory).
  it('feet and knots', () => {
    const { records } = parse('time,hs,wind\n2020-01-01 00:00,10,10\n', { units: { height: 'ft', speed: 'kn' } });
    expect(records.hs[0]).toBeCloseTo(3.048, 12);
    expect(records.wind[0]).toBeCloseTo(5.144444444444445, 12);
  });

  it('km/h (1 km/h = 1/3.6 m/s)', () => {
    const { records } = parse('time,wind\n2020-01-01 00:00,36\n', { units: { speed: 'km/h' } });
    expect(records.wind[0]).toBeCloseTo(10, 12);
  });

  it('units from the header names when none are given', () => {
    const { records } = parse('time,Hs [ft],Wind speed (kn)\n2020-01-01 00:00,10,10\n');
    expect(records.hs[0]).toBeCloseTo(3.048, 12);
    expect(records.wind[0]).toBeCloseTo(1852 / 360, 12);
  });

  it('plausibility is checked after conversion: 90 ft = 27.4 m is too high', () => {
    const issues = issuesOf('time,hs\n2020-01-01 00:00,82\n2020-01-01 01:00,90\n', { units: { height: 'ft' } });
    // 82 ft = 24.99 m is accepted, 90 ft is not.
    expect(issues).toEqual([{ line: 3, column: 'hs', value: '90', reason: 'significant wave height above 25 m' }]);
  });

  it('wind height correction U10 = Uz (10/z)^a, a = 0.11 by default (Hsu, Meindl & Gilhousen 1994) or 1/7 when chosen', () => {
    // By hand: 2^0.11 = exp(0.11 * 0.693147) = exp(0.0762462) = 1.079228; 2^(1/7) = 1.104090.
    const { records } = parse('time,wind\n2020-01-01 00:00,10\n', { anemometerHeightM: 5 });
    expect(Math.abs(records.wind[0] - 10.79228)).toBeLessThan(5e-5);
    const { records: land } = parse('time,wind\n2020-01-01 00:00,10\n', { anemometerHeightM: 5, windExponent: 1 / 7 });
    expect(Math.abs(land.wind[0] - 11.0409)).toBeLessThan(5e-4);
  });

  it('CSV wind defaults to already at 10 m, and the report says so', () => {
    const { records, report } = parse('time,wind\n2020-01-01 00:00,10\n');
    expect(records.wind[0]).toBe(10);
    expect(report.notes.join(' ')).toMatch(/measured at 10 m/);
  });

  it('99 and 99.0 are missing codes of wind (a wind of 99 m/s used to pass the range check)', () => {
    const { records, report } = parse(
      'time,hs,wind,winddir\n2020-01-01 00:00,1,99,99\n2020-01-01 01:00,1,99.0,10\n2020-01-01 02:00,1,98.5,10\n',
    );
    expect(records.wind[0]).toBeNaN();
    expect(records.wind[1]).toBeNaN();
    expect(records.wind[2]).toBe(98.5);
    // 99 stays a valid direction.
    expect(records.windDir[0]).toBe(99);
    expect(report.issueCount).toBe(0);
  });

  it('going-to directions are turned to coming-from by adding 180 deg; coming-from is the default', () => {
    const csv = 'time,hs,dir,wind,winddir\n2020-01-01 00:00,1,90,5,270\n2020-01-01 01:00,1,200,5,360\n';
    const going = parse(csv, { directionConvention: 'going-to' });
    expect(Array.from(going.records.dir)).toEqual([270, 20]);
    expect(Array.from(going.records.windDir)).toEqual([90, 180]);
    const coming = parse(csv);
    expect(Array.from(coming.records.dir)).toEqual([90, 200]);
    // An impossible direction is still refused, not turned into a plausible one.
    expect(issuesOf('time,hs,dir\n2020-01-01 00:00,1,400\n2020-01-01 01:00,1,10\n', { directionConvention: 'going-to' })[0].reason).toMatch(
      /direction/,
    );
  });
});

describe('missing-value codes', () => {
  for (const code of DEFAULT_MISSING_CODES) {
    it(`default code ${JSON.stringify(code)} reads as missing`, () => {
      const { records, report } = parse(`time,hs,tp\n2020-01-01 00:00,"${code}",8\n`);
      expect(records.hs[0]).toBeNaN();
      expect(records.tp[0]).toBe(8);
      expect(report.issueCount).toBe(0);
    });
  }

  it('numeric codes match numerically and text codes ignore case and blanks', () => {
    const { records } = parse('time,hs,tp,dir,wind,wdir\n2020-01-01 00:00,-999.0,9999.00, nan ,n/a,10\n');
    expect([records.hs[0], records.tp[0], records.dir[0], records.wind[0], records.windDir[0]]).toEqual([NaN, NaN, NaN, NaN, 10]);
  });

  it('99 is not a default code: it is a valid direction', () => {
    const { records } = parse('time,dir\n2020-01-01 00:00,99\n');
    expect(records.dir[0]).toBe(99);
  });

  it('a given list replaces the defaults', () => {
    const text = 'time,hs,tp,dir\n2020-01-01 00:00,-1,,10\n2020-01-01 01:00,1,8,10\n';
    const issues = issuesOf(text, { missingCodes: ['-1'] });
    expect(issues).toEqual([{ line: 2, column: 'tp', value: '', reason: 'empty value (not in the missing-value codes)' }]);
    const { records } = parse(text, { missingCodes: ['-1', ''] });
    expect([records.hs[0], records.tp[0]]).toEqual([NaN, NaN]);
  });

  it('text that is neither a number nor a code is refused', () => {
    for (const bad of ['12abc', '0x10', 'Infinity', '1,5', '--1', '1e']) {
      const issues = issuesOf(`time,hs\n2020-01-01 00:00,"${bad}"\n`);
      expect(
        issues.find((i) => i.line === 2),
        bad,
      ).toEqual({ line: 2, column: 'hs', value: bad, reason: 'not a number' });
    }
  });
});

describe('validation rules: each gives an issue naming line and column', () => {
  const HEAD = 'time,hs,tp,tz,te,dir,wind,wdir\n';
  const ok = (t: string) => `${t},1.5,8,6,7,270,5,260\n`;
  const cases: [string, string, string, string, RegExp][] = [
    ['2020-01-01 01:00,-0.1,8,6,7,270,5,260', 'hs', '-0.1', 'negative Hs', /negative significant wave height/],
    ['2020-01-01 01:00,25.01,8,6,7,270,5,260', 'hs', '25.01', 'Hs above 25 m', /above 25 m/],
    ['2020-01-01 01:00,1.5,0.49,6,7,270,5,260', 'tp', '0.49', 'Tp below 0.5 s', /period outside 0.5-40 s/],
    ['2020-01-01 01:00,1.5,8,40.5,7,270,5,260', 'tz', '40.5', 'Tz above 40 s', /period outside 0.5-40 s/],
    ['2020-01-01 01:00,1.5,8,6,0,270,5,260', 'te', '0', 'Te of 0 s', /period outside 0.5-40 s/],
    ['2020-01-01 01:00,1.5,8,6,7,-1,5,260', 'dir', '-1', 'direction below 0', /direction outside 0-360/],
    ['2020-01-01 01:00,1.5,8,6,7,270,5,361', 'wdir', '361', 'wind direction above 360', /direction outside 0-360/],
    ['2020-01-01 01:00,1.5,8,6,7,270,-2,260', 'wind', '-2', 'negative wind', /negative wind speed/],
    ['2020-01-01 01:00,1.5,8,6,7,270,100.5,260', 'wind', '100.5', 'wind above 100 m/s', /above 100 m\/s/],
    ['2020-01-01 01:00,1.5,8,6,7,270,5', '', '', 'missing field', /expected 8 fields/],
    ['2020-01-01 00:00,1.5,8,6,7,270,5,260', 'time', '2020-01-01 00:00', 'duplicated time', /duplicated time: same as line 2/],
    ['2019-12-31 23:00,1.5,8,6,7,270,5,260', 'time', '2019-12-31 23:00', 'out of order', /out of order: earlier than line 2/],
    ['01-01-2020 01:00,1.5,8,6,7,270,5,260', 'time', '01-01-2020 01:00', 'ambiguous date', /ambiguous date/],
  ];
  for (const [line, column, value, name, reason] of cases) {
    it(`${name}: refused in refuse mode, skipped and listed in skip mode`, () => {
      const text = HEAD + ok('2020-01-01 00:00') + line + '\n' + ok('2020-01-01 02:00');
      const issues = issuesOf(text);
      expect(issues).toHaveLength(1);
      expect(issues[0].line).toBe(3);
      expect(issues[0].column).toBe(column);
      if (value !== '') expect(issues[0].value).toBe(value);
      expect(issues[0].reason).toMatch(reason);

      const { records, report } = parse(text, { onBadRows: 'skip' });
      expect(iso(records.timeMs)).toEqual(['2020-01-01T00:00:00.000Z', '2020-01-01T02:00:00.000Z']);
      expect(report.rowsRead).toBe(3);
      expect(report.rowsSkipped).toBe(1);
      expect(report.issues).toEqual(issues);
    });
  }

  it('bounds are inclusive: Hs 0 and 25 m, periods 0.5 and 40 s, directions 0 and 360 (stored as 0), wind 0 and 100 m/s', () => {
    const { records } = parse(HEAD + '2020-01-01 00:00,0,0.5,40,0.5,360,0,0\n2020-01-01 01:00,25,40,0.5,40,0,100,360\n');
    expect(Array.from(records.hs)).toEqual([0, 25]);
    expect(Array.from(records.tp)).toEqual([0.5, 40]);
    expect(Array.from(records.tz)).toEqual([40, 0.5]);
    expect(Array.from(records.dir)).toEqual([0, 0]);
    expect(Array.from(records.wind)).toEqual([0, 100]);
    expect(Array.from(records.windDir)).toEqual([0, 0]);
  });

  it('a file with no usable record is refused in both modes', () => {
    for (const onBadRows of ['refuse', 'skip'] as const) {
      expect(issuesOf('time,hs\n', { onBadRows })[0]).toMatchObject({ line: 0, reason: expect.stringMatching(/no usable record/) });
      expect(issuesOf('time,hs\n2020-01-01 00:00,NaN\n', { onBadRows })[0].reason).toMatch(/no usable record/);
      const bad = issuesOf('time,hs\n2020-01-01 00:00,-1\n', { onBadRows });
      expect(bad.map((i) => i.line)).toEqual([0, 2]);
    }
  });

  it('a row with only missing values is kept as a no-data record', () => {
    const { records } = parse('time,hs,tp\n2020-01-01 00:00,1,8\n2020-01-01 01:00,,\n');
    expect(records.timeMs).toHaveLength(2);
    expect([records.hs[1], records.tp[1]]).toEqual([NaN, NaN]);
  });

  it('a wrong time does not poison the rows after it', () => {
    const { records, report } = parse(HEAD + ok('2020-01-01 00:00') + ok('not a time') + ok('2020-01-01 01:00'), { onBadRows: 'skip' });
    expect(records.timeMs).toHaveLength(2);
    expect(report.issues.map((i) => i.line)).toEqual([3]);
  });

  it('the file-level errors: no time column, mapped column absent, empty file', () => {
    expect(issuesOf('hs,tp\n1,8\n')[0]).toMatchObject({ line: 1, reason: expect.stringMatching(/no time column/) });
    expect(issuesOf('time,hs\n2020-01-01,1\n', { mapping: { time: 'time', hs: 'Hm0' } })[0]).toMatchObject({
      line: 1,
      column: 'Hm0',
      reason: 'mapped column not in the header row',
    });
    expect(issuesOf('time,note\n2020-01-01,1\n')[0].reason).toMatch(/no sea-state column/);
    expect(issuesOf('')[0].reason).toMatch(/empty file/);
    expect(issuesOf('\n \n')[0].reason).toMatch(/empty file/);
  });

  it('lists at most 200 issues and counts all of them', () => {
    let text = 'time,hs\n';
    for (let i = 0; i < 500; i++) text += `2020-01-01 00:00,${i === 0 ? 1 : -1}\n`;
    try {
      parse(text);
      throw new Error('expected an ImportError');
    } catch (e) {
      const err = e as ImportError;
      expect(err).toBeInstanceOf(ImportError);
      expect(err.issues).toHaveLength(200);
      expect(err.issueCount).toBe(499);
      expect(err.message).toMatch(/line 3, column hs: negative significant wave height \(and 498 more issues\)/);
    }
  });
});

describe('CsvRecordReader fed with rows (as from papaparse streaming)', () => {
  it('reads rows and their given line numbers', () => {
    const r = new CsvRecordReader({ units: { speed: 'kn' } });
    r.pushRow(['time', 'hs', 'wind'], 1);
    r.pushRow(['2023-01-01 00:00', '1.5', '10'], 2);
    r.pushRow([''], 3);
    r.pushRow(['2023-01-01 01:00', '-1', '10'], 7);
    expect(r.headers).toEqual(['time', 'hs', 'wind']);
    expect(r.mapping).toEqual({ time: 'time', hs: 'hs', wind: 'wind' });
    try {
      r.end();
      throw new Error('expected an ImportError');
    } catch (e) {
      expect((e as ImportError).issues).toEqual([{ line: 7, column: 'hs', value: '-1', reason: 'negative significant wave height' }]);
    }
  });

  it('a row the splitter found malformed is refused with its reason', () => {
    const r = new CsvRecordReader({ onBadRows: 'skip' });
    r.pushRow(['time', 'hs'], 1);
    r.pushRow(['2023-01-01 00:00', '1.5'], 2);
    r.pushRow(['2023-01-01 01:00', '1.5'], 3, 'malformed CSV: Trailing quote on quoted field is malformed');
    const { records, report } = r.end();
    expect(records.timeMs).toHaveLength(1);
    expect(report.issues[0]).toMatchObject({ line: 3, reason: 'malformed CSV: Trailing quote on quoted field is malformed' });
  });

  it('refuses an unknown time zone at construction', () => {
    expect(() => new CsvRecordReader({ timeZone: 'Mars/Olympus_Mons' })).toThrow(RangeError);
  });
});

describe('chunked text gives the same result as one chunk', () => {
  const lines = ['\uFEFF"time";"Hs [m]";"Tp [s]";"note"'];
  for (let h = 0; h < 300; h++) {
    const t = new Date(Date.UTC(2023, 9, 28, 20) + h * 3_600_000).toISOString().slice(0, 16).replace('T', ' ');
    lines.push(`${t};${(1 + (h % 7) / 10).toFixed(2).replace('.', ',')};${8 + (h % 5)};"a;b ""c"""`);
  }
  const text = lines.join('\r\n') + '\r\n';

  it('CRLF, BOM, semicolons, decimal comma, quoted fields with quotes inside, local zone', () => {
    const whole = parse(text, { timeZone: 'Europe/Oslo', onBadRows: 'skip' });
    expect(whole.records.timeMs.length).toBeGreaterThan(250);
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 4000 }), { minLength: 1, maxLength: 40 }), (sizes) => {
        const got = feedInChunks(new CsvTextParser({ timeZone: 'Europe/Oslo', onBadRows: 'skip' }), text, sizes);
        expect(got.records).toEqual(whole.records);
        expect(got.report).toEqual(whole.report);
      }),
      { numRuns: 30 },
    );
  });

  it('line numbers count every line', () => {
    const bad = text.replace('2023-10-28 21:00;1,10', '2023-10-28 21:00;-1,10');
    const issues = issuesOf(bad, { timeZone: 'UTC' });
    expect(issues).toEqual([{ line: 3, column: 'Hs [m]', value: '-1,10', reason: 'negative significant wave height' }]);
  });

  // Issue 22, item 3 (a quote left open swallowed the rest of the file): the bad row is line 2 alone,
  // and the next line is still read, whole or in pieces of any size.
  it('an unterminated quote is reported, not read as one huge row silently', () => {
    const text = 'time,hs\n2020-01-01 00:00,"1.5\n2020-01-01 01:00,1.6\n2020-01-01 02:00,1.7\n';
    const issues = issuesOf(text);
    expect(issues.map((i) => i.line)).toEqual([2]);
    for (const size of [text.length, 5, 1]) {
      const p = new CsvTextParser({ onBadRows: 'skip' });
      for (let i = 0; i < text.length; i += size) p.push(text.slice(i, i + size));
      const { records, report } = p.end();
      // 3 data lines (lines 2-4): line 2 bad, lines 3 and 4 kept.
      expect(report.rowsRead, `pieces of ${size}`).toBe(3);
      expect(report.rowsSkipped, `pieces of ${size}`).toBe(1);
      expect(iso(records.timeMs), `pieces of ${size}`).toEqual(['2020-01-01T01:00:00.000Z', '2020-01-01T02:00:00.000Z']);
    }
  });
});
