import { quantile } from 'd3-array';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  hindcastYearShifts,
  outlookPercentiles,
  outlookStart,
  simulateCampaign,
  simulateOutlook,
  type OutlookForecastMember,
} from '../../shared/engine';
import { mulberry32 } from '../../bench/lib/random';

const HOUR = 3_600_000;

/** Hourly UTC axis from `fromYear`-01-01 00:00 to the end of `toYear`. */
function hourlyAxis(fromYear: number, toYear: number): Float64Array {
  const t0 = Date.UTC(fromYear, 0, 1);
  const n = (Date.UTC(toYear + 1, 0, 1) - t0) / HOUR;
  return Float64Array.from({ length: n }, (_, i) => t0 + i * HOUR);
}

interface BruteSample {
  year: number;
  finishMs: number | null;
}

/**
 * The outlook the slow, obvious way (written from the rule, not from the engine): scan
 * forward record by record for the first go-start at or after t in the forecast; when there is
 * none, take the hindcast year at the same calendar time (UTC month, day, hour) from
 * max(t, forecast end) and scan the hindcast record by record, continuing into the next year.
 */
function bruteForce(
  startMs: number,
  tpopH: number[],
  forecast: { timeMs: Float64Array; endMs: number; flags: Uint8Array[] } | null,
  hind: { timeMs: Float64Array; stepMs: number; flags: Uint8Array[] },
): BruteSample[] {
  let t = startMs;
  let k = 0;
  if (forecast) {
    for (; k < tpopH.length; k++) {
      let found = -1;
      for (let i = 0; i < forecast.timeMs.length; i++) {
        if (forecast.timeMs[i] >= t && forecast.flags[k][i] === 1) {
          found = i;
          break;
        }
      }
      if (found < 0) break;
      t = forecast.timeMs[found] + tpopH[k] * HOUR;
    }
  }
  const handover = k === tpopH.length ? t : forecast ? Math.max(t, forecast.endMs) : t;
  const d = new Date(handover);
  const first = hind.timeMs[0];
  const end = hind.timeMs[hind.timeMs.length - 1] + hind.stepMs;
  const out: BruteSample[] = [];
  for (let year = new Date(first).getUTCFullYear(); year <= new Date(end).getUTCFullYear(); year++) {
    const mapped = Date.UTC(year, d.getUTCMonth(), d.getUTCDate(), d.getUTCHours(), d.getUTCMinutes());
    if (mapped < first || mapped >= end) continue;
    if (k === tpopH.length) {
      out.push({ year, finishMs: t });
      continue;
    }
    let tau = mapped;
    let censored = false;
    for (let s = k; s < tpopH.length; s++) {
      let found = -1;
      for (let i = 0; i < hind.timeMs.length; i++) {
        if (hind.timeMs[i] >= tau && hind.flags[s][i] === 1) {
          found = i;
          break;
        }
      }
      if (found < 0) {
        censored = true;
        break;
      }
      tau = hind.timeMs[found] + tpopH[s] * HOUR;
    }
    out.push({ year, finishMs: censored ? null : tau - (mapped - handover) });
  }
  return out;
}

