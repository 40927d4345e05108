import { describe, expect, it } from 'vitest';
import quantile from '@stdlib/stats-base-dists-normal-quantile';
import { DEFAULT_ALPHA_TABLE } from '../../shared/engine/default-alpha-table';
import { calibrateAlphaTable, calibratedAlphaValue, leadNeededPerRow } from '../../shared/skill/calibrated-alpha';
import { standardNormalQuantile } from '../../shared/skill/normal-quantile';
import { SKILL_HS_BINS_M, SKILL_LEAD_BINS_H, type SkillBin } from '../../shared/skill/forecast-skill';

// The rule alpha = min(1, exp(-(mu + z sigma))), z = the (1 - p) standard normal quantile, is our own
// documented method (docs/domain.md#calibrated-alpha). The reference quantile comes from
// @stdlib/stats-base-dists-normal-quantile (stdlib, a general-purpose numerical library), not from
// the package the product uses.
const zRef = (p: number) => quantile(1 - p, 0, 1);

describe('the standard normal quantile (reference: @stdlib/stats-base-dists-normal-quantile)', () => {
  it('agrees with the reference library at the tails the product uses', () => {
    for (const p of [1e-2, 1e-3, 1e-4, 1e-5, 1e-6]) expect(standardNormalQuantile(1 - p)).toBeCloseTo(zRef(p), 9);
    // z at p = 1e-4 is 3.719 (printed normal tables give 3.719, from memory).
    expect(zRef(1e-4)).toBeCloseTo(3.719, 3);
  });

  it('refuses a chance outside (0, 1)', () => {
    expect(() => standardNormalQuantile(1)).toThrow(/strictly between 0 and 1/);
    expect(() => standardNormalQuantile(0)).toThrow(/strictly between 0 and 1/);
  });
});

describe('calibratedAlphaValue against values worked by hand (docs/domain.md#calibrated-alpha)', () => {
  it('mu = 0, sigma = 0.1, p = 1e-4: z = 3.719, alpha = exp(-0.3719) = 0.6894', () => {
    // By hand: z * sigma = 3.719 * 0.1 = 0.3719; exp(-0.3719) = 0.68940 (e^-0.37 = 0.69077, times e^-0.0019 = 0.99810).
    expect(calibratedAlphaValue(0, 0.1, 1e-4)).toBeCloseTo(0.6894, 4);
    expect(calibratedAlphaValue(0, 0.1, 1e-4)).toBeCloseTo(Math.exp(-zRef(1e-4) * 0.1), 12);
  });

  it('mu = -0.5, sigma = 0.05: exp(0.5 - 0.186) = exp(0.314) > 1, so capped at 1', () => {
    expect(calibratedAlphaValue(-0.5, 0.05, 1e-4)).toBe(1);
  });

  it('a forecast that reads high (mu < 0) loosens, one that reads low (mu > 0) tightens', () => {
    // mu = 0.1, sigma = 0.1, p = 1e-4: exp(-(0.1 + 0.3719)) = exp(-0.4719) = 0.6238 (by hand).
    expect(calibratedAlphaValue(0.1, 0.1, 1e-4)).toBeCloseTo(0.6238, 4);
    // p = 1e-2: z = 2.326 (normal tables, from memory); mu = 0, sigma = 0.2: exp(-0.4653) = 0.6280.
    expect(calibratedAlphaValue(0, 0.2, 1e-2)).toBeCloseTo(0.628, 3);
  });
});

const EMPTY: SkillBin[] = SKILL_LEAD_BINS_H.flatMap(([fromH, toH]) =>
  SKILL_HS_BINS_M.map(([hsFrom, hsTo]) => ({
    fromH,
    toH,
    hsFrom,
    hsTo: Number.isFinite(hsTo) ? hsTo : null,
    pairs: 0,
    issues: 0,
    mean: null,
    sd: null,
  })),
);

describe('calibrateAlphaTable: which bin each cell uses (docs/domain.md#calibrated-alpha)', () => {
  it('lead per row: the TPOP bound, or the largest TR of the weather-restricted operations in the row', () => {
    const ops = [
      { tpopH: 10, tcH: 14, weatherRestricted: true }, // row 12 h, TR 24 h
      { tpopH: 20, tcH: 10, weatherRestricted: true }, // row 24 h, TR 30 h
      { tpopH: 30, tcH: 60, weatherRestricted: false }, // not weather-restricted: ignored
    ];
    expect(leadNeededPerRow(DEFAULT_ALPHA_TABLE, ops)).toEqual([24, 30, 36, 48, 72]);
  });

  it('takes the bin holding the lead (half-open) and the Hs column, and falls back to the default where a bin is empty', () => {
    // Only bin lead [12, 24) x Hs [1.5, 3) has data: mu = 0, sigma = 0.1, 40 issues.
    const bins = EMPTY.map((b) => (b.fromH === 12 && b.hsFrom === 1.5 ? { ...b, pairs: 400, issues: 40, mean: 0, sd: 0.1 } : b));
    const t = calibrateAlphaTable(DEFAULT_ALPHA_TABLE, bins, 1e-4, []);
    // Row 12 h needs a lead of 12 h: half-open, that is the bin [12, 24). Column 2 m is in [1.5, 3).
    expect(t.cells[0][1]).toMatchObject({
      fromH: 12,
      toH: 24,
      hsFrom: 1.5,
      hsTo: 3,
      fallback: false,
      pairs: 400,
      issues: 40,
      fewIssues: false,
    });
    // 0.6894 rounded down to 0.001 (hand value above).
    expect(t.table.values[0][1]).toBe(0.689);
    // Every other cell keeps the default (docs/domain.md#weather-restricted table), flagged.
    expect(t.cells[0][0]).toMatchObject({ fallback: true, alpha: 0.65, defaultAlpha: 0.65, hsFrom: 0.5 });
    expect(t.cells[4][3]).toMatchObject({ fallback: true, alpha: 0.72, fromH: 72, toH: 96, hsFrom: 5, hsTo: null });
    // Row 24 h: lead 24 h is in [24, 48).
    expect(t.cells[1][1]).toMatchObject({ fromH: 24, toH: 48, fallback: true });
    expect(t.z).toBeCloseTo(zRef(1e-4), 9);
  });

  it('warns below 30 distinct issues and caps at 1', () => {
    const bins = EMPTY.map((b) => (b.fromH === 72 && b.hsFrom === 5 ? { ...b, pairs: 50, issues: 29, mean: -0.5, sd: 0.05 } : b));
    const t = calibrateAlphaTable(DEFAULT_ALPHA_TABLE, bins, 1e-4, []);
    expect(t.cells[4][3]).toMatchObject({ alpha: 1, fallback: false, fewIssues: true, issues: 29 });
  });
});
