// Cross-check of go-starts, windows and monthly statistics against a brute-force implementation
// written here independently (naive loops, months from Date / TZDate objects, percentiles from
// d3-array's quantile, a general-purpose reference library), over random series with gaps and
// missing values (fast-check).
import { TZDate } from '@date-fns/tz';
import { quantile } from 'd3-array';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { STATUS, calendarIndex, goStarts, monthlyStatistics, workableRuns, type MonthStatisticsBase } from '../../shared/engine';
import { monthlyStatisticsWithGoStarts } from '../../shared/engine/monthly-statistics';

const MIN = 60_000;
const HOUR = 60 * MIN;

interface Sample {
  times: number[];
  status: number[];
  dtMs: number;
  trMin: number;
}

/**
 * Random series: a regular step with a few 1.5-step spacings (still consecutive), longer gaps
 * (break runs) and long gaps of days to months (so several months and years are covered);
 * statuses drawn with workable most likely, plus marginal, not workable and no data.
 */
function sampleArb(dtMs: number, maxLength: number, longGapDays: number, wholeSteps = false): fc.Arbitrary<Sample> {
  const spacing = fc.oneof(
    { weight: 30, arbitrary: fc.constant(1) },
    { weight: wholeSteps ? 0 : 2, arbitrary: fc.constant(1.5) },
    { weight: 2, arbitrary: fc.constant(2) },
    { weight: 1, arbitrary: fc.integer({ min: 3, max: 30 }) },
    { weight: 1, arbitrary: fc.integer({ min: 1, max: longGapDays }).map((d) => (d * 24 * HOUR) / dtMs) },
  );
  const status = fc.oneof(
    { weight: 8, arbitrary: fc.constant(STATUS.WORKABLE) },
    { weight: 2, arbitrary: fc.constant(STATUS.NOT_WORKABLE) },
    { weight: 1, arbitrary: fc.constant(STATUS.MARGINAL) },
    { weight: 1, arbitrary: fc.constant(STATUS.NO_DATA) },
  );
  return fc
    .record({
      start: fc.integer({ min: 0, max: 365 * 24 * 6 }).map((k) => Date.UTC(2001, 0, 1) + k * 10 * MIN),
      rows: fc.array(fc.tuple(spacing, status), { minLength: 1, maxLength }),
      trMin: fc.integer({ min: 10, max: (8 * dtMs) / MIN }),
    })
    .map(({ start, rows, trMin }) => {
      const times: number[] = [];
      let t = start;
      for (const [k] of rows) {
        times.push(t);
        t += k * dtMs;
      }
      return { times, status: rows.map((r) => r[1]), dtMs, trMin };
    });
}

// The local step rule, written out naively from its statement (docs/domain.md#weather-windows,
// #convention-9, #convention-10): a stretch is a run of at least 3 equal spacings; a spacing outside
// any stretch is a gap when it is longer than 1.5 times the step on both sides of it (the nearest
// stretch before and after; one side missing: the other side's step; none at all: the series'
// fallback step dt); record i covers [t_i, t_i + dt_i), dt_i the step of the spacing after it (the
// step before for jitter and gaps; the last record the step of the spacing before it, or after a
// final gap the step after that gap); TR is measured in time.

function spacing(s: Sample, i: number): number {
  return s.times[i + 1] - s.times[i];
}

/** Spacing i is one of at least 3 consecutive equal spacings. */
function inStretch(s: Sample, i: number): boolean {
  const m = s.times.length - 1;
  for (let a = i - 2; a <= i; a++) {
    if (a < 0 || a + 2 >= m) continue;
    if (spacing(s, a) === spacing(s, a + 1) && spacing(s, a + 1) === spacing(s, a + 2)) return true;
  }
  return false;
}

function stepBefore(s: Sample, i: number): number | null {
  for (let j = i - 1; j >= 0; j--) if (inStretch(s, j)) return spacing(s, j);
  return null;
}

function stepAfter(s: Sample, i: number): number | null {
  for (let j = i + 1; j < s.times.length - 1; j++) if (inStretch(s, j)) return spacing(s, j);
  return null;
}

/** The steps on both sides of spacing i (for a spacing outside any stretch). */
function sides(s: Sample, i: number): [number, number] {
  const b = stepBefore(s, i);
  const a = stepAfter(s, i);
  return [b ?? a ?? s.dtMs, a ?? b ?? s.dtMs];
}

