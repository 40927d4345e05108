import { describe, expect, it } from 'vitest';
import { observedAt, pairForecasts, samplePairs, skillBins, skillByLead, type SkillIssue } from '../../shared/skill/forecast-skill';

// Bins, lead time and the log error e = ln(Hs_obs/Hs_fc) as in docs/domain.md#forecast-uncertainty;
// the pairing rule (exact time, else linear within 1.5 observation steps) in docs/domain.md#forecast-skill-pairing.
const H = 3_600_000;

// Hourly observation 0..30 h, Hs 1 m except the hours set below (worked so that ln(obs/fc) is round).
const obsHs = new Array<number>(31).fill(1);
obsHs[0] = Math.exp(0.1); // issue A, lead 0, fc 1.0: e = 0.1
obsHs[11] = Math.exp(-0.1); // issue A, lead 11, fc 1.0: e = -0.1
obsHs[6] = Math.exp(0.3); // issue B (06 h), lead 0, fc 1.0: e = 0.3
obsHs[12] = 1.5; // issue A, lead 12 (edge), fc 1.5 (edge): e = 0
obsHs[18] = 0.5 * Math.exp(0.2); // issue B, lead 12, fc 0.5 (edge): e = 0.2
obsHs[20] = NaN; // issue A, lead 20: missing observation, no pair
const obs = { timeMs: obsHs.map((_, h) => h * H), hs: obsHs };

const A: SkillIssue = { issuedAtMs: 0, timeMs: [0, 5, 11, 12, 20].map((h) => h * H), hs: [1, 0.49, 1, 1.5, 1] };
const B: SkillIssue = { issuedAtMs: 6 * H, timeMs: [6, 18, 40].map((h) => h * H), hs: [1, 0.5, 1] };

describe('skill figures on a small hand case', () => {
  const pairs = pairForecasts([A, B], obs);
  const bins = skillBins(pairs);
  const bin = (fromH: number, hsFrom: number) => bins.find((b) => b.fromH === fromH && b.hsFrom === hsFrom)!;

  it('pairs by time: Hs_fc < 0.5 m, missing observations and times past the observation are left out', () => {
    // A: leads 0, 11, 12 (lead 5 has fc 0.49, lead 20 a missing observation); B: leads 0, 12 (40 h is past the record).
    expect(pairs.map((p) => [p.issue, p.leadH])).toEqual([
      [0, 0],
      [0, 11],
      [0, 12],
      [1, 0],
      [1, 12],
    ]);
  });

  it('lead [0, 12) x Hs [0.5, 1.5): e = 0.1, -0.1, 0.3 -> mean 0.1, sd sqrt(0.08 / 2) = 0.2, 3 pairs, 2 issues', () => {
    const b = bin(0, 0.5);
    expect(b).toMatchObject({ fromH: 0, toH: 12, hsFrom: 0.5, hsTo: 1.5, pairs: 3, issues: 2 });
    expect(b.mean).toBeCloseTo(0.1, 12);
    expect(b.sd).toBeCloseTo(0.2, 12);
  });

  it('edges are half-open: lead 12 h goes to [12, 24), Hs 1.5 m to [1.5, 3), Hs 0.5 m to [0.5, 1.5)', () => {
    expect(bin(12, 1.5)).toMatchObject({ pairs: 1, issues: 1, sd: null });
    expect(bin(12, 1.5).mean).toBeCloseTo(0, 12);
    expect(bin(12, 0.5)).toMatchObject({ pairs: 1, issues: 1, sd: null });
    expect(bin(12, 0.5).mean).toBeCloseTo(0.2, 12);
    expect(bin(0, 1.5)).toMatchObject({ pairs: 0, issues: 0, mean: null, sd: null });
    expect(bins.reduce((s, b) => s + b.pairs, 0)).toBe(5);
    expect(bins[bins.length - 1]).toMatchObject({ fromH: 72, toH: 96, hsFrom: 5, hsTo: null });
  });

  it('by lead: [12, 24) holds e = 0 and 0.2 -> mean 0.1, sd sqrt(0.02) = 0.1414', () => {
    const l = skillByLead(pairs)[1];
    expect(l).toMatchObject({ fromH: 12, toH: 24, pairs: 2, issues: 2 });
    expect(l.mean).toBeCloseTo(0.1, 12);
    expect(l.sd).toBeCloseTo(Math.SQRT2 / 10, 12);
  });
});

describe('observedAt: exact time, else linear within 1.5 steps (docs/domain.md#forecast-skill-pairing)', () => {
  const o = { timeMs: [0, 1, 3].map((h) => h * H), hs: [1, 2, 4] };
  it('interpolates inside a step and refuses across a gap', () => {
    expect(observedAt(o, 0.25 * H, 1.5 * H)).toBeCloseTo(1.25, 12);
    expect(observedAt(o, 1 * H, 1.5 * H)).toBe(2);
    expect(observedAt(o, 2 * H, 1.5 * H)).toBeNaN(); // 1 h .. 3 h is a 2-h gap
    expect(observedAt(o, 4 * H, 1.5 * H)).toBeNaN();
  });
});

describe('samplePairs', () => {
  it('keeps all below the cap and spreads evenly above it', () => {
    expect(samplePairs([1, 2, 3], 5)).toEqual([1, 2, 3]);
    expect(samplePairs([0, 1, 2, 3, 4, 5, 6, 7, 8, 9], 5)).toEqual([0, 2, 4, 6, 8]);
  });
});
