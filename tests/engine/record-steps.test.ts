// recordSteps (shared/engine/record-steps.ts) against the rules of docs/domain.md#convention-9 and
// #convention-10, written out naively here: stretches of at least three equal spacings, gaps
// longer than 1.5 times the step on both sides, each record as long as its stretch's step. Random
// series mix evenly spaced ones (the engine's shortcut for one spacing throughout), changes of
// step, jitter and gaps. No outside figures: the reference is the written rule.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { recordSteps } from '../../shared/engine';

const H = 3_600_000;

/** The rules, one record at a time, by scanning for the nearest stretch on each side. */
function byTheRules(t: number[], fallback: number): { durationMs: number[]; continues: number[] } {
  const n = t.length;
  if (n === 0) return { durationMs: [], continues: [] };
  if (n === 1) return { durationMs: [fallback], continues: [0] };
  const m = n - 1;
  const sp = Array.from({ length: m }, (_, i) => t[i + 1] - t[i]);
  const inStretch = sp.map(() => false);
  for (let i = 0; i < m;) {
    let j = i + 1;
    while (j < m && sp[j] === sp[i]) j++;
    if (j - i >= 3) for (let k = i; k < j; k++) inStretch[k] = true;
    i = j;
  }
  const nearest = (i: number, dir: -1 | 1): number => {
    for (let k = i; k >= 0 && k < m; k += dir) if (inStretch[k]) return sp[k];
    return NaN;
  };
  const durationMs: number[] = [];
  const continues: number[] = [];
  let lastAfter = NaN;
  for (let i = 0; i < m; i++) {
    let b = nearest(i, -1);
    let a = nearest(i, 1);
    if (Number.isNaN(b)) b = Number.isNaN(a) ? fallback : a;
    if (Number.isNaN(a)) a = b;
    const gap = !inStretch[i] && sp[i] > 1.5 * b && sp[i] > 1.5 * a;
    continues.push(gap ? 0 : 1);
    durationMs.push(inStretch[i] ? sp[i] : b);
    lastAfter = a;
  }
  durationMs.push(continues[m - 1] === 1 ? durationMs[m - 1] : lastAfter);
  continues.push(0);
  return { durationMs, continues };
}

/** Spacings: evenly spaced, or a mix of steps with jitter and gaps. */
const seriesArb = fc.oneof(
  fc
    .tuple(fc.integer({ min: 1, max: 400 }), fc.constantFrom(H, 3 * H, 600_000, 1.5 * H))
    .map(([n, step]) => Array.from({ length: n }, (_, i) => Date.UTC(2020, 0, 1) + i * step)),
  fc.array(fc.constantFrom(H, H, H, 3 * H, 3 * H, 1.2 * H, 5 * H, 30 * H), { minLength: 0, maxLength: 200 }).map((steps) => {
    const t = [Date.UTC(2020, 0, 1)];
    for (const s of steps) t.push(t[t.length - 1] + s);
    return t;
  }),
);

describe('recordSteps', () => {
  it('follows the written rules on random series, evenly spaced or not', () => {
    fc.assert(
      fc.property(seriesArb, fc.constantFrom(H, 3 * H), (t, fallback) => {
        const got = recordSteps(Float64Array.from(t), fallback);
        const want = byTheRules(t, fallback);
        expect(Array.from(got.durationMs)).toEqual(want.durationMs);
        expect(Array.from(got.continues)).toEqual(want.continues);
      }),
      { numRuns: 400 },
    );
  });

  it('an evenly spaced series: every record lasts the step and continues into the next, the last ends the run', () => {
    const t = Float64Array.from({ length: 1000 }, (_, i) => Date.UTC(2020, 0, 1) + i * 3 * H);
    const { durationMs, continues } = recordSteps(t, H);
    expect(durationMs.every((d) => d === 3 * H)).toBe(true);
    expect(Array.from(continues.subarray(0, 999)).every((c) => c === 1)).toBe(true);
    expect(continues[999]).toBe(0);
  });
});