function isGap(s: Sample, i: number): boolean {
  if (inStretch(s, i)) return false;
  const [b, a] = sides(s, i);
  return spacing(s, i) > 1.5 * b && spacing(s, i) > 1.5 * a;
}

function durationOf(s: Sample, i: number): number {
  const n = s.times.length;
  if (n === 1) return s.dtMs;
  if (i < n - 1) return inStretch(s, i) ? spacing(s, i) : sides(s, i)[0];
  return isGap(s, n - 2) ? sides(s, n - 2)[1] : durationOf(s, n - 2);
}

function consecutive(s: Sample, i: number): boolean {
  // Record i continues record i - 1 unless the spacing between them is a gap.
  return !isGap(s, i - 1);
}

function bruteGoStarts(s: Sample): number[] {
  const trMs = s.trMin * MIN;
  return s.times.map((_, i) => {
    let covered = 0;
    for (let k = i; k < s.times.length; k++) {
      if (s.status[k] !== STATUS.WORKABLE) return 0;
      if (k > i && !consecutive(s, k)) return 0;
      covered += durationOf(s, k);
      if (covered >= trMs) return 1;
    }
    return 0;
  });
}

interface BruteWindow {
  start: number;
  count: number;
}

function bruteRuns(s: Sample): BruteWindow[] {
  const runs: BruteWindow[] = [];
  let i = 0;
  while (i < s.times.length) {
    if (s.status[i] !== STATUS.WORKABLE) {
      i++;
      continue;
    }
    let j = i + 1;
    while (j < s.times.length && s.status[j] === STATUS.WORKABLE && consecutive(s, j)) j++;
    runs.push({ start: i, count: j - i });
    i = j;
  }
  return runs;
}

/** Year and month (1-12) of record i. */
type Key = (s: Sample, i: number) => { year: number; month: number };

function bruteMonthly(s: Sample, keyOf: Key) {
  const starts = bruteGoStarts(s);
  const lengthMs = (r: BruteWindow) => {
    let sum = 0;
    for (let k = r.start; k < r.start + r.count; k++) sum += durationOf(s, k);
    return sum;
  };
  const windows = bruteRuns(s).filter((r) => lengthMs(r) >= s.trMin * MIN);
  const groups = new Map<string, { year: number; month: number; idx: number[] }>();
  s.times.forEach((_, i) => {
    const { year, month } = keyOf(s, i);
    const k = `${year}-${month}`;
    if (!groups.has(k)) groups.set(k, { year, month, idx: [] });
    groups.get(k)!.idx.push(i);
  });
  const wowOf = (i: number): number | null => {
    for (let j = i; j < s.times.length; j++) if (starts[j]) return (s.times[j] - s.times[i]) / HOUR;
    return null;
  };
  const summarise = (idx: number[], wins: BruteWindow[], years: number) => {
    const withData = idx.filter((i) => s.status[i] !== STATUS.NO_DATA).length;
    // Shares weight each record by its duration.
    const timeOf = (keep: (i: number) => boolean) => idx.filter(keep).reduce((a, i) => a + durationOf(s, i), 0);
    const withDataMs = timeOf((i) => s.status[i] !== STATUS.NO_DATA);
    const workableMs = timeOf((i) => s.status[i] === STATUS.WORKABLE);
    const goStartMs = timeOf((i) => starts[i] === 1);
    const wows = idx.map(wowOf);
    const ok = wows.filter((w): w is number => w !== null);
    return {
      records: idx.length,
      recordsWithData: withData,
      workability: withData ? workableMs / withDataMs : null,
      goStartShare: withData ? goStartMs / withDataMs : null,
      wowMeanHours: ok.length ? ok.reduce((a, b) => a + b, 0) / ok.length : null,
      wowP90Hours: ok.length ? (quantile(ok, 0.9) as number) : null,
      censored: wows.length - ok.length,
      windows: wins.length,
      windowsPerMonth: years ? wins.length / years : null,
      meanWindowHours: wins.length ? wins.reduce((a, w) => a + lengthMs(w) / HOUR, 0) / wins.length : null,
    };
  };
  const yearMonths = [...groups.values()]
    .sort((a, b) => a.year * 12 + a.month - (b.year * 12 + b.month))
    .map((g) => ({
      year: g.year,
      month: g.month,
      ...summarise(
        g.idx,
        windows.filter((w) => {
          const k = keyOf(s, w.start);
          return k.year === g.year && k.month === g.month;
        }),
        1,
      ),
    }));
  const months = Array.from({ length: 12 }, (_, m0) => {
    const month = m0 + 1;
    const idx = s.times.map((_, i) => i).filter((i) => keyOf(s, i).month === month);
    const years = new Set(idx.map((i) => keyOf(s, i).year)).size;
    return {
      month,
      years,
      ...summarise(
        idx,
        windows.filter((w) => keyOf(s, w.start).month === month),
        years,
      ),
    };
  });
  return { months, yearMonths };
}

