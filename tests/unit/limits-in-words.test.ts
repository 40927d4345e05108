import { describe, expect, it } from 'vitest';
import type { OperationLimits } from '../../shared/engine/types';
import { describeLimits } from '../../shared/limits-in-words';

// Every kind of limit the engine tests must reach the words the coordinator and the client read
// (the Sites & limits page and the printed downtime report): a limit left out of the printed
// "Limits used (OPLIM)" would make the report say less than the schedule was worked from.
// `satisfies Required<OperationLimits>` makes the type check fail when a new kind of limit is added
// to the engine's type and not here.
const EVERY_LIMIT = {
  hsMax: 1.5,
  hsTpCurve: [
    [4, 1.8],
    [8, 1.5],
    [16, 1],
  ],
  tpMin: 3,
  tpMax: 14,
  tpExcluded: [[13, 15]],
  tpExcludedMinHs: 0.3,
  bedVelocityMax: 0.35,
  bedVelocityMethod: 'soulsby',
  windMax: 16,
  minDepth: 5,
  minDepthParts: { draught: 4.2, clearance: 0.8 },
  maxDepth: 30,
  currentMax: 1.2,
  tideWindow: { reference: 'high', before: 3, after: 2 },
  hsTargets: [
    { target: 'longPeriod', minPeriodS: 12, max: 0.8 },
    { target: 'windSea', max: 1.2 },
  ],
  responses: [
    { response: 'roll_deg_per_m', statistic: 'mpm', durationH: 3, max: 4 },
    { response: 'vel_z_m_s_per_m@bow_fender', statistic: 'significant', max: 0.8 },
  ],
  responseSea: { windSeaGamma: null, swellGamma: 5, windSeaSpreading: 2, swellSpreading: 'long-crested' },
} satisfies Required<OperationLimits>;

/** Narrow no-break spaces as plain spaces, so the expectations read as typed. */
const plain = (phrases: string[]) => phrases.map((p) => p.replace(/\u202f/g, ' '));

describe('limits in words (shared/limits-in-words.ts)', () => {
  it('names every limit in the short form of the Sites & limits page', () => {
    expect(plain(describeLimits(EVERY_LIMIT))).toEqual([
      'Hs ≤ 1.5 m',
      'Hs under the Hs–Tp curve (1–1.8 m), no-go outside Tp 4–16 s',
      'Tp 3–14 s',
      'Tp not in 13–15 s',
      'excluded bands tested on each partition from Hs 0.3 m',
      'bed velocity ≤ 0.35 m/s (Soulsby 2006)',
      'wind ≤ 16 m/s',
      'depth ≥ 5 m (draught 4.2 m + clearance 0.8 m)',
      'depth ≤ 30 m',
      'current ≤ 1.2 m/s',
      'only from 3 h before to 2 h after high water',
      'long-period sea (Tp ≥ 12 s) Hs ≤ 0.8 m',
      'wind sea Hs ≤ 1.2 m',
      'roll most probable max over 3 h ≤ 4 deg',
      'vertical velocity at bow_fender significant ≤ 0.8 m/s',
    ]);
  });

  it('names every limit in the full form of the printed report, with the spectra the responses use', () => {
    const full = plain(describeLimits(EVERY_LIMIT, 'full'));
    expect(full).toContain('Hs under the Hs–Tp curve (4 s, 1.8 m) (8 s, 1.5 m) (16 s, 1 m), no-go outside Tp 4–16 s');
    expect(full).toContain('near-bed orbital velocity ≤ 0.35 m/s (Soulsby 2006)');
    expect(full).toContain('wind at 10 m ≤ 16 m/s');
    expect(full).toContain('still-water depth ≥ 5 m (draught 4.2 m + under-keel clearance 0.8 m)');
    expect(full).toContain('only from 3 h before to 2 h after predicted high water');
    expect(full).toContain('long-period sea (Tp ≥ 12 s) Hs ≤ 0.8 m');
    expect(full).toContain('roll most probable max over 3 h ≤ 4 deg');
    // Wind-sea gamma left out = the DNV-RP-C205 rule (docs/domain.md#vessel-response).
    expect(full).toContain('responses worked from wind sea γ by the DNV-RP-C205 rule, cos^2 spreading and swell γ 5, long-crested');
  });

  it('says something for each limit on its own, so none is silently dropped', () => {
    const keys = Object.keys(EVERY_LIMIT) as (keyof typeof EVERY_LIMIT)[];
    // Settings that only qualify another limit: the method of the bed velocity, the parts of the
    // minimum depth, the band threshold and the spectra (full form, with a response limit).
    const qualifiers = new Set(['bedVelocityMethod', 'minDepthParts', 'tpExcludedMinHs', 'responseSea']);
    for (const key of keys) {
      if (qualifiers.has(key)) continue;
      const alone = { [key]: EVERY_LIMIT[key] } as OperationLimits;
      expect(describeLimits(alone, 'full').length, key).toBeGreaterThan(0);
      expect(describeLimits(alone, 'short').length, key).toBeGreaterThan(0);
    }
    expect(describeLimits({})).toEqual([]);
  });
});
