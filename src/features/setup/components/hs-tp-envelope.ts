/**
 * The Hs–Tp envelope of an operation's limits, for the limit plot: along the Tp axis, where the
 * operation is a no-go whatever Hs is (outside the curve's Tp range, below Tp min, above Tp max,
 * inside an excluded band) and, elsewhere, the Hs limit min(Hs max, curve(Tp)).
 *
 * Same rules as the engine (docs/domain.md#operations-and-limits, #convention-5 and #convention-6): the curve is
 * interpolated linearly between its points and is a no-go outside its Tp range; limits are
 * inclusive, bands closed. Drawn piecewise linear: the pieces split at every curve point, Tp
 * bound, band edge and crossing of Hs max with the curve, so each piece is exactly linear.
 */
export interface EnvelopeLimits {
  hsMax: number | null;
  /** points [Tp s, Hs m]; used only when it has at least two points with strictly ascending Tp */
  curve: [number, number][];
  tpMin: number | null;
  tpMax: number | null;
  bands: [number, number][];
}

export type EnvelopePiece =
  /** no-go for every Hs over [fromS, toS] */
  | { kind: 'nogo'; fromS: number; toS: number; reason: string }
  /** Hs limit from hsFromM at fromS to hsToM at toS (Infinity = no Hs limit) */
  | { kind: 'limit'; fromS: number; toS: number; hsFromM: number; hsToM: number };

const finite = (v: number | null): v is number => v !== null && Number.isFinite(v);

/** The curve when it is usable (two or more finite points, Tp strictly ascending), else null. */
export function usableCurve(curve: [number, number][]): [number, number][] | null {
  if (curve.length < 2) return null;
  for (let i = 0; i < curve.length; i++) {
    if (!Number.isFinite(curve[i][0]) || !Number.isFinite(curve[i][1])) return null;
    if (i > 0 && !(curve[i][0] > curve[i - 1][0])) return null;
  }
  return curve;
}

function curveAt(curve: [number, number][], tp: number): number {
  for (let i = 1; i < curve.length; i++) {
    const [x0, y0] = curve[i - 1];
    const [x1, y1] = curve[i];
    if (tp <= x1) return y0 + ((y1 - y0) * (tp - x0)) / (x1 - x0);
  }
  return curve[curve.length - 1][1];
}

/** Hs limit at one Tp: null = no-go, Infinity = no Hs limit; with the reason for a no-go. */
export function hsLimitAt(l: EnvelopeLimits, tp: number): { hs: number | null; reason?: string } {
  if (finite(l.tpMin) && tp < l.tpMin) return { hs: null, reason: 'below Tp min' };
  if (finite(l.tpMax) && tp > l.tpMax) return { hs: null, reason: 'above Tp max' };
  for (const [a, b] of l.bands)
    if (Number.isFinite(a) && Number.isFinite(b) && a <= tp && tp <= b) return { hs: null, reason: 'excluded band' };
  const curve = usableCurve(l.curve);
  let hs = finite(l.hsMax) ? l.hsMax : Infinity;
  if (curve) {
    if (tp < curve[0][0] || tp > curve[curve.length - 1][0]) return { hs: null, reason: 'outside the curve' };
    hs = Math.min(hs, curveAt(curve, tp));
  }
  return { hs };
}

/** The envelope over Tp in [0, tpEndS], in ascending pieces. */
export function hsTpEnvelope(l: EnvelopeLimits, tpEndS: number): EnvelopePiece[] {
  const cuts = new Set<number>([0, tpEndS]);
  const add = (x: number | null) => finite(x) && x > 0 && x < tpEndS && cuts.add(x);
  add(l.tpMin);
  add(l.tpMax);
  for (const [a, b] of l.bands) {
    add(a);
    add(b);
  }
  const curve = usableCurve(l.curve);
  if (curve) {
    for (const [x] of curve) add(x);
    if (finite(l.hsMax)) {
      for (let i = 1; i < curve.length; i++) {
        const [x0, y0] = curve[i - 1];
        const [x1, y1] = curve[i];
        if ((y0 - l.hsMax) * (y1 - l.hsMax) < 0) add(x0 + ((l.hsMax - y0) * (x1 - x0)) / (y1 - y0));
      }
    }
  }
  const xs = [...cuts].sort((a, b) => a - b);
  const pieces: EnvelopePiece[] = [];
  for (let i = 1; i < xs.length; i++) {
    const a = xs[i - 1];
    const b = xs[i];
    const mid = hsLimitAt(l, (a + b) / 2);
    if (mid.hs === null) {
      const last = pieces[pieces.length - 1];
      if (last && last.kind === 'nogo' && last.reason === mid.reason && last.toS === a) last.toS = b;
      else pieces.push({ kind: 'nogo', fromS: a, toS: b, reason: mid.reason ?? 'no-go' });
      continue;
    }
    // Values at the piece's ends, taken just inside it (a closed band edge is a no-go point, but
    // the limit on either side runs up to it).
    const eps = (b - a) * 1e-9;
    const ha = hsLimitAt(l, a + eps).hs ?? mid.hs;
    const hb = hsLimitAt(l, b - eps).hs ?? mid.hs;
    pieces.push({ kind: 'limit', fromS: a, toS: b, hsFromM: ha, hsToM: hb });
  }
  return pieces;
}
