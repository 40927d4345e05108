// Column detection from header names, unit hints, and the preview of the mapping step.
import { describe, expect, it } from 'vitest';
import { ColumnMappingSchema, detectColumns, detectUnits, normaliseHeader, previewCsv } from '../../shared/seadata';

describe('normaliseHeader', () => {
  it.each([
    [' Wind_Speed [m/s] ', 'windspeed'],
    ['Hs (m)', 'hs'],
    ['hs_m', 'hs'],
    ['Tm-10', 'tm10'],
    ['time UTC', 'time'],
    ['\uFEFF"Significant Wave Height"', 'significantwaveheight'],
    // A lone unit-like word is kept.
    ['m', 'm'],
  ])('drops case, bracketed units, trailing unit words and separators: %j reads %j', (header, expected) => {
    expect(normaliseHeader(header)).toBe(expected);
  });
});

describe('detectColumns', () => {
  it('common hindcast names', () => {
    expect(
      detectColumns(['Time', 'Hs [m]', 'Tp [s]', 'Tm02 [s]', 'Tm-10 [s]', 'MWD [deg]', 'Wind speed [m/s]', 'Wind direction [deg]']),
    ).toEqual({
      time: 'Time',
      hs: 'Hs [m]',
      tp: 'Tp [s]',
      tz: 'Tm02 [s]',
      te: 'Tm-10 [s]',
      dir: 'MWD [deg]',
      wind: 'Wind speed [m/s]',
      windDir: 'Wind direction [deg]',
    });
  });

  it('NDBC-like and model-like names', () => {
    expect(detectColumns(['datetime', 'WVHT', 'DPD', 'APD', 'MWD', 'WSPD', 'WDIR'])).toEqual({
      time: 'datetime',
      hs: 'WVHT',
      tp: 'DPD',
      tz: 'APD',
      dir: 'MWD',
      wind: 'WSPD',
      windDir: 'WDIR',
    });
    expect(detectColumns(['timestamp', 'swh', 'peak_period', 'energy period', 'wave_direction', 'u10', 'wd'])).toEqual({
      time: 'timestamp',
      hs: 'swh',
      tp: 'peak_period',
      te: 'energy period',
      dir: 'wave_direction',
      wind: 'u10',
      windDir: 'wd',
    });
    expect(detectColumns(['Date', 'Hm0', 'Tz'])).toEqual({ time: 'Date', hs: 'Hm0', tz: 'Tz' });
  });

  it('a combined time column wins over separate date and time columns', () => {
    expect(detectColumns(['date', 'time', 'datetime', 'hs'])).toEqual({ time: 'datetime', hs: 'hs' });
  });

  it('first match wins, unknown columns are left out, no time leaves time unset', () => {
    const m = detectColumns(['hs', 'Hm0', 'pressure', 'tp']);
    expect(m).toEqual({ hs: 'hs', tp: 'tp' });
    expect(ColumnMappingSchema.safeParse(m).success).toBe(false);
  });
});

describe('detectUnits', () => {
  it('reads units from the mapped headers only', () => {
    expect(detectUnits({ time: 't', hs: 'Hs (ft)', wind: 'WSPD [kn]' })).toEqual({ height: 'ft', speed: 'kn' });
    expect(detectUnits({ time: 't', hs: 'Hs [m]', wind: 'wind km/h' })).toEqual({ height: 'm', speed: 'km/h' });
    expect(detectUnits({ time: 't', hs: 'hs', wind: 'ws' })).toEqual({});
  });
});

describe('previewCsv', () => {
  it('detects delimiter, decimal comma, mapping and units, and shows rows as read', () => {
    const text = '\uFEFFDate;Time;Hs [ft];WS [kn]\r\n13/02/2020;00:00;10;20\r\n13/02/2020;01:00;-3;x\r\n';
    const p = previewCsv(text);
    expect(p.delimiter).toBe(';');
    expect(p.decimalComma).toBe(true);
    expect(p.headers).toEqual(['Date', 'Time', 'Hs [ft]', 'WS [kn]']);
    expect(p.mapping).toEqual({ date: 'Date', time: 'Time', hs: 'Hs [ft]', wind: 'WS [kn]' });
    expect(p.units).toEqual({ height: 'ft', speed: 'kn', direction: 'deg' });
    // A day above 12 decides the order.
    expect(p.dateOrder).toBe('dmy');
    expect(p.rows).toHaveLength(2);
    expect(p.rows[0]).toMatchObject({
      line: 2,
      fields: ['13/02/2020', '00:00', '10', '20'],
      timeMs: Date.UTC(2020, 1, 13),
      kept: true,
      issues: [],
    });
    // 10 ft = 3.048 m; 20 kn = 20 * 1852/3600 m/s (exact definitions, see csv.test.ts).
    expect(p.rows[0].values.hs).toBeCloseTo(3.048, 12);
    expect(p.rows[0].values.wind).toBeCloseTo((20 * 1852) / 3600, 12);
    expect(p.rows[1].kept).toBe(false);
    expect(p.rows[1].issues.map((i) => [i.line, i.column, i.reason])).toEqual([
      [3, 'Hs [ft]', 'negative significant wave height'],
      [3, 'WS [kn]', 'not a number'],
    ]);
    expect(p.fileIssues).toEqual([]);
    expect(p.partial).toBe(false);
  });

  it('the user choices win over detection', () => {
    const p = previewCsv('a,b\n2020-01-01 00:00,1\n', { mapping: { time: 'a', tp: 'b' }, units: { height: 'ft' } });
    expect(p.mapping).toEqual({ time: 'a', tp: 'b' });
    expect(p.rows[0].values.tp).toBe(1);
  });

  it('reports a missing time column as a file issue instead of throwing', () => {
    const p = previewCsv('x,hs\n1,2\n');
    expect(p.rows).toEqual([]);
    expect(p.fileIssues[0]).toMatchObject({ line: 1, reason: expect.stringMatching(/no time column/) });
    expect(p.headers).toEqual(['x', 'hs']);
  });

  it('reads only the leading part of a long text, whole lines only, and at most the asked rows', () => {
    let text = 'time,hs\n';
    for (let h = 0; h < 5000; h++) text += `${new Date(Date.UTC(2020, 0, 1) + h * 3_600_000).toISOString()},1.5\n`;
    const p = previewCsv(text, { maxChars: 10_000, rows: 5 });
    expect(p.partial).toBe(true);
    expect(p.rows.map((r) => r.line)).toEqual([2, 3, 4, 5, 6]);
    expect(p.fileIssues).toEqual([]);
  });

  it('an ambiguous day order stays undecided and the rows say why', () => {
    const p = previewCsv('time,hs\n01/02/2020 00:00,1\n');
    expect(p.dateOrder).toBeUndefined();
    expect(p.rows[0].issues[0].reason).toMatch(/ambiguous date/);
    expect(p.fileIssues.map((i) => i.reason)).toEqual([expect.stringMatching(/no usable record/)]);
  });
});
