// Partition columns in CSV files (docs/domain.md#partitions): detection by name, the energy sum
// (total Hs = sqrt(sum Hs_i^2), common practice, no source), the 5 % rule (partitions scaled to a
// given total that differs by more than 5 %, the record flagged), 0 = absent, a fill value missing,
// and errors with line and column. Expected figures are worked by hand beside each check.
import { describe, expect, it } from 'vitest';
import { CsvTextParser, ImportError, NdbcParser, detectColumns, detectPartitionColumns } from '../../shared/seadata';

function parse(text: string) {
  const p = new CsvTextParser({});
  p.push(text);
  return p.end();
}

describe('detection of partition columns', () => {
  it('finds wind sea and swells in either word order, any case, units and separators ignored', () => {
    const headers = [
      'time',
      'Hs',
      'hs_windsea',
      'WIND_SEA_TP',
      'Wind Sea Dir (deg)',
      'Hs swell1 [m]',
      'swell_tp',
      'swell2_dir',
      'tp_swell_2',
      'swell 2 hs (m)',
      'swell1.dir',
    ];
    const mapping = detectColumns(headers);
    expect(mapping).toEqual({ time: 'time', hs: 'Hs' });
    expect(detectPartitionColumns(headers, mapping)).toEqual({
      'windSea.hs': 'hs_windsea',
      'windSea.tp': 'WIND_SEA_TP',
      'windSea.dir': 'Wind Sea Dir (deg)',
      'swell1.hs': 'Hs swell1 [m]',
      'swell1.tp': 'swell_tp',
      'swell1.dir': 'swell1.dir',
      'swell2.dir': 'swell2_dir',
      'swell2.tp': 'tp_swell_2',
      'swell2.hs': 'swell 2 hs (m)',
    });
  });

  it('leaves ordinary files alone', () => {
    const headers = ['time', 'hs', 'tp', 'dir', 'wind', 'wind dir'];
    expect(detectPartitionColumns(headers, detectColumns(headers))).toEqual({});
  });
});

describe('reading partitions', () => {
  it('computes a missing total as sqrt(sum Hs_i^2) and keeps partitions within 5 % as they are', () => {
    const csv = [
      'time,hs,tp,hs_windsea,tp_windsea,dir_windsea,hs_swell,tp_swell,dir_swell',
      // no total: sqrt(0.9^2 + 1.2^2) = sqrt(0.81 + 1.44) = 1.5 m
      '2026-01-01T00:00Z,,,0.9,5,200,1.2,14,255',
      // total 1.52 vs 1.5: 1.3 % apart, kept
      '2026-01-01T01:00Z,1.52,14,0.9,5,200,1.2,14,255',
      // wind sea given as 0: absent; total = swell
      '2026-01-01T02:00Z,1.2,14,0,,,1.2,14,255',
    ].join('\n');
    const { records, report } = parse(csv);
    expect(records.hs[0]).toBeCloseTo(1.5, 12);
    expect(records.hs[1]).toBe(1.52);
    expect(records.extra!['windSea.hs']![1]).toBe(0.9);
    expect(records.extra!['windSea.hs']![2]).toBe(0);
    expect(Number.isNaN(records.extra!['windSea.tp']![2])).toBe(true);
    expect(report.partitions).toEqual({ came: ['windSea', 'swell1'], flagged: 0, flaggedLines: [], totalsFromPartitions: 1 });
    expect(report.notes.join(' ')).toContain('Partitions in the file: wind sea, swell 1');
  });

  it('scales partitions to a total more than 5 % away and flags the record (line named)', () => {
    // total 2.0 vs sqrt(0.9^2 + 1.2^2) = 1.5: 25 % apart; scale 2.0/1.5 = 4/3: 1.2 and 1.6 m.
    const csv = [
      'time,hs,hs_windsea,tp_windsea,hs_swell,tp_swell',
      '2026-01-01T00:00Z,2.0,0.9,5,1.2,14',
      '2026-01-01T01:00Z,1.5,0.9,5,1.2,14',
    ].join('\n');
    const { records, report } = parse(csv);
    expect(records.extra!['windSea.hs']![0]).toBeCloseTo(1.2, 12);
    expect(records.extra!['swell1.hs']![0]).toBeCloseTo(1.6, 12);
    expect(Math.hypot(records.extra!['windSea.hs']![0], records.extra!['swell1.hs']![0])).toBeCloseTo(2.0, 12);
    expect(records.extra!['swell1.hs']![1]).toBe(1.2);
    expect(report.partitions?.flagged).toBe(1);
    expect(report.partitions?.flaggedLines).toEqual([2]);
    // exactly 5 % is not "more than 5 %": 1.575 vs 1.5 stays (bound inclusive, as docs/domain.md#convention-6 treats limits)
    const edge = parse('time,hs,hs_swell,tp_swell\n2026-01-01T00:00Z,1.575,1.5,14\n');
    expect(edge.report.partitions?.flagged).toBe(0);
  });

  it('reads a fill value as missing and leaves the total alone', () => {
    const { records, report } = parse('time,hs,hs_swell,tp_swell\n2026-01-01T00:00Z,1.1,-999,14\n2026-01-01T01:00Z,1.2,9999,14\n');
    expect(Number.isNaN(records.extra!['swell1.hs']![0])).toBe(true);
    expect(records.hs[0]).toBe(1.1);
    expect(report.partitions?.flagged).toBe(0);
  });

  it('refuses bad partition values with line and column', () => {
    let error: unknown;
    try {
      parse(
        'time,hs,hs_swell,tp_swell,swell_dir\n2026-01-01T00:00Z,1.1,abc,14,250\n2026-01-01T00:30Z,1.1,1.1,14,250\n2026-01-01T01:00Z,1.2,1.2,55,250\n2026-01-01T02:00Z,1.2,1.2,12,400\n',
      );
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ImportError);
    const issues = (error as ImportError).issues;
    expect(issues[0]).toMatchObject({ line: 2, column: 'hs_swell', value: 'abc', reason: 'not a number' });
    expect(issues[1]).toMatchObject({ line: 4, column: 'tp_swell', value: '55' });
    expect(issues[2]).toMatchObject({ line: 5, column: 'swell_dir', value: '400' });
  });

  it('NDBC files stay total-only', () => {
    const p = new NdbcParser({ anemometerHeightM: 10 });
    p.push(
      '#YY  MM DD hh mm WDIR WSPD GST  WVHT   DPD   APD MWD   PRES  ATMP  WTMP  DEWP  VIS  TIDE\n' +
        '#yr  mo dy hr mn degT m/s  m/s     m   sec   sec degT   hPa  degC  degC  degC  nmi    ft\n' +
        '2016 01 01 00 50 100  1.3  2.0  1.21 13.79  8.40 276 1020.1  14.2  15.0  10.0 99.0 99.00\n',
    );
    const { records, report } = p.end();
    expect(records.extra).toBeUndefined();
    expect(report.partitions).toBeUndefined();
  });
});