const utcKey: Key = (s, i) => {
  const d = new Date(s.times[i]);
  return { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1 };
};
const osloKey: Key = (s, i) => {
  const d = new TZDate(s.times[i], 'Europe/Oslo');
  return { year: d.getFullYear(), month: d.getMonth() + 1 };
};

function expectStatsClose(got: MonthStatisticsBase, want: Omit<MonthStatisticsBase, 'month'> & { month: number }): void {
  for (const k of ['month', 'records', 'recordsWithData', 'censored', 'windows'] as const) expect(got[k], k).toBe(want[k]);
  for (const k of ['workability', 'goStartShare', 'wowMeanHours', 'wowP90Hours', 'windowsPerMonth', 'meanWindowHours'] as const) {
    if (want[k] === null) expect(got[k], k).toBeNull();
    else expect(got[k], k).toBeCloseTo(want[k] as number, 9);
  }
}

describe('go-starts and workable runs against brute force', () => {
  it('hourly series with gaps, any TR', () => {
    fc.assert(
      fc.property(sampleArb(HOUR, 120, 3), (s) => {
        const times = Float64Array.from(s.times);
        const status = Uint8Array.from(s.status);
        expect(Array.from(goStarts(times, status, s.dtMs, s.trMin / 60))).toEqual(bruteGoStarts(s));
        expect(workableRuns(times, status, s.dtMs).map((r) => ({ start: r.startIndex, count: r.count }))).toEqual(bruteRuns(s));
        for (const r of workableRuns(times, status, s.dtMs)) {
          let sum = 0;
          for (let k = r.startIndex; k < r.startIndex + r.count; k++) sum += durationOf(s, k);
          expect(r.endMs).toBe(s.times[r.startIndex] + sum);
        }
      }),
      { numRuns: 400 },
    );
  });

  it('10-minute series', () => {
    fc.assert(
      fc.property(sampleArb(10 * MIN, 120, 1), (s) => {
        expect(Array.from(goStarts(Float64Array.from(s.times), Uint8Array.from(s.status), s.dtMs, s.trMin / 60))).toEqual(bruteGoStarts(s));
      }),
      { numRuns: 200 },
    );
  });
});

