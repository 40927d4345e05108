// Columnar records, the builder, step detection (docs/domain.md#convention-9) and summaries.
import { describe, expect, it } from 'vitest';
import {
  GIVEN_TE,
  GIVEN_TP,
  GIVEN_TZ,
  SEA_VARIABLES,
  SeaRecordBuilder,
  detectStepMinutes,
  givenPeriodFlags,
  implausibleReason,
  parseDecimal,
  summarise,
} from '../../shared/seadata';

const H = 3_600_000;

describe('SeaRecordBuilder', () => {
  it('grows past its capacity and returns trimmed copies', () => {
    const b = new SeaRecordBuilder(1);
    for (let i = 0; i < 1000; i++) b.push({ timeMs: i * H, hs: i / 100, wind: i % 2 === 0 ? 5 : undefined });
    expect(b.length).toBe(1000);
    const r = b.finish();
    expect(r.timeMs).toHaveLength(1000);
    expect(r.hs[999]).toBe(9.99);
    expect(r.wind[1]).toBeNaN();
    expect(r.tp[0]).toBeNaN();
    // A copy: more pushes do not change what was returned.
    b.push({ timeMs: 1000 * H, hs: 1 });
    expect(r.timeMs).toHaveLength(1000);
    expect(b.finish().timeMs).toHaveLength(1001);
  });

  it('reverses in place', () => {
    const b = new SeaRecordBuilder();
    b.push({ timeMs: 2, hs: 2 });
    b.push({ timeMs: 1, hs: 1 });
    b.reverse();
    const r = b.finish();
    expect(Array.from(r.timeMs)).toEqual([1, 2]);
    expect(Array.from(r.hs)).toEqual([1, 2]);
  });

  it('has the variables in storage order', () => {
    expect(SEA_VARIABLES).toEqual(['hs', 'tp', 'tz', 'te', 'dir', 'wind', 'windDir']);
  });
});

describe('detectStepMinutes (median spacing, docs/domain.md#convention-9)', () => {
  it('is the median, not the mean: gaps do not change an hourly step', () => {
    expect(detectStepMinutes(Float64Array.of(0, H, 2 * H, 3 * H, 27 * H))).toBe(60);
  });

  it('averages the two middle spacings for an even count', () => {
    // spacings 10, 20 min -> 15
    expect(detectStepMinutes(Float64Array.of(0, 600_000, 1_800_000))).toBe(15);
  });

  it('is NaN for fewer than two times, and skips NaN times', () => {
    expect(detectStepMinutes(new Float64Array(0))).toBeNaN();
    expect(detectStepMinutes(Float64Array.of(5))).toBeNaN();
    expect(detectStepMinutes(Float64Array.of(0, NaN, 3 * H, 6 * H))).toBe(180);
  });
});

describe('summarise', () => {
  it('counts records, coverage, variables present and missing per variable', () => {
    const b = new SeaRecordBuilder();
    b.push({ timeMs: 0, hs: 1, tp: 8 });
    b.push({ timeMs: H, hs: NaN, tp: 9, wind: 3 });
    b.push({ timeMs: 2 * H, hs: 2 });
    const s = summarise(b.finish());
    expect(s).toEqual({
      records: 3,
      startMs: 0,
      endMs: 2 * H,
      stepMinutes: 60,
      variables: ['hs', 'tp', 'wind'],
      missing: { hs: 1, tp: 1, tz: 3, te: 3, dir: 3, wind: 2, windDir: 3 },
    });
  });

  it('of nothing', () => {
    const s = summarise(new SeaRecordBuilder().finish());
    expect(s.records).toBe(0);
    expect(s.startMs).toBeNaN();
    expect(s.variables).toEqual([]);
  });
});

describe('givenPeriodFlags', () => {
  it('marks the periods present at import', () => {
    const b = new SeaRecordBuilder();
    b.push({ timeMs: 0, tp: 8 });
    b.push({ timeMs: 1, tz: 6, te: 7 });
    b.push({ timeMs: 2 });
    expect(Array.from(givenPeriodFlags(b.finish()))).toEqual([GIVEN_TP, GIVEN_TZ | GIVEN_TE, 0]);
  });
});

describe('parseDecimal', () => {
  it('accepts plain decimals only', () => {
    expect(parseDecimal('12')).toBe(12);
    expect(parseDecimal(' -3.5 ')).toBe(-3.5);
    expect(parseDecimal('+1.6')).toBe(1.6);
    expect(parseDecimal('.86')).toBe(0.86);
    expect(parseDecimal('5.')).toBe(5);
    expect(parseDecimal('2.5E-1')).toBe(0.25);
    for (const bad of ['', ' ', '12abc', '0x1A', 'Infinity', 'NaN', '1,5', '1e400', '1_000', '--1', '+', '.', 'e5']) {
      expect(parseDecimal(bad), bad).toBeNaN();
    }
  });

  it('with a decimal comma', () => {
    expect(parseDecimal('1,25', true)).toBe(1.25);
    expect(parseDecimal('1.25', true)).toBe(1.25);
    expect(parseDecimal('1.000,5', true)).toBeNaN();
    expect(parseDecimal('1,0,5', true)).toBeNaN();
  });
});

describe('implausibleReason', () => {
  it('accepts missing values and the inclusive bounds', () => {
    for (const v of SEA_VARIABLES) expect(implausibleReason(v, NaN)).toBeNull();
    expect(implausibleReason('hs', 25)).toBeNull();
    expect(implausibleReason('tp', 0.5)).toBeNull();
    expect(implausibleReason('te', 40)).toBeNull();
    expect(implausibleReason('dir', 360)).toBeNull();
    expect(implausibleReason('wind', 100)).toBeNull();
    expect(implausibleReason('hs', Infinity)).toBe('not a finite number');
  });
});
