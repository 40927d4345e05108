import { quantile } from 'd3-array';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { simulateCampaign } from '../../shared/engine';

const HOUR = 3_600_000;

/** Hourly UTC axis from `fromYear`-01-01 00:00 to the end of `toYear`. */
function hourlyAxis(fromYear: number, toYear: number): Float64Array {
  const t0 = Date.UTC(fromYear, 0, 1);
  const n = (Date.UTC(toYear + 1, 0, 1) - t0) / HOUR;
  return Float64Array.from({ length: n }, (_, i) => t0 + i * HOUR);
}

describe('simulateCampaign (docs/domain.md#hindcast-statistics, #convention-15)', () => {
  const times = hourlyAxis(2001, 2003);
  const n = times.length;
  const always = new Uint8Array(n).fill(1);
  const never = new Uint8Array(n);

  it('a calm year finishes in the sum of TPOP', () => {
    const res = simulateCampaign(times, HOUR, [
      { goStart: always, tpopH: 10 },
      { goStart: always, tpopH: 20 },
    ]);
    expect(res).toHaveLength(12);
    for (const r of res) {
      expect(r.years).toBe(3);
      expect(r.censoredYears).toEqual([]);
      expect([r.p50Hours, r.p90Hours, r.wowP50Hours, r.wowP90Hours]).toEqual([30, 30, 0, 0]);
      expect(r.runs.map((x) => x.year)).toEqual([2001, 2002, 2003]);
    }
    expect(res[4].runs[1].startMs).toBe(Date.UTC(2002, 4, 1));
    expect(res[4].runs[1].endMs).toBe(Date.UTC(2002, 4, 2, 6));
  });

  it('a step that never gets a window is censored, every year', () => {
    const res = simulateCampaign(
      times,
      HOUR,
      [
        { goStart: always, tpopH: 10 },
        { goStart: never, tpopH: 20 },
      ],
      { startMonths: [3] },
    );
    expect(res).toHaveLength(1);
    expect(res[0].startMonth).toBe(3);
    expect(res[0].censoredYears).toEqual([2001, 2002, 2003]);
    expect([res[0].p50Hours, res[0].p90Hours, res[0].wowP50Hours, res[0].wowP90Hours]).toEqual([null, null, null, null]);
    expect(res[0].runs.every((r) => r.censored && r.durationHours === null)).toBe(true);
  });

  it('waits for the first go-start at or after t: a go-start on the 3rd at 00:00 gives D = 48 + 10 + 20 h', () => {
    const third = new Uint8Array(n);
    times.forEach((t, i) => {
      const d = new Date(t);
      if (d.getUTCDate() === 3 && d.getUTCHours() === 0) third[i] = 1;
    });
    // The July start of two steps, each given by its go-start flags and TPOP (h).
    const july = (...steps: [Uint8Array, number][]) =>
      simulateCampaign(
        times,
        HOUR,
        steps.map(([goStart, tpopH]) => ({ goStart, tpopH })),
        { startMonths: [7] },
      )[0];
    const r = july([third, 10], [always, 20]);
    expect([r.p50Hours, r.wowP50Hours, r.p90Hours, r.wowP90Hours]).toEqual([78, 48, 78, 48]);
    // Second step first: always at start (0-20 h), then the 3rd 00:00 (48 h) + 10 h.
    const q = july([always, 20], [third, 10]);
    expect(q.p50Hours).toBe(58);
    expect(q.wowP50Hours).toBe(28);
  });

  it('a step at another worksite with its own 3-hourly axis', () => {
    const t3 = Float64Array.from({ length: Math.floor(n / 3) }, (_, i) => times[0] + i * 3 * HOUR);
    const [r] = simulateCampaign(
      times,
      HOUR,
      [
        { goStart: always, tpopH: 10 },
        { goStart: new Uint8Array(t3.length).fill(1), tpopH: 20, timeMs: t3 },
      ],
      { startMonths: [2] },
    );
    // Step 1 ends at 10 h; the next 3-hourly go-start is at 12 h; + 20 h = 32 h.
    expect(r.p50Hours).toBe(32);
    expect(r.wowP50Hours).toBe(2);
  });

  it('start dates in a time zone: starts before the data are skipped', () => {
    const [jan] = simulateCampaign(times, HOUR, [{ goStart: always, tpopH: 5 }], { startMonths: [1], timeZone: 'Europe/Oslo' });
    // 2001-01-01 00:00 in Oslo is 2000-12-31 23:00 UTC, before the first record: skipped.
    // 2004-01-01 00:00 in Oslo is 2003-12-31 23:00 UTC, the last record: inside the data.
    expect(jan.runs.map((r) => r.year)).toEqual([2002, 2003, 2004]);
    expect(jan.runs[0].startMs).toBe(Date.UTC(2001, 11, 31, 23));
    // The first record at or after 23:00 UTC is 23:00 itself.
    expect(jan.p50Hours).toBe(5);
  });

  it('percentiles over the non-censored years match d3-array quantile (R-7, reference library)', () => {
    const axis = hourlyAxis(2001, 2010);
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 27 * 24 }), { minLength: 120, maxLength: 120 }),
        fc.integer({ min: 1, max: 12 }),
        (delays, month) => {
          // One go-start a month, `delay` hours after the 1st 00:00 UTC; none in December 2010, so a
          // December start in 2010 is censored.
          const flags = new Uint8Array(axis.length);
          delays.forEach((delay, k) => {
            const y = 2001 + Math.floor(k / 12);
            const m = k % 12;
            if (y === 2010 && m === 11) return;
            flags[(Date.UTC(y, m, 1) - axis[0]) / HOUR + delay] = 1;
          });
          const [r] = simulateCampaign(axis, HOUR, [{ goStart: flags, tpopH: 6 }], { startMonths: [month] });
          const expected: number[] = [];
          const censored: number[] = [];
          for (let y = 2001; y <= 2010; y++) {
            if (y === 2010 && month === 12) censored.push(y);
            else expected.push(delays[(y - 2001) * 12 + month - 1] + 6);
          }
          expect(r.censoredYears).toEqual(censored);
          expect(r.years).toBe(10);
          expect(r.p50Hours).toBeCloseTo(quantile(expected, 0.5) as number, 9);
          expect(r.p90Hours).toBeCloseTo(quantile(expected, 0.9) as number, 9);
          expect(r.wowP90Hours).toBeCloseTo((quantile(expected, 0.9) as number) - 6, 9);
        },
      ),
      { numRuns: 100 },
    );
  });

  it('rejects no steps, bad TPOP, bad months and mismatched lengths', () => {
    expect(() => simulateCampaign(times, HOUR, [])).toThrow(RangeError);
    expect(() => simulateCampaign(times, HOUR, [{ goStart: always, tpopH: 0 }])).toThrow(RangeError);
    expect(() => simulateCampaign(times, HOUR, [{ goStart: always, tpopH: 1 }], { startMonths: [13] })).toThrow(RangeError);
    expect(() => simulateCampaign(times, HOUR, [{ goStart: new Uint8Array(5), tpopH: 1 }])).toThrow(RangeError);
  });
});
