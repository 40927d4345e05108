/**
 * Tide predictions of server/services/tide.ts (docs/domain.md#tide), checked against published
 * figures: the M2 speed and nodal factor formulas of Schureman 1958 ("Manual of Harmonic Analysis
 * and Prediction of Tides", US Coast and Geodetic Survey Special Publication 98).
 */
import { describe, expect, it } from 'vitest';
import { predictExtremes, predictLevels, tidePredictor } from '../../server/services/tide';

const HOUR_MS = 3_600_000;
const M2_ONLY = { source: 'constants' as const, constituents: [{ name: 'M2', amplitude: 1.5, phase: 0 }], z0: 2, datum: 'LAT' };

/**
 * f(M2) by Schureman 1958 (from memory): f = cos^4(I/2) / 0.91544, with the obliquity of the Moon's
 * orbit to the equator cos I = 0.91370 - 0.03569 cos N, and N the longitude of the Moon's ascending
 * node, N = 259.1560564 - 0.0529539222 d degrees, d days from 1900 Jan 0.5 (1899-12-31 12:00 UT).
 * Written here, not taken from the package, so the test checks the package's nodal factor.
 */
function schuremanFM2(timeMs: number): number {
  const d = (timeMs - Date.UTC(1899, 11, 31, 12)) / 86_400_000;
  const n = ((259.1560564 - 0.0529539222 * d) * Math.PI) / 180;
  const cosI = 0.9137 - 0.03569 * Math.cos(n);
  const cosHalf = Math.sqrt((1 + cosI) / 2);
  return cosHalf ** 4 / 0.91544;
}

describe('tide by the harmonic method', () => {
  it('repeats every 12.4206 h with M2 alone (M2 speed 28.9841042 deg/h, Schureman 1958)', () => {
    const p = tidePredictor(M2_ONLY)!;
    // Schureman 1958: M2 speed 28.9841042 deg/h, so the period is 360/28.9841042 = 12.4206 h.
    const periodMs = (360 / 28.9841042) * HOUR_MS;
    expect(periodMs / HOUR_MS).toBeCloseTo(12.4206, 4);
    const t0 = Date.UTC(2026, 11, 3, 0, 7);
    const times = Float64Array.from({ length: 12 }, (_, k) => t0 + k * 2_000_000);
    const later = times.map((t) => t + periodMs);
    const a = predictLevels(p, times);
    const b = predictLevels(p, later);
    // Interpolated on a 5-minute grid: within A*(omega*dt)^2/8 = 1.5*(2pi/12.42 h * 1/12 h)^2/8 = 0.33 mm, plus the
    // nodal factors renewed per chunk (common practice, no source).
    for (let k = 0; k < a.length; k++) expect(Math.abs(a[k] - b[k])).toBeLessThan(0.001);
    // Not a constant: it really moves over the half period.
    expect(Math.max(...a) - Math.min(...a)).toBeGreaterThan(2);
  });

  it('has its extremes at Z0 ± f·H, f by Schureman 1958', () => {
    const p = tidePredictor(M2_ONLY)!;
    const from = Date.UTC(2026, 11, 1);
    const ex = predictExtremes(p, from, from + 3 * 86_400_000);
    expect(ex.highMs.length).toBeGreaterThanOrEqual(5);
    expect(ex.lowMs.length).toBeGreaterThanOrEqual(5);
    const f = schuremanFM2(from);
    const raw = p.extremes(from, from + 3 * 86_400_000);
    for (const e of raw) {
      const expected = e.high ? 2 + f * 1.5 : 2 - f * 1.5;
      // 2 mm: our f formula keeps five digits (Schureman 1958, from memory).
      expect(Math.abs(e.level - expected), e.time.toISOString()).toBeLessThan(0.002);
    }
    // Consecutive highs one M2 period apart (Schureman 1958), within a minute.
    for (let k = 1; k < ex.highMs.length; k++)
      expect(Math.abs(ex.highMs[k] - ex.highMs[k - 1] - (360 / 28.9841042) * HOUR_MS)).toBeLessThan(60_000);
  });

  it('keeps the nodal factor of M2 inside 0.96-1.04 over 19 years (from memory), and moves it across that range', () => {
    const p = tidePredictor({ ...M2_ONLY, z0: 0, constituents: [{ name: 'M2', amplitude: 1, phase: 0 }] })!;
    const fs: number[] = [];
    for (let m = 0; m < 19 * 12; m += 3) {
      const from = Date.UTC(2020, m, 1);
      const highs = p.extremes(from, from + 14 * HOUR_MS).filter((e) => e.high);
      fs.push(highs[0].level);
      // The same figure as Schureman's formula written in this test, within 0.002.
      expect(Math.abs(highs[0].level - schuremanFM2(highs[0].time.getTime()))).toBeLessThan(0.002);
    }
    expect(Math.min(...fs)).toBeGreaterThanOrEqual(0.96);
    expect(Math.max(...fs)).toBeLessThanOrEqual(1.04);
    // The 18.6-year cycle: both ends reached (about 0.963 and 1.037, from memory).
    expect(Math.min(...fs)).toBeLessThan(0.97);
    expect(Math.max(...fs)).toBeGreaterThan(1.03);
  });

  it('predicts a long hourly series in chunks without a jump at the chunk edges', () => {
    const p = tidePredictor(M2_ONLY)!;
    const t0 = Date.UTC(2025, 0, 1);
    const times = Float64Array.from({ length: 24 * 70 }, (_, k) => t0 + k * HOUR_MS);
    const levels = predictLevels(p, times);
    // Largest hourly change of a 1.5 m M2 (nodal factor at most 1.04): H f omega dt = 1.5*1.04*2pi/12.42 < 0.79 m.
    for (let k = 1; k < levels.length; k++) expect(Math.abs(levels[k] - levels[k - 1])).toBeLessThan(0.79);
    // The same instants asked one by one agree with the series (the chunking does not shift time); only the nodal
    // factors, taken at each chunk's start, may differ a little: 0.1 mm.
    const probe = Float64Array.of(times[31 * 24], times[62 * 24 + 5]);
    const alone = predictLevels(p, probe);
    expect(Math.abs(alone[0] - levels[31 * 24])).toBeLessThan(1e-4);
    expect(Math.abs(alone[1] - levels[62 * 24 + 5])).toBeLessThan(1e-4);
  });

  it('refuses a constituent the package does not know, naming the field', () => {
    expect(() =>
      tidePredictor({
        ...M2_ONLY,
        constituents: [
          { name: 'M2', amplitude: 1, phase: 0 },
          { name: 'XQ9', amplitude: 1, phase: 0 },
        ],
      }),
    ).toThrow(/tide\.constituents\.1\.name.*XQ9/);
  });
});
