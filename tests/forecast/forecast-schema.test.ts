import { describe, expect, it } from 'vitest';
import { forecastResponseSchema } from '../../server/forecast';

/** A small valid answer written by hand (three hours). */
function valid() {
  return {
    latitude: 50.25,
    longitude: -5.5,
    issuedAt: '2026-12-01T06:00:00Z',
    stepMinutes: 60,
    hourly: {
      time: ['2026-12-01T06:00:00Z', '2026-12-01T07:00:00Z', '2026-12-01T08:00:00Z'],
      waveHeightM: [1.42, 1.5, null],
      peakPeriodS: [9.1, 9.3, 9.4],
      waveDirectionDeg: [251, 360, 0],
      windSpeedMps: [7.4, 0, 8.1],
      windDirectionDeg: [238, 240, null],
    },
  };
}

function issues(value: unknown): string[] {
  const r = forecastResponseSchema.safeParse(value);
  return r.success ? [] : r.error.issues.map((i) => i.path.join('.'));
}

describe('forecastResponseSchema', () => {
  it('accepts a valid answer, nulls included', () => {
    expect(forecastResponseSchema.safeParse(valid()).success).toBe(true);
  });

  it('refuses columns of different lengths, naming the column', () => {
    const v = valid();
    v.hourly.windSpeedMps.pop();
    expect(issues(v)).toEqual(['hourly.windSpeedMps']);
  });

  it('refuses times that are repeated or go backwards', () => {
    const repeated = valid();
    repeated.hourly.time[2] = repeated.hourly.time[1];
    expect(issues(repeated)).toEqual(['hourly.time.2']);
    const backwards = valid();
    backwards.hourly.time = ['2026-12-01T06:00:00Z', '2026-12-01T05:00:00Z', '2026-12-01T08:00:00Z'];
    expect(issues(backwards)).toEqual(['hourly.time.1']);
  });

  it('refuses times that are not ISO 8601 UTC with Z', () => {
    for (const t of ['2026-12-01T07:00:00+01:00', '2026-12-01T07:00:00', '2026-12-01 07:00', '1796108400000']) {
      const v = valid();
      v.hourly.time[1] = t;
      expect(issues(v), t).toContain('hourly.time.1');
    }
    const v = valid();
    v.issuedAt = '2026-12-01T06:00:00+00:00';
    expect(issues(v)).toEqual(['issuedAt']);
  });

  it('refuses implausible values at their bounds (Hs 0-25 m, Tp 0.5-40 s, directions 0-360, wind 0-100 m/s)', () => {
    const cases: [keyof ReturnType<typeof valid>['hourly'], number, boolean][] = [
      ['waveHeightM', -0.01, false],
      ['waveHeightM', 0, true],
      ['waveHeightM', 25, true],
      ['waveHeightM', 25.01, false],
      ['peakPeriodS', 0.49, false],
      ['peakPeriodS', 0.5, true],
      ['peakPeriodS', 40, true],
      ['peakPeriodS', 40.1, false],
      ['waveDirectionDeg', -1, false],
      ['waveDirectionDeg', 361, false],
      ['windSpeedMps', -0.1, false],
      ['windSpeedMps', 100.1, false],
      ['windDirectionDeg', 360.5, false],
    ];
    for (const [key, value, ok] of cases) {
      const v = valid();
      (v.hourly[key] as unknown[])[0] = value;
      expect(forecastResponseSchema.safeParse(v).success, `${key} = ${value}`).toBe(ok);
    }
  });

  it('refuses strings where numbers belong, an empty series, another step and a bad position', () => {
    const s = valid();
    (s.hourly.waveHeightM as unknown[])[0] = '1.4';
    expect(issues(s)).toEqual(['hourly.waveHeightM.0']);
    const empty = valid();
    for (const k of Object.keys(empty.hourly) as (keyof typeof empty.hourly)[]) empty.hourly[k] = [];
    expect(issues(empty)).toContain('hourly.time');
    const step = { ...valid(), stepMinutes: 30 };
    expect(issues(step)).toEqual(['stepMinutes']);
    const lat = { ...valid(), latitude: 91 };
    expect(issues(lat)).toEqual(['latitude']);
    expect(issues({ ...valid(), hourly: undefined })).toEqual(['hourly']);
    expect(issues('not an object')).toEqual(['']);
  });
});
