import { describe, expect, it } from 'vitest';
import { DEFAULT_ALPHA_TABLE, alphaTableSchema, operationLimitsSchema, operationSpecSchema } from '../../shared/engine';

describe('operationLimitsSchema', () => {
  it('accepts each limit alone and a full set', () => {
    for (const limits of [
      { hsMax: 2 },
      {
        hsTpCurve: [
          [4, 1],
          [8, 2],
        ],
      },
      { tpMin: 5 },
      { tpMax: 12 },
      { tpExcluded: [[8, 9]] },
      { bedVelocityMax: 0.4, bedVelocityMethod: 'soulsby' },
      { windMax: 15 },
      {
        hsMax: 2,
        hsTpCurve: null,
        tpMin: 4,
        tpMax: 14,
        tpExcluded: [
          [8, 9],
          [11, 12],
        ],
        bedVelocityMax: 0.5,
        bedVelocityMethod: 'linear',
        windMax: 12,
      },
    ]) {
      expect(operationLimitsSchema.safeParse(limits).success, JSON.stringify(limits)).toBe(true);
    }
  });

  it('needs at least one limit (an empty band list does not count)', () => {
    expect(operationLimitsSchema.safeParse({}).success).toBe(false);
    expect(operationLimitsSchema.safeParse({ hsMax: null, tpExcluded: [], bedVelocityMethod: 'linear' }).success).toBe(false);
  });

  it('enforces the ranges', () => {
    for (const bad of [
      { hsMax: 0.05 },
      { hsMax: 25 },
      { tpMin: 0.4 },
      { tpMax: 41 },
      { bedVelocityMax: 0.005 },
      { bedVelocityMax: 11 },
      { windMax: 0.2 },
      { windMax: 61 },
      {
        hsTpCurve: [
          [4, 1],
          [50, 2],
        ],
      },
    ]) {
      expect(operationLimitsSchema.safeParse(bad).success, JSON.stringify(bad)).toBe(false);
    }
  });

  it('curve: at least two points, strictly ascending Tp; bands: from < to; Tp min <= Tp max', () => {
    expect(operationLimitsSchema.safeParse({ hsTpCurve: [[4, 1]] }).success).toBe(false);
    expect(
      operationLimitsSchema.safeParse({
        hsTpCurve: [
          [8, 1],
          [6, 2],
        ],
      }).success,
    ).toBe(false);
    expect(
      operationLimitsSchema.safeParse({
        hsTpCurve: [
          [6, 1],
          [6, 2],
        ],
      }).success,
    ).toBe(false);
    expect(operationLimitsSchema.safeParse({ tpExcluded: [[9, 9]] }).success).toBe(false);
    expect(operationLimitsSchema.safeParse({ tpMin: 10, tpMax: 8 }).success).toBe(false);
    expect(operationLimitsSchema.safeParse({ bedVelocityMax: 0.5, bedVelocityMethod: 'other' }).success).toBe(false);
  });
});

describe('operationSpecSchema', () => {
  it('TPOP 0.25-2000 h, TC 0-2000 h', () => {
    const ok = { tpopH: 0.25, tcH: 0, weatherRestricted: true, limits: { hsMax: 2 } };
    expect(operationSpecSchema.safeParse(ok).success).toBe(true);
    expect(operationSpecSchema.safeParse({ ...ok, tpopH: 0.2 }).success).toBe(false);
    expect(operationSpecSchema.safeParse({ ...ok, tcH: -1 }).success).toBe(false);
    expect(operationSpecSchema.safeParse({ ...ok, tpopH: 2001 }).success).toBe(false);
    expect(operationSpecSchema.safeParse({ ...ok, limits: {} }).success).toBe(false);
  });
});

describe('alphaTableSchema', () => {
  it('accepts the default table', () => {
    expect(alphaTableSchema.safeParse(DEFAULT_ALPHA_TABLE).success).toBe(true);
  });
  it('rejects unsorted bounds, wrong shapes and values outside (0, 1]', () => {
    expect(alphaTableSchema.safeParse({ tpopBoundsH: [24, 12], hsColumnsM: [1], values: [[0.5], [0.5]] }).success).toBe(false);
    expect(alphaTableSchema.safeParse({ tpopBoundsH: [12], hsColumnsM: [1, 2], values: [[0.5]] }).success).toBe(false);
    expect(alphaTableSchema.safeParse({ tpopBoundsH: [12], hsColumnsM: [1], values: [[0]] }).success).toBe(false);
    expect(alphaTableSchema.safeParse({ tpopBoundsH: [12], hsColumnsM: [1], values: [[1.01]] }).success).toBe(false);
    expect(alphaTableSchema.safeParse({ tpopBoundsH: [12, 24], hsColumnsM: [1], values: [[0.5]] }).success).toBe(false);
  });
});
