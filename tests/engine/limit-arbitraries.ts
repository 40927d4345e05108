// Random operations for the engine's property tests: limits drawn near the trade's usual ranges
// (common practice, no source), each kind present or absent, at least one kind set.
import fc from 'fast-check';
import type { OperationLimits, OperationSpec } from '../../shared/engine';

export const round2 = (x: number) => Math.round(x * 100) / 100;

export const limitsArb: fc.Arbitrary<OperationLimits> = fc
  .record(
    {
      hsMax: fc.double({ min: 0.5, max: 6, noNaN: true }).map(round2),
      hsTpCurve: fc
        .uniqueArray(fc.integer({ min: 3, max: 20 }), { minLength: 2, maxLength: 5 })
        .chain((tps) =>
          fc.tuple(
            ...tps
              .sort((a, b) => a - b)
              .map((tp) => fc.double({ min: 0.3, max: 5, noNaN: true }).map((hs) => [tp, round2(hs)] as [number, number])),
          ),
        ),
      tpMin: fc.integer({ min: 3, max: 8 }),
      tpMax: fc.integer({ min: 9, max: 18 }),
      tpExcluded: fc.array(
        fc.tuple(fc.integer({ min: 4, max: 16 }), fc.integer({ min: 1, max: 3 })).map(([a, w]) => [a, a + w] as [number, number]),
        { minLength: 1, maxLength: 2 },
      ),
      bedVelocityMax: fc.constantFrom(0.2, 0.35, 0.5),
      bedVelocityMethod: fc.constantFrom('linear' as const, 'soulsby' as const),
      windMax: fc.constantFrom(8, 12, 15),
    },
    { requiredKeys: [] },
  )
  // At least one limit kind: absent keys are left out, and the bed-velocity method alone is no limit.
  .filter((l) => Object.keys(l).some((k) => k !== 'bedVelocityMethod'));

/** An operation with random TPOP (h), TC (h) from `tcChoices`, weather-restricted or not, and limits. */
export const operationArb = (tcChoices: number[]): fc.Arbitrary<OperationSpec> =>
  fc.record({
    tpopH: fc.constantFrom(3, 12, 20, 36, 48, 60, 72, 80),
    tcH: fc.constantFrom(...tcChoices),
    weatherRestricted: fc.boolean(),
    limits: limitsArb,
  });

/**
 * Values near the limits' edges: the edges themselves, just either side of them (0.01 and 0.3
 * off), anything from `lo` to `hi`, and now and then a missing value (NaN).
 */
export const aroundEdges = (edges: number[], lo: number, hi: number): fc.Arbitrary<number> =>
  fc.oneof(
    { weight: 3, arbitrary: fc.constantFrom(...edges) },
    { weight: 3, arbitrary: fc.tuple(fc.constantFrom(...edges), fc.constantFrom(-0.01, 0.01, -0.3, 0.3)).map(([e, d]) => e + d) },
    { weight: 4, arbitrary: fc.double({ min: lo, max: hi, noNaN: true }) },
    { weight: 1, arbitrary: fc.constant(NaN) },
  );

/** A bed velocity (m/s): usual values, anything from 0 to 1, or missing (NaN). */
export const velocityArb = fc.oneof(fc.constantFrom(0.2, 0.35, 0.5), fc.double({ min: 0, max: 1, noNaN: true }), fc.constant(NaN));
