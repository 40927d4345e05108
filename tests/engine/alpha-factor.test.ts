import { describe, expect, it } from 'vitest';
import {
  DEFAULT_ALPHA_TABLE,
  alphaFactor,
  alphaFor,
  alphaTableCoverageProblem,
  assertAlphaTable,
  defaultAlphaTable,
  isWeatherRestricted,
  type OperationSpec,
} from '../../shared/engine';

// Expected values are read by hand from the alpha table in docs/domain.md#weather-restricted,
// itself from memory of DNV-ST-N001's base case for waves (to be checked against the current standard).
describe('alphaFor: row by TPOP, linear in Hs (docs/domain.md#convention-5; table in docs/domain.md#weather-restricted, from memory of DNV-ST-N001)', () => {
  const T = DEFAULT_ALPHA_TABLE;

  it('takes the table values on the columns', () => {
    expect(alphaFor(T, 12, 1, 12, true)).toBe(0.65); // row 12 h, Hs 1 m
    expect(alphaFor(T, 24, 2, 24, true)).toBe(0.73); // row 24 h, Hs 2 m
    expect(alphaFor(T, 36, 4, 40, true)).toBe(0.73); // row 36 h, Hs 4 m
    expect(alphaFor(T, 48, 6, 60, true)).toBe(0.74); // row 48 h, Hs 6 m
    expect(alphaFor(T, 72, 6, 72, true)).toBe(0.72); // row 72 h, Hs 6 m
  });

  it('interpolates linearly in Hs between columns', () => {
    // Row 24 h, Hs 3 m: halfway between 0.73 (2 m) and 0.76 (4 m).
    expect(alphaFor(T, 24, 3, 30, true)).toBeCloseTo(0.745, 12);
    // Row 36 h, Hs 1.5 m: 0.62 + 0.5 * (0.71 - 0.62).
    expect(alphaFor(T, 36, 1.5, 36, true)).toBeCloseTo(0.665, 12);
    // Row 72 h, Hs 5 m: halfway between 0.68 (4 m) and 0.72 (6 m).
    expect(alphaFor(T, 60, 5, 70, true)).toBeCloseTo(0.7, 12);
    // Row 12 h, Hs 2.5 m: 0.76 + 0.25 * (0.79 - 0.76).
    expect(alphaFor(T, 6, 2.5, 8, true)).toBeCloseTo(0.7675, 12);
  });

  it('takes the end column outside 1-6 m', () => {
    expect(alphaFor(T, 48, 0.5, 48, true)).toBe(0.6);
    expect(alphaFor(T, 48, 8, 48, true)).toBe(0.74);
  });

  it('takes the first row whose TPOP bound is not exceeded; a bound itself takes its row', () => {
    expect(alphaFor(T, 12, 1, 12, true)).toBe(0.65);
    expect(alphaFor(T, 12.01, 1, 12.01, true)).toBe(0.63);
    expect(alphaFor(T, 0.5, 1, 2, true)).toBe(0.65);
    expect(alphaFor(T, 48.5, 2, 50, true)).toBe(0.63);
  });

  // Weather-restricted range TPOP <= 72 h and TR <= 96 h, both bounds included: from memory of
  // DNV-ST-N001 and its predecessor DNV-OS-H101 (they say "less than"; including the bounds is the
  // safe side, alpha < 1 there).
  it('weather-restricted up to TPOP 72 h and TR 96 h, bounds included (DNV-ST-N001 / DNV-OS-H101, from memory)', () => {
    expect(alphaFor(T, 72, 2, 72, true)).toBe(0.63); // TPOP 72 h exactly: row 72 h
    expect(alphaFor(T, 72, 2, 96, true)).toBe(0.63); // TR 96 h exactly still uses the table
    expect(alphaFor(T, 48, 2, 78, true)).toBe(0.68); // TR 78 h (was refused before): row 48 h
    expect(alphaFor(T, 60, 2, 96, true)).toBe(0.63); // TPOP 60 h takes row 72 h
    expect(isWeatherRestricted({ tpopH: 72, tcH: 24, weatherRestricted: true })).toBe(true);
    expect(isWeatherRestricted({ tpopH: 72, tcH: 24.5, weatherRestricted: true })).toBe(false);
    expect(isWeatherRestricted({ tpopH: 72.5, tcH: 0, weatherRestricted: true })).toBe(false);
    expect(isWeatherRestricted({ tpopH: 12, tcH: 0, weatherRestricted: false })).toBe(false);
  });

  it('outside the range, or not marked weather-restricted, the row is -1: statuses at OPLIM for information only', () => {
    expect(alphaFor(T, 72.5, 2, 72.5, true)).toBe(1);
    expect(alphaFor(T, 48, 2, 96.5, true)).toBe(1); // TR 96.5 h > 96 h
    expect(alphaFor(T, 12, 2, 12, false)).toBe(1);
  });

  it('a table that stops short of TPOP 72 h is reported (edits are refused) and never gives alpha = 1 (docs/domain.md#convention-5)', () => {
    const short = {
      tpopBoundsH: [12, 24],
      hsColumnsM: [1, 2],
      values: [
        [0.6, 0.7],
        [0.55, 0.65],
      ],
    };
    expect(alphaTableCoverageProblem(short)).toMatch(/72 h/);
    expect(alphaTableCoverageProblem(T)).toBeNull();
    // An old stored table: the last row (smallest alpha), not 1.
    expect(alphaFor(short, 48, 2, 60, true)).toBe(0.65);
  });

  it('alphaFactor uses the operation Hs max, TPOP and TR', () => {
    const op: OperationSpec = { tpopH: 24, tcH: 6, weatherRestricted: true, limits: { hsMax: 3 } };
    expect(alphaFactor(T, op)).toBeCloseTo(0.745, 12);
    expect(alphaFactor(T, op, 4)).toBe(0.76);
    expect(() => alphaFactor(T, { ...op, limits: { windMax: 10 } })).toThrow(RangeError);
  });

  it('rejects malformed tables and inputs', () => {
    expect(() => assertAlphaTable({ tpopBoundsH: [12, 12], hsColumnsM: [1], values: [[0.5], [0.5]] })).toThrow(RangeError);
    expect(() => assertAlphaTable({ tpopBoundsH: [12], hsColumnsM: [1, 2], values: [[0.5]] })).toThrow(RangeError);
    expect(() => assertAlphaTable({ tpopBoundsH: [12], hsColumnsM: [1], values: [[1.2]] })).toThrow(RangeError);
    expect(() => alphaFor(T, NaN, 2, 12, true)).toThrow(RangeError);
  });

  it('the default table is frozen and copies are independent', () => {
    expect(Object.isFrozen(DEFAULT_ALPHA_TABLE.values[0])).toBe(true);
    const copy = defaultAlphaTable();
    copy.values[0][0] = 0.5;
    expect(DEFAULT_ALPHA_TABLE.values[0][0]).toBe(0.65);
  });
});
