// monthlyStatisticsWithGoStarts on a series of one step throughout takes a shortcut (whole records
// instead of ms, stretches of equal status instead of single records; monthly-statistics.ts). Here
// it is held to the general record-by-record path (itself checked against a naive implementation
// of docs/domain.md#hindcast-statistics in brute-force.test.ts): the same go-starts and every
// statistic exactly equal, on random series whose statuses come in stretches of random lengths
// (long workable runs, short ones, missing data), with random TR, in UTC and in a zone with summer
// time. No outside figures here: the reference is the general path of this engine.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { STATUS, calendarIndex, createStatisticsScratch } from '../../shared/engine';
import { monthlyStatisticsGeneralPath, monthlyStatisticsWithGoStarts } from '../../shared/engine/monthly-statistics';

const MIN = 60_000;
const HOUR = 60 * MIN;

const statusArb = fc.constantFrom(STATUS.WORKABLE, STATUS.WORKABLE, STATUS.MARGINAL, STATUS.NOT_WORKABLE, STATUS.NO_DATA);

/** Statuses in stretches: a status and how many records in a row have it (1 to 400). */
function statusesArb(maxStretches: number): fc.Arbitrary<Uint8Array> {
  return fc
    .array(fc.tuple(statusArb, fc.oneof(fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 400 }))), {
      minLength: 1,
      maxLength: maxStretches,
    })
    .map((stretches) => Uint8Array.from(stretches.flatMap(([st, k]) => Array<number>(k).fill(st))));
}

function checkSame(stepMs: number, zone: string) {
  fc.assert(
    fc.property(
      statusesArb(60),
      fc.integer({ min: 0, max: 24 * 365 * 3 }),
      // TR in minutes: whole steps and between them.
      fc.integer({ min: 1, max: 200 * (stepMs / MIN) }),
      (status, startSteps, trMin) => {
        const n = status.length;
        const t0 = Date.UTC(2001, 0, 1) + startSteps * stepMs;
        const timeMs = Float64Array.from({ length: n }, (_, i) => t0 + i * stepMs);
        const calendar = calendarIndex(timeMs, zone);
        const trH = trMin / 60;
        const found = new Uint8Array(n).fill(9);
        const reference = new Uint8Array(n).fill(9);
        const got = monthlyStatisticsWithGoStarts(timeMs, status, found, stepMs, calendar, trH, createStatisticsScratch(n));
        const want = monthlyStatisticsGeneralPath(timeMs, status, reference, stepMs, calendar, trH);
        expect(Array.from(found)).toEqual(Array.from(reference));
        expect(got).toEqual(want);
      },
    ),
    { numRuns: 150 },
  );
}

describe('statistics of a series of one step: the shortcut equals the general path', () => {
  it('hourly, months in UTC', () => checkSame(HOUR, 'UTC'));
  it('hourly, months in Europe/Oslo (summer time moves the month boundaries)', () => checkSame(HOUR, 'Europe/Oslo'));
  it('10-minute steps (TR rarely a whole number of steps)', () => checkSame(10 * MIN, 'UTC'));

  it('a long series with every operation of a day: several years, stretches across month ends', () => {
    fc.assert(
      fc.property(statusesArb(400), fc.integer({ min: 1, max: 96 }), (status, trH) => {
        const n = status.length;
        const timeMs = Float64Array.from({ length: n }, (_, i) => Date.UTC(1994, 0, 1) + i * HOUR);
        const calendar = calendarIndex(timeMs, 'UTC');
        const found = new Uint8Array(n);
        const reference = new Uint8Array(n);
        expect(monthlyStatisticsWithGoStarts(timeMs, status, found, HOUR, calendar, trH)).toEqual(
          monthlyStatisticsGeneralPath(timeMs, status, reference, HOUR, calendar, trH),
        );
        expect(Array.from(found)).toEqual(Array.from(reference));
      }),
      { numRuns: 40 },
    );
  });
  it('status buffers at any byte offset (stretches are read four records at a time only where aligned)', () => {
    fc.assert(
      fc.property(statusesArb(120), fc.integer({ min: 0, max: 7 }), fc.integer({ min: 1, max: 48 }), (codes, shift, trH) => {
        const n = codes.length;
        const status = new Uint8Array(n + shift).subarray(shift);
        status.set(codes);
        const timeMs = Float64Array.from({ length: n }, (_, i) => Date.UTC(2003, 5, 17) + i * HOUR);
        const calendar = calendarIndex(timeMs, 'UTC');
        const found = new Uint8Array(n).fill(9);
        const reference = new Uint8Array(n).fill(9);
        expect(monthlyStatisticsWithGoStarts(timeMs, status, found, HOUR, calendar, trH)).toEqual(
          monthlyStatisticsGeneralPath(timeMs, codes, reference, HOUR, calendar, trH),
        );
        expect(Array.from(found)).toEqual(Array.from(reference));
      }),
      { numRuns: 80 },
    );
  });
});