describe('simulateOutlook against a brute-force simulation (issue 21 rule; docs/domain.md#campaigns)', () => {
  // A three-year hindcast and a five-day forecast from 2027-10-20 00:00 UTC.
  const hindTimes = hourlyAxis(2001, 2003);
  const fcStart = Date.UTC(2027, 9, 20);
  const fcTimes = Float64Array.from({ length: 5 * 24 }, (_, i) => fcStart + i * HOUR);

  it('gives each sample the brute-force finish, and type-7 percentiles equal to d3-array quantile (reference library)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 2 ** 31 - 1 }),
        fc.array(fc.integer({ min: 1, max: 40 }), { minLength: 1, maxLength: 3 }),
        fc.integer({ min: 0, max: 60 }),
        fc.boolean(),
        (seed, tpopH, nowOffsetH, withForecast) => {
          const r = mulberry32(seed);
          // Sparse go-starts (about 1 in 60 hours in the hindcast, 1 in 30 in the forecast); none in
          // the hindcast's last two months for the last step, so late samples are censored.
          const hindFlags = tpopH.map((_, s) =>
            Uint8Array.from(hindTimes, (t) => (r() < 1 / 60 && !(s === tpopH.length - 1 && t >= Date.UTC(2003, 10, 1)) ? 1 : 0)),
          );
          const fcFlags = tpopH.map(() => Uint8Array.from(fcTimes, () => (r() < 1 / 30 ? 1 : 0)));
          const nowMs = fcStart + nowOffsetH * HOUR + 17 * 60_000; // not on a record
          const member: OutlookForecastMember = {
            label: 'forecast',
            timeMs: fcTimes,
            endMs: fcTimes[fcTimes.length - 1] + HOUR,
            goStart: fcFlags,
          };
          const samples = simulateOutlook({
            startMs: nowMs,
            tpopH,
            members: withForecast ? [member] : [],
            hindcast: { timeMs: hindTimes, stepMs: HOUR, goStart: hindFlags },
          });
          const brute = bruteForce(nowMs, tpopH, withForecast ? { timeMs: fcTimes, endMs: member.endMs, flags: fcFlags } : null, {
            timeMs: hindTimes,
            stepMs: HOUR,
            flags: hindFlags,
          });
          expect(samples.map((s) => [s.year, s.finishMs])).toEqual(brute.map((b) => [b.year, b.finishMs]));
          for (const s of samples) expect(s.censored).toBe(s.finishMs === null);

          const finished = brute.filter((b) => b.finishMs !== null).map((b) => b.finishMs as number);
          const p = outlookPercentiles(samples, tpopH.length);
          expect(p.samples).toBe(brute.length);
          expect(p.censored).toBe(brute.length - finished.length);
          if (finished.length === 0) {
            expect(p.finishMs).toBeNull();
          } else {
            expect(p.finishMs!.p10).toBeCloseTo(quantile(finished, 0.1) as number, 3);
            expect(p.finishMs!.p50).toBeCloseTo(quantile(finished, 0.5) as number, 3);
            expect(p.finishMs!.p90).toBeCloseTo(quantile(finished, 0.9) as number, 3);
            const sum = tpopH.reduce((a, b) => a + b, 0);
            const wow = finished.map((f) => (f - nowMs) / HOUR - sum);
            expect(p.remainingWowHours!.p50).toBeCloseTo(quantile(wow, 0.5) as number, 6);
            expect(p.remainingWowHours!.p90).toBeCloseTo(quantile(wow, 0.9) as number, 6);
          }
        },
      ),
      { numRuns: 40 },
    );
  });

  it('with an all-calm forecast longer than the remaining work, every sample finishes at now + the sum of TPOP and P10 = P50 = P90', () => {
    const calm = [new Uint8Array(fcTimes.length).fill(1), new Uint8Array(fcTimes.length).fill(1)];
    const stormy = [new Uint8Array(hindTimes.length), new Uint8Array(hindTimes.length)];
    const nowMs = fcStart + 3 * HOUR; // on a record: the first go-start is now
    const samples = simulateOutlook({
      startMs: nowMs,
      tpopH: [12, 30],
      members: [{ label: 'forecast', timeMs: fcTimes, endMs: fcTimes[fcTimes.length - 1] + HOUR, goStart: calm }],
      hindcast: { timeMs: hindTimes, stepMs: HOUR, goStart: stormy },
    });
    // One sample per hindcast year: 2001, 2002, 2003 (2027-10-21 maps inside each).
    expect(samples.map((s) => s.year)).toEqual([2001, 2002, 2003]);
    for (const s of samples) {
      expect(s.finishMs).toBe(nowMs + 42 * HOUR);
      expect(s.stepStartMs).toEqual([nowMs, nowMs + 12 * HOUR]);
      expect(s.wowHours).toBe(0);
    }
    const p = outlookPercentiles(samples, 2);
    expect(p.finishMs).toEqual({ p10: nowMs + 42 * HOUR, p50: nowMs + 42 * HOUR, p90: nowMs + 42 * HOUR });
    expect(p.censored).toBe(0);
  });

  it('with no forecast, equals the hindcast-only campaign simulation started at the current time (simulateCampaign, a separate function)', () => {
    const r = mulberry32(7);
    const flags = [Uint8Array.from(hindTimes, () => (r() < 0.02 ? 1 : 0)), Uint8Array.from(hindTimes, () => (r() < 0.01 ? 1 : 0))];
    // Now is the 1st of March at 00:00 UTC of a future year: the start date simulateCampaign uses.
    const nowMs = Date.UTC(2027, 2, 1);
    const samples = simulateOutlook({
      startMs: nowMs,
      tpopH: [8, 20],
      members: [],
      hindcast: { timeMs: hindTimes, stepMs: HOUR, goStart: flags },
    });
    const [march] = simulateCampaign(
      hindTimes,
      HOUR,
      [
        { goStart: flags[0], tpopH: 8 },
        { goStart: flags[1], tpopH: 20 },
      ],
      { startMonths: [3] },
    );
    expect(samples.map((s) => s.year)).toEqual(march.runs.map((x) => x.year));
    samples.forEach((s, i) => {
      const run = march.runs[i];
      expect(s.censored).toBe(run.censored);
      expect(s.finishMs === null ? null : (s.finishMs - nowMs) / HOUR).toBe(run.durationHours);
      expect(s.wowHours).toBe(run.wowHours);
    });
  });

  it('hands over to the hindcast at the forecast end when the forecast has no go-start, and maps 29 February to 1 March', () => {
    const none = [new Uint8Array(fcTimes.length)];
    const always = [new Uint8Array(hindTimes.length).fill(1)];
    const endMs = fcTimes[fcTimes.length - 1] + HOUR;
    const samples = simulateOutlook({
      startMs: fcStart,
      tpopH: [5],
      members: [{ label: 'forecast', timeMs: fcTimes, endMs, goStart: none }],
      hindcast: { timeMs: hindTimes, stepMs: HOUR, goStart: always },
    });
    for (const s of samples) {
      expect(s.stepStartMs).toEqual([endMs]);
      expect(s.stepsInForecast).toBe(0);
    }
    const leap = Date.UTC(2028, 1, 29, 6);
    expect(hindcastYearShifts(leap, hindTimes, HOUR).map((x) => new Date(leap + x.shiftMs).toISOString())).toEqual([
      '2001-03-01T06:00:00.000Z',
      '2002-03-01T06:00:00.000Z',
      '2003-03-01T06:00:00.000Z',
    ]);
  });
});

