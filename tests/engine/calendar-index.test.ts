import { TZDate } from '@date-fns/tz';
import { startOfMonth } from 'date-fns';
import { describe, expect, it } from 'vitest';
import { calendarIndex, zonedMonthStartMs } from '../../shared/engine';

const HOUR = 3_600_000;

/** Reference: year and month (0-11) of an instant in a zone, from @date-fns/tz's TZDate (reference library). */
function refYearMonth(ms: number, zone: string): [number, number] {
  const d = new TZDate(ms, zone);
  return [d.getFullYear(), d.getMonth()];
}

describe('calendarIndex against @date-fns/tz (TZDate) across DST changes (docs/domain.md#convention-11)', () => {
  for (const zone of ['Europe/Oslo', 'Australia/Sydney', 'America/Santiago', 'Africa/Cairo', 'UTC']) {
    it(`hourly records 2013-2016 in ${zone}`, () => {
      const start = Date.UTC(2013, 0, 1);
      const n = 4 * 8766;
      const times = Float64Array.from({ length: n }, (_, i) => start + i * HOUR);
      const cal = calendarIndex(times, zone);
      let mismatches = 0;
      for (let i = 0; i < n; i++) {
        const [y, m] = refYearMonth(times[i], zone);
        if (cal.month[i] !== m || cal.yearMonth[i] !== y * 12 + m) mismatches++;
      }
      expect(mismatches).toBe(0);
      // Into reused buffers (longer, holding another series' months): the same months, in views of them.
      const into = { month: new Uint8Array(n + 9).fill(13), yearMonth: new Int32Array(n + 9).fill(-1) };
      const again = calendarIndex(times, zone, into);
      expect(again.month.buffer).toBe(into.month.buffer);
      expect(again.yearMonth).toHaveLength(n);
      expect(Array.from(again.yearMonth)).toEqual(Array.from(cal.yearMonth));
      expect(Array.from(again.month)).toEqual(Array.from(cal.month));
    });
  }

  it('sparse records with long gaps, 10-min records around a midnight month start, and 3-h records', () => {
    const zone = 'Australia/Sydney';
    const times: number[] = [];
    let t = Date.UTC(1999, 11, 31, 5, 17);
    for (let i = 0; i < 400; i++) {
      times.push(t);
      t += (i % 7 === 0 ? 97 * 24 : i % 3 === 0 ? 3 : 0.1667) * HOUR;
    }
    const cal = calendarIndex(Float64Array.from(times), zone);
    times.forEach((ms, i) => {
      const [y, m] = refYearMonth(ms, zone);
      expect([cal.yearMonth[i], cal.month[i]]).toEqual([y * 12 + m, m]);
    });
  });

  it('rejects an unknown time zone and times that go back', () => {
    expect(() => calendarIndex(Float64Array.of(0, HOUR), 'Mars/Olympus_Mons')).toThrow(RangeError);
    expect(() => calendarIndex(Float64Array.of(Date.UTC(2020, 5, 1), Date.UTC(2020, 3, 1)), 'UTC')).toThrow(RangeError);
    expect(() => calendarIndex(Float64Array.of(0, HOUR), 'UTC', { month: new Uint8Array(1), yearMonth: new Int32Array(2) })).toThrow(
      /buffers shorter than the series/,
    );
  });
});

describe('zonedMonthStartMs: first instant of a calendar month in a zone', () => {
  it('hand cases: Oslo in summer time is UTC+2, in winter UTC+1; Sydney in January UTC+11', () => {
    expect(zonedMonthStartMs(2024, 4, 'Europe/Oslo')).toBe(Date.UTC(2024, 2, 31, 22));
    expect(zonedMonthStartMs(2024, 1, 'Europe/Oslo')).toBe(Date.UTC(2023, 11, 31, 23));
    expect(zonedMonthStartMs(2024, 1, 'Australia/Sydney')).toBe(Date.UTC(2023, 11, 31, 13));
    expect(zonedMonthStartMs(2024, 1, 'UTC')).toBe(Date.UTC(2024, 0, 1));
  });

  it('equals date-fns startOfMonth on a TZDate for every month 1990-2030 in zones with DST', () => {
    for (const zone of ['Europe/Oslo', 'Australia/Sydney', 'America/New_York', 'Pacific/Auckland']) {
      for (let y = 1990; y <= 2030; y++) {
        for (let m = 1; m <= 12; m++) {
          const ref = startOfMonth(new TZDate(y, m - 1, 15, 12, zone)).getTime();
          expect(zonedMonthStartMs(y, m, zone)).toBe(ref);
        }
      }
    }
  });

  it('when 00:00 on the 1st does not exist, the month starts at the change (checked with TZDate)', () => {
    // Zones whose clocks jumped from 00:00 to 01:00 on the 1st (IANA data, read through the runtime):
    // Africa/Cairo 2014-08-01, Africa/Tripoli 1982-04-01.
    for (const [zone, y, m] of [
      ['Africa/Cairo', 2014, 8],
      ['Africa/Tripoli', 1982, 4],
    ] as const) {
      const s = zonedMonthStartMs(y, m, zone);
      const at = new TZDate(s, zone);
      expect([at.getFullYear(), at.getMonth() + 1, at.getDate(), at.getHours()]).toEqual([y, m, 1, 1]);
      const before = new TZDate(s - 1, zone);
      expect(before.getMonth() + 1).toBe(m - 1);
    }
  });
});