describe('monthlyStatistics against brute force', () => {
  for (const [zone, keyOf] of [
    ['UTC', utcKey],
    ['Europe/Oslo', osloKey],
  ] as const) {
    it(`6-hourly series over months and years, months in ${zone}`, () => {
      fc.assert(
        fc.property(sampleArb(6 * HOUR, 500, 120), (s) => {
          const times = Float64Array.from(s.times);
          const status = Uint8Array.from(s.status);
          const trH = s.trMin / 60;
          const gs = goStarts(times, status, s.dtMs, trH);
          const calendar = calendarIndex(times, zone);
          const got = monthlyStatistics(times, status, gs, s.dtMs, calendar, trH);
          const want = bruteMonthly(s, keyOf);
          // The fused variant finds the go-starts itself and must agree everywhere.
          const found = new Uint8Array(times.length).fill(9);
          expect(monthlyStatisticsWithGoStarts(times, status, found, s.dtMs, calendar, trH)).toEqual(got);
          expect(Array.from(found)).toEqual(bruteGoStarts(s));
          expect(got.months).toHaveLength(12);
          got.months.forEach((m, i) => {
            expectStatsClose(m, want.months[i]);
            expect(m.years).toBe(want.months[i].years);
          });
          expect(got.yearMonths.map((y) => [y.year, y.month])).toEqual(want.yearMonths.map((y) => [y.year, y.month]));
          got.yearMonths.forEach((y, i) => expectStatsClose(y, want.yearMonths[i]));
        }),
        { numRuns: 150 },
      );
    });
  }

  /** The engine's monthly statistics of a sample (UTC months) beside the brute force's. */
  const engineAndBruteUtc = (s: Sample) => {
    const times = Float64Array.from(s.times);
    const status = Uint8Array.from(s.status);
    const trH = s.trMin / 60;
    const got = monthlyStatistics(times, status, goStarts(times, status, s.dtMs, trH), s.dtMs, calendarIndex(times, 'UTC'), trH);
    return { got, want: bruteMonthly(s, utcKey) };
  };

  it('hourly series with long runs (several windows a month)', () => {
    fc.assert(
      fc.property(sampleArb(HOUR, 1500, 20), (s) => {
        const { got, want } = engineAndBruteUtc(s);
        got.months.forEach((m, i) => expectStatsClose(m, want.months[i]));
      }),
      { numRuns: 60 },
    );
  });

  // Times a whole number of steps apart: the waits are kept as ramps of whole steps, not per
  // record (monthly-statistics.ts); the same brute force must hold, year-months included.
  it('hourly series on a grid of whole steps (gaps of whole steps only)', () => {
    fc.assert(
      fc.property(sampleArb(HOUR, 1500, 20, true), (s) => {
        const { got, want } = engineAndBruteUtc(s);
        got.months.forEach((m, i) => expectStatsClose(m, want.months[i]));
        expect(got.yearMonths.map((y) => [y.year, y.month])).toEqual(want.yearMonths.map((y) => [y.year, y.month]));
        got.yearMonths.forEach((y, i) => expectStatsClose(y, want.yearMonths[i]));
      }),
      { numRuns: 80 },
    );
  });

  it('any calendar, also one that does not ascend with time (hand-made groups)', () => {
    fc.assert(
      fc.property(
        sampleArb(HOUR, 300, 2).chain((s) =>
          fc.tuple(
            fc.constant(s),
            fc.array(fc.integer({ min: 2001 * 12, max: 2001 * 12 + 30 }), { minLength: s.times.length, maxLength: s.times.length }),
          ),
        ),
        ([s, yms]) => {
          const times = Float64Array.from(s.times);
          const status = Uint8Array.from(s.status);
          const trH = s.trMin / 60;
          const calendar = { timeZone: 'UTC', yearMonth: Int32Array.from(yms), month: Uint8Array.from(yms, (v) => v % 12) };
          const got = monthlyStatistics(times, status, goStarts(times, status, s.dtMs, trH), s.dtMs, calendar, trH);
          const found = new Uint8Array(times.length);
          expect(monthlyStatisticsWithGoStarts(times, status, found, s.dtMs, calendar, trH)).toEqual(got);
          expect(Array.from(found)).toEqual(bruteGoStarts(s));
          const key: Key = (_, i) => ({ year: Math.floor(yms[i] / 12), month: (yms[i] % 12) + 1 });
          const want = bruteMonthly(s, key);
          got.months.forEach((m, i) => expectStatsClose(m, want.months[i]));
          expect(got.yearMonths.map((y) => [y.year, y.month])).toEqual(want.yearMonths.map((y) => [y.year, y.month]));
          got.yearMonths.forEach((y, i) => expectStatsClose(y, want.yearMonths[i]));
        },
      ),
      { numRuns: 100 },
    );
  });
});

/**
 * Random series that change step: stretches of 10 min, 1 h, 3 h or 6 h (as forecasts that are
 * hourly, then 3-hourly, and hindcasts 3-hourly early and hourly later), each with a few jitter
 * spacings and gaps; statuses mostly workable.
 */