describe('outlookStart: where the remaining work starts', () => {
  const now = Date.UTC(2027, 5, 10, 12);
  it('marking step 1 done moves every sample to step 2 from its actual end (never before now)', () => {
    expect(outlookStart([], [10, 20, 30], now)).toEqual({ firstIndex: 0, startMs: now });
    const doneAt = now;
    expect(outlookStart([{ status: 'done', startedMs: now - 15 * HOUR, doneMs: doneAt }], [10, 20, 30], now)).toEqual({
      firstIndex: 1,
      startMs: doneAt,
    });
    // Ended yesterday: step 2 has not started since, so it can start from now.
    expect(outlookStart([{ status: 'done', startedMs: null, doneMs: now - 24 * HOUR }], [10, 20, 30], now)).toEqual({
      firstIndex: 1,
      startMs: now,
    });
    // The engine's own rule for an end later than the clock (e.g. a clock behind): the actual end.
    expect(outlookStart([{ status: 'done', startedMs: null, doneMs: now + 2 * HOUR }], [10, 20, 30], now)).toEqual({
      firstIndex: 1,
      startMs: now + 2 * HOUR,
    });

    // Every sample's step-2 start is then its first go-start at or after the actual end.
    const times = hourlyAxis(2001, 2002);
    const flags = Uint8Array.from(times, (_, i) => (i % 37 === 0 ? 1 : 0));
    const { firstIndex, startMs } = outlookStart([{ status: 'done', startedMs: null, doneMs: now + 2 * HOUR }], [10, 20], now);
    const samples = simulateOutlook({
      startMs,
      tpopH: [20].slice(firstIndex - 1),
      members: [],
      hindcast: { timeMs: times, stepMs: HOUR, goStart: [flags] },
    });
    for (const s of samples) {
      // The same calendar time in the sample's year: the first go-start at or after it.
      const mapped = Date.UTC(s.year, 5, 10, 14);
      const i0 = times.findIndex((t) => t >= mapped);
      let j = i0;
      while (flags[j] !== 1) j++;
      expect(s.stepStartMs[0]).toBe(startMs + (times[j] - mapped));
    }
  });

  it('a step under way is assumed to run on: the next step starts no earlier than its start + TPOP', () => {
    expect(
      outlookStart(
        [
          { status: 'done', startedMs: null, doneMs: now - 48 * HOUR },
          { status: 'started', startedMs: now - 5 * HOUR, doneMs: null },
        ],
        [10, 20, 30],
        now,
      ),
    ).toEqual({
      firstIndex: 2,
      startMs: now + 15 * HOUR,
    });
  });
});
