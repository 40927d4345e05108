import { describe, expect, it } from 'vitest';
import { EXCHANGE_SERIES, seaStateExchangeSchema } from '../../server/forecast';

// The sea-state exchange (docs/domain.md#forecast-service): our own shape, so the expected values
// here are the documented shape and the importer's plausibility bounds, written by hand.

/** A small valid answer written by hand (three hours). */
function valid() {
  return {
    position: { lat: 50.25, lon: -5.5 },
    issuedAt: '2026-12-01T06:00:00Z',
    series: {
      time: ['2026-12-01T06:00:00Z', '2026-12-01T07:00:00Z', '2026-12-01T08:00:00Z'],
      hs: [1.42, 1.5, null] as (number | null)[],
      tp: [9.1, 9.3, 9.4] as (number | null)[],
      dir: [251, 360, 0] as (number | null)[],
      wind: [7.4, 0, 8.1] as (number | null)[],
      windDir: [238, 240, null] as (number | null)[],
    },
  };
}

function issues(value: unknown): string[] {
  const r = seaStateExchangeSchema.safeParse(value);
  return r.success ? [] : r.error.issues.map((i) => i.path.join('.'));
}

describe('seaStateExchangeSchema', () => {
  it('accepts a valid answer, nulls included', () => {
    expect(seaStateExchangeSchema.safeParse(valid()).success).toBe(true);
  });

  it('documents the variables of the exchange in one table', () => {
    // The documented members (docs/domain.md#forecast-service), in order.
    expect(Object.keys(EXCHANGE_SERIES).slice(0, 5)).toEqual(['hs', 'tp', 'dir', 'wind', 'windDir']);
  });

  it('refuses series of different lengths, naming the series', () => {
    const v = valid();
    v.series.wind.pop();
    expect(issues(v)).toEqual(['series.wind']);
  });

  it('refuses a required series left out, naming it', () => {
    const v = valid();
    const { tp: _left, ...rest } = v.series;
    expect(issues({ ...v, series: rest })).toEqual(['series.tp']);
  });

  it('refuses times that are repeated or go backwards', () => {
    const repeated = valid();
    repeated.series.time[2] = repeated.series.time[1];
    expect(issues(repeated)).toEqual(['series.time.2']);
    const backwards = valid();
    backwards.series.time = ['2026-12-01T06:00:00Z', '2026-12-01T05:00:00Z', '2026-12-01T08:00:00Z'];
    expect(issues(backwards)).toEqual(['series.time.1']);
  });

  it('accepts a step that changes part-way (hourly, then 3-hourly): each record has its time', () => {
    const v = valid();
    v.series.time[2] = '2026-12-01T10:00:00Z';
    expect(issues(v)).toEqual([]);
  });

  it('refuses times that are not ISO 8601 UTC with Z', () => {
    for (const t of ['2026-12-01T07:00:00+01:00', '2026-12-01T07:00:00', '2026-12-01 07:00', '1796108400000']) {
      const v = valid();
      v.series.time[1] = t;
      expect(issues(v), t).toContain('series.time.1');
    }
    const v = valid();
    v.issuedAt = '2026-12-01T06:00:00+00:00';
    expect(issues(v)).toEqual(['issuedAt']);
  });

  it('refuses implausible values at their bounds (Hs 0-25 m, Tp 0.5-40 s, directions 0-360, wind 0-100 m/s)', () => {
    const cases: ['hs' | 'tp' | 'dir' | 'wind' | 'windDir', number, boolean][] = [
      ['hs', -0.01, false],
      ['hs', 0, true],
      ['hs', 25, true],
      ['hs', 25.01, false],
      ['tp', 0.49, false],
      ['tp', 0.5, true],
      ['tp', 40, true],
      ['tp', 40.1, false],
      ['dir', -1, false],
      ['dir', 361, false],
      ['wind', -0.1, false],
      ['wind', 100.1, false],
      ['windDir', 360.5, false],
    ];
    for (const [key, value, ok] of cases) {
      const v = valid();
      v.series[key][0] = value;
      expect(seaStateExchangeSchema.safeParse(v).success, `${key} = ${value}`).toBe(ok);
    }
  });

  it('refuses strings where numbers belong, an empty series and a bad position', () => {
    const s = valid();
    (s.series.hs as unknown[])[0] = '1.4';
    expect(issues(s)).toEqual(['series.hs.0']);
    const empty = valid();
    for (const k of Object.keys(empty.series) as (keyof typeof empty.series)[]) empty.series[k] = [];
    expect(issues(empty)).toContain('series.time');
    expect(issues({ ...valid(), position: { lat: 91, lon: 0 } })).toEqual(['position.lat']);
    expect(issues({ ...valid(), position: { lat: 50, lon: -181 } })).toEqual(['position.lon']);
    expect(issues({ ...valid(), series: undefined })).toEqual(['series']);
    expect(issues('not an object')).toEqual(['']);
  });
});
