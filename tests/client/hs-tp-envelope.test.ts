// The setup page's Hs-Tp envelope (src/features/setup/components/hs-tp-envelope.ts), checked
// against the rules of docs/domain.md#operations-and-limits and #convention-6 (inclusive limits,
// closed bands, the curve linear between its points and no-go outside its Tp range). Expected
// values are worked by hand beside each check.
import { describe, expect, it } from 'vitest';
import { hsLimitAt, hsTpEnvelope, usableCurve, type EnvelopeLimits } from '../../src/features/setup/components/hs-tp-envelope';

const none: EnvelopeLimits = { hsMax: null, curve: [], tpMin: null, tpMax: null, bands: [] };
/** No limits but these. */
const only = (limits: Partial<EnvelopeLimits>): EnvelopeLimits => ({ ...none, ...limits });
/** A curve rising from Hs 1 m at Tp 4 s to 3 m at 8 s. */
const RISING: [number, number][] = [
  [4, 1],
  [8, 3],
];

describe('hsLimitAt', () => {
  it('takes the lower of Hs max and the curve, interpolated linearly', () => {
    const l = only({ hsMax: 2.5, curve: [...RISING, [12, 2]] });
    expect(hsLimitAt(l, 6).hs).toBeCloseTo(2, 12); // halfway from 1 m to 3 m
    expect(hsLimitAt(l, 8).hs).toBe(2.5); // curve 3 m, capped by Hs max
    expect(hsLimitAt(l, 11).hs).toBeCloseTo(2.25, 12); // 3 - (3 - 2) * 3/4
  });
  it('is a no-go outside the curve, edges included in the range (closed)', () => {
    const l = only({ curve: RISING });
    expect(hsLimitAt(l, 4).hs).toBe(1);
    expect(hsLimitAt(l, 8).hs).toBe(3);
    expect(hsLimitAt(l, 3.99)).toEqual({ hs: null, reason: 'outside the curve' });
    expect(hsLimitAt(l, 8.01)).toEqual({ hs: null, reason: 'outside the curve' });
  });
  it('keeps Tp min and max inclusive and excluded bands closed', () => {
    const l = only({ hsMax: 2, tpMin: 5, tpMax: 15, bands: [[9, 11]] });
    expect(hsLimitAt(l, 5).hs).toBe(2);
    expect(hsLimitAt(l, 15).hs).toBe(2);
    expect(hsLimitAt(l, 4.9).reason).toBe('below Tp min');
    expect(hsLimitAt(l, 15.1).reason).toBe('above Tp max');
    expect(hsLimitAt(l, 9).reason).toBe('excluded band');
    expect(hsLimitAt(l, 11).reason).toBe('excluded band');
    expect(hsLimitAt(l, 11.01).hs).toBe(2);
  });
  it('has no Hs limit (Infinity) when only Tp limits are set', () => {
    expect(hsLimitAt(only({ tpMin: 5 }), 6).hs).toBe(Infinity);
  });
});

describe('usableCurve', () => {
  it('needs two finite points with Tp strictly ascending', () => {
    expect(usableCurve([[4, 1]])).toBeNull();
    expect(
      usableCurve([
        [4, 1],
        [4, 2],
      ]),
    ).toBeNull();
    expect(
      usableCurve([
        [4, 1],
        [Number.NaN, 2],
      ]),
    ).toBeNull();
    expect(
      usableCurve([
        [4, 1],
        [5, 2],
      ]),
    ).toEqual([
      [4, 1],
      [5, 2],
    ]);
  });
});

describe('hsTpEnvelope', () => {
  it('splits at Tp bounds, band edges and where Hs max crosses the curve, covering [0, end] without gaps', () => {
    const l = only({ hsMax: 2, curve: RISING, bands: [[6.5, 7]] });
    const pieces = hsTpEnvelope(l, 10);
    expect(pieces[0].fromS).toBe(0);
    expect(pieces[pieces.length - 1].toS).toBe(10);
    for (let i = 1; i < pieces.length; i++) expect(pieces[i].fromS).toBe(pieces[i - 1].toS);
    // Hs max 2 m crosses the curve 1 -> 3 m over 4-8 s at Tp = 6 s (1 + 2 * (6 - 4) / 4 = 2).
    const cuts = pieces.map((p) => p.fromS);
    expect(cuts).toEqual(expect.arrayContaining([0, 4, 6, 6.5, 7, 8]));
    // 0-4 s: outside the curve; 6.5-7 s: the band; 8-10 s: outside the curve.
    expect(pieces.filter((p) => p.kind === 'nogo').map((p) => [p.fromS, p.toS])).toEqual([
      [0, 4],
      [6.5, 7],
      [8, 10],
    ]);
    const rising = pieces.find((p) => p.kind === 'limit' && p.fromS === 4);
    expect(rising).toMatchObject({ kind: 'limit', toS: 6 });
    // The piece is read just inside its ends, so its Hs values match to about 1e-9 m.
    if (rising?.kind === 'limit') {
      expect(rising.hsFromM).toBeCloseTo(1, 6);
      expect(rising.hsToM).toBeCloseTo(2, 6);
    }
  });
});