function mixedStepArb(maxStretches: number): fc.Arbitrary<Sample> {
  const status = fc.oneof(
    { weight: 10, arbitrary: fc.constant(STATUS.WORKABLE) },
    { weight: 1, arbitrary: fc.constant(STATUS.NOT_WORKABLE) },
    { weight: 1, arbitrary: fc.constant(STATUS.MARGINAL) },
    { weight: 1, arbitrary: fc.constant(STATUS.NO_DATA) },
  );
  const spacing = fc.oneof(
    { weight: 40, arbitrary: fc.constant(1) },
    { weight: 1, arbitrary: fc.constant(1.5) },
    { weight: 1, arbitrary: fc.constant(2) },
    { weight: 1, arbitrary: fc.integer({ min: 3, max: 40 }) },
  );
  const stretch = fc.record({
    stepMs: fc.constantFrom(10 * MIN, HOUR, 3 * HOUR, 6 * HOUR),
    rows: fc.array(fc.tuple(spacing, status), { minLength: 1, maxLength: 60 }),
  });
  return fc
    .record({
      start: fc.integer({ min: 0, max: 365 * 24 }).map((k) => Date.UTC(2010, 0, 1) + k * HOUR),
      stretches: fc.array(stretch, { minLength: 1, maxLength: maxStretches }),
      trMin: fc.integer({ min: 10, max: 48 * 60 }),
    })
    .map(({ start, stretches, trMin }) => {
      const times: number[] = [];
      const statuses: number[] = [];
      let t = start;
      for (const st of stretches) {
        for (const [k, code] of st.rows) {
          times.push(t);
          statuses.push(code);
          t += k * st.stepMs;
        }
      }
      return { times, status: statuses, dtMs: stretches[0].stepMs, trMin };
    });
}

describe('series that change step: local step rule against brute force', () => {
  it('go-starts, runs (lengths as sums of durations) and usable windows', () => {
    fc.assert(
      fc.property(mixedStepArb(5), (s) => {
        const times = Float64Array.from(s.times);
        const status = Uint8Array.from(s.status);
        expect(Array.from(goStarts(times, status, s.dtMs, s.trMin / 60))).toEqual(bruteGoStarts(s));
        const runs = workableRuns(times, status, s.dtMs);
        expect(runs.map((r) => ({ start: r.startIndex, count: r.count }))).toEqual(bruteRuns(s));
        for (const r of runs) {
          let sum = 0;
          for (let k = r.startIndex; k < r.startIndex + r.count; k++) sum += durationOf(s, k);
          expect(r.endMs).toBe(s.times[r.startIndex] + sum);
          expect(r.hours).toBeCloseTo(sum / HOUR, 9);
        }
      }),
      { numRuns: 400 },
    );
  });

  it('monthly statistics (shares weighted by duration) over series 3-hourly early and hourly later', () => {
    fc.assert(
      fc.property(mixedStepArb(8), (s) => {
        const times = Float64Array.from(s.times);
        const status = Uint8Array.from(s.status);
        const trH = s.trMin / 60;
        const calendar = calendarIndex(times, 'UTC');
        const got = monthlyStatistics(times, status, goStarts(times, status, s.dtMs, trH), s.dtMs, calendar, trH);
        const found = new Uint8Array(times.length);
        expect(monthlyStatisticsWithGoStarts(times, status, found, s.dtMs, calendar, trH)).toEqual(got);
        const want = bruteMonthly(s, utcKey);
        got.months.forEach((m, i) => expectStatsClose(m, want.months[i]));
        got.yearMonths.forEach((y, i) => expectStatsClose(y, want.yearMonths[i]));
      }),
      { numRuns: 150 },
    );
  });

  it('hand case: hourly to +72 h then 3-hourly to +240 h, all workable: one run, one window of 243 h', () => {
    const t0 = Date.UTC(2026, 11, 1);
    const times: number[] = [];
    for (let h = 0; h <= 72; h++) times.push(t0 + h * HOUR);
    for (let h = 75; h <= 240; h += 3) times.push(t0 + h * HOUR);
    const status = new Uint8Array(times.length).fill(STATUS.WORKABLE);
    const runs = workableRuns(Float64Array.from(times), status, HOUR);
    // 73 hourly records (0..72, the record at 72 h lasting 3 h up to the next one) and 56 3-hourly
    // records (75..240 h), the last lasting 3 h: covered [0, 243 h).
    expect(runs).toHaveLength(1);
    expect(runs[0].hours).toBe(243);
    // TR 30 h: go-starts up to 213 h (the record at 213 h covers [213, 243)); none after.
    const gs = goStarts(Float64Array.from(times), status, HOUR, 30);
    const last = times[gs.lastIndexOf(1)];
    expect((last - t0) / HOUR).toBe(213);
  });
});
