import type { CompiledLimits } from './compiled-limits';

/**
 * An operation's Hs-Tp curve prepared for record-by-record classes (docs/domain.md#convention-5,
 * #convention-6): its Tp range, the bounds that spare most interpolations, and the alpha row's
 * ends. Every evaluator reads the curve through this one arithmetic, so their results agree to the
 * bit. Small functions of a prepared object, for the JIT to inline into the record loops.
 */
export interface PreparedCurve {
  c: CompiledLimits;
  /** First and last curve Tp, s: outside [tp0, tpN] the curve is broken. */
  tp0: number;
  tpN: number;
  /** Highest curve Hs, m: above it OPLIM is broken at any Tp. */
  hsMax: number;
  /** (Lowest curve Hs) * (lowest alpha), m: at or below it OPWF is met at any Tp. */
  sureOk: number;
  /** Curve segments. */
  nSeg: number;
  /** Alpha columns (0: alpha = 1). */
  nA: number;
  aFirstCol: number;
  aLastCol: number;
  /** Alpha at and below the first column, at and above the last. */
  aFirst: number;
  aLast: number;
}

/** Prepares the curve of compiled limits that have one (two points or more). */
export function prepareCurve(c: CompiledLimits): PreparedCurve {
  const nSeg = c.curveSlope.length;
  const aRow = c.alphaRow;
  const nA = aRow === null ? 0 : c.alphaCols.length;
  let hsMin = Infinity;
  let hsMax = -Infinity;
  for (let k = 0; k < c.curveHs.length; k++) {
    if (c.curveHs[k] < hsMin) hsMin = c.curveHs[k];
    if (c.curveHs[k] > hsMax) hsMax = c.curveHs[k];
  }
  let alphaMin = 1;
  if (aRow !== null) for (let k = 0; k < aRow.length; k++) if (aRow[k] < alphaMin) alphaMin = aRow[k];
  return {
    c,
    tp0: c.curveTp[0],
    tpN: c.curveTp[nSeg],
    hsMax,
    sureOk: hsMin * alphaMin,
    nSeg,
    nA,
    aFirstCol: c.alphaCols[0],
    aLastCol: c.alphaCols[c.alphaCols.length - 1],
    aFirst: aRow !== null ? aRow[0] : 1,
    aLast: aRow !== null ? aRow[nA - 1] : 1,
  };
}

/**
 * Class of one record against the curve: 0 met, 1 met at OPLIM only, 2 broken (outside the
 * closed Tp range, or Hs above OPLIM).
 */
export function curveClass(p: PreparedCurve, h: number, t: number): number {
  if (t < p.tp0 || t > p.tpN || h > p.hsMax) return 2;
  if (h <= p.sureOk) return 0;
  const lim = curveLimit(p, t);
  return (h > lim * curveAlpha(p, lim) ? 1 : 0) + (h > lim ? 1 : 0);
}

/**
 * The curve's OPLIM at Tp t within its range: linear between points; at a point, that point's Hs
 * exactly (limits are inclusive, docs/domain.md#convention-6).
 */
export function curveLimit(p: PreparedCurve, t: number): number {
  const c = p.c;
  const cTp = c.curveTp;
  let s = 0;
  while (s < p.nSeg - 1 && cTp[s + 1] < t) s++;
  return t === cTp[s + 1] ? c.curveHs[s + 1] : c.curveHs[s] + c.curveSlope[s] * (t - cTp[s]);
}

/** Alpha at OPLIM `lim`: linear between the table's Hs columns, the end columns' outside (1 without alpha). */
export function curveAlpha(p: PreparedCurve, lim: number): number {
  const c = p.c;
  let alpha = 1;
  if (p.nA > 0) {
    if (lim <= p.aFirstCol) alpha = p.aFirst;
    else if (lim >= p.aLastCol) alpha = p.aLast;
    else {
      const aCols = c.alphaCols;
      let j = 0;
      while (aCols[j + 1] < lim) j++;
      alpha = (c.alphaRow as Float64Array)[j] + c.alphaSlope[j] * (lim - aCols[j]);
    }
  }
  return alpha;
}
