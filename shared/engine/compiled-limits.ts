import { alphaInRow, alphaRowIndex } from './alpha-factor';
import { DEFAULT_BAND_MIN_HS_M } from './hs-targets';
import type { AlphaTable, HsTarget, OperationSpec, TideWindowLimit } from './types';

/** An Hs max on a target, compiled: OPLIM, OPWF = alpha(OPLIM) * OPLIM with the total's table (docs/domain.md#partitions). */
export interface CompiledHsTarget {
  target: HsTarget;
  /** T*, s (NaN unless long-period). */
  minPeriodS: number;
  max: number;
  opwf: number;
}

/**
 * An operation's limits prepared for the hot loops: absent limits are NaN or empty arrays,
 * the alpha row is chosen once. Internal to the engine.
 */
export interface CompiledLimits {
  /** Hs max at OPLIM, m (NaN: none). */
  hsMax: number;
  /** Hs max at OPWF = alpha * OPLIM, m (NaN: none). */
  hsMaxOpwf: number;
  /** Curve Tp, s, strictly ascending (length 0: no curve). */
  curveTp: Float64Array;
  /** Curve Hs, m. */
  curveHs: Float64Array;
  /** Slope of each curve segment, m/s. */
  curveSlope: Float64Array;
  /** Alpha table row for the curve (NaN-free), or null when alpha = 1. */
  alphaRow: Float64Array | null;
  /** Alpha table Hs columns, m. */
  alphaCols: Float64Array;
  /** Slope of alpha between columns, 1/m (empty when alpha = 1). */
  alphaSlope: Float64Array;
  tpMin: number;
  tpMax: number;
  bandFrom: Float64Array;
  bandTo: Float64Array;
  bedMax: number;
  bedSoulsby: boolean;
  windMax: number;
  needHs: boolean;
  needTp: boolean;
  needBed: boolean;
  needWind: boolean;
  /** Min and max still-water depth, m (NaN: none); exact limits, no alpha (docs/domain.md#tide). */
  minDepth: number;
  maxDepth: number;
  /** Current speed max, m/s (NaN: none). */
  currentMax: number;
  /** The tide window, or null. */
  tideWindow: TideWindowLimit | null;
  needDepth: boolean;
  needCurrent: boolean;
  /** Hs limits on targets (docs/domain.md#partitions); empty: none. */
  hsTargets: CompiledHsTarget[];
  /** Excluded bands test partitions with at least this worksite Hs, m. */
  bandMinHs: number;
  /** Reference period TR = TPOP + TC, h. */
  trH: number;
}

function finiteOrNaN(x: number | null | undefined, what: string): number {
  if (x == null) return NaN;
  if (!Number.isFinite(x)) throw new RangeError(`${what} must be a finite number, got ${x}`);
  return x;
}

function positiveOrNaN(x: number | null | undefined, what: string): number {
  const v = finiteOrNaN(x, what);
  if (v <= 0) throw new RangeError(`${what} must be positive, got ${v}`);
  return v;
}

/**
 * Prepares an operation's limits (see {@link CompiledLimits}).
 *
 * @param useAlpha false plans on OPLIM (alpha = 1, docs/domain.md#convention-14)
 * @throws RangeError when no limit is set, a limit is not finite and positive, the curve has fewer
 *   than two points or Tp not strictly ascending, a band has from > to, TPOP/TC are invalid, or the
 *   alpha table is malformed.
 */
export function compileLimits(op: OperationSpec, alphaTable: AlphaTable, useAlpha: boolean): CompiledLimits {
  const L = op.limits;
  if (!(Number.isFinite(op.tpopH) && op.tpopH > 0)) throw new RangeError(`TPOP ${op.tpopH} h must be finite and positive`);
  if (!(Number.isFinite(op.tcH) && op.tcH >= 0)) throw new RangeError(`TC ${op.tcH} h must be finite and >= 0`);
  const trH = op.tpopH + op.tcH;
  const row = useAlpha ? alphaRowIndex(alphaTable, op.tpopH, trH, op.weatherRestricted) : -1;

  const hsMax = positiveOrNaN(L.hsMax, 'Hs max');
  const hsMaxOpwf = hsMax === hsMax ? hsMax * alphaInRow(alphaTable, row, hsMax) : NaN;

  const curve = L.hsTpCurve ?? [];
  if (curve.length === 1) throw new RangeError('Hs-Tp curve needs at least two points');
  const curveTp = new Float64Array(curve.length);
  const curveHs = new Float64Array(curve.length);
  curve.forEach(([tp, hs], i) => {
    curveTp[i] = positiveOrNaN(tp, 'curve Tp');
    curveHs[i] = finiteOrNaN(hs, 'curve Hs');
    if (curveHs[i] < 0) throw new RangeError('curve Hs must be >= 0');
    if (i > 0 && !(curveTp[i] > curveTp[i - 1])) throw new RangeError('curve Tp must be strictly ascending');
  });

  const bands = L.tpExcluded ?? [];
  const bandFrom = new Float64Array(bands.length);
  const bandTo = new Float64Array(bands.length);
  bands.forEach(([from, to], i) => {
    bandFrom[i] = positiveOrNaN(from, 'band from');
    bandTo[i] = positiveOrNaN(to, 'band to');
    if (bandFrom[i] > bandTo[i]) throw new RangeError(`excluded Tp band [${from}, ${to}]: from must not exceed to`);
  });

  const tpMin = positiveOrNaN(L.tpMin, 'Tp min');
  const tpMax = positiveOrNaN(L.tpMax, 'Tp max');
  const bedMax = positiveOrNaN(L.bedVelocityMax, 'bed velocity max');
  const windMax = positiveOrNaN(L.windMax, 'wind max');
  const minDepth = positiveOrNaN(L.minDepth, 'min depth');
  const maxDepth = positiveOrNaN(L.maxDepth, 'max depth');
  const currentMax = positiveOrNaN(L.currentMax, 'current max');
  const tw = L.tideWindow ?? null;
  if (tw && !(tw.before >= 0 && tw.after >= 0 && tw.before + tw.after > 0 && Number.isFinite(tw.before + tw.after))) {
    throw new RangeError('tide window: before and after must be finite, >= 0 and not both 0');
  }

  const hsTargets: CompiledHsTarget[] = (L.hsTargets ?? []).map((t) => {
    const max = positiveOrNaN(t.max, `Hs max (${t.target})`);
    if (max !== max) throw new RangeError(`Hs max (${t.target}) must be set`);
    const minPeriodS = t.target === 'longPeriod' ? positiveOrNaN(t.minPeriodS, 'long-period T*') : NaN;
    if (t.target === 'longPeriod' && minPeriodS !== minPeriodS) throw new RangeError('a long-period Hs limit needs its T*');
    return { target: t.target, minPeriodS, max, opwf: max * alphaInRow(alphaTable, row, max) };
  });
  const bandMinHs = L.tpExcludedMinHs ?? DEFAULT_BAND_MIN_HS_M;
  if (!(bandMinHs >= 0 && bandMinHs < Infinity)) throw new RangeError(`band Hs threshold must be finite and >= 0, got ${bandMinHs}`);

  const hasHs = hsMax === hsMax;
  const hasCurve = curve.length >= 2;
  const hasBed = bedMax === bedMax;
  const hasTide = minDepth === minDepth || maxDepth === maxDepth || currentMax === currentMax || tw !== null;
  if (
    !hasHs &&
    !hasCurve &&
    tpMin !== tpMin &&
    tpMax !== tpMax &&
    bands.length === 0 &&
    !hasBed &&
    windMax !== windMax &&
    !hasTide &&
    hsTargets.length === 0
  ) {
    throw new RangeError('an operation needs at least one limit');
  }

  let alphaRow: Float64Array | null = null;
  if (row >= 0) alphaRow = Float64Array.from(alphaTable.values[row]);
  const alphaCols = Float64Array.from(alphaTable.hsColumnsM);
  const alphaSlope = new Float64Array(alphaRow === null ? 0 : Math.max(0, alphaCols.length - 1));
  for (let k = 0; k < alphaSlope.length; k++)
    alphaSlope[k] = ((alphaRow as Float64Array)[k + 1] - (alphaRow as Float64Array)[k]) / (alphaCols[k + 1] - alphaCols[k]);
  const curveSlope = new Float64Array(Math.max(0, curveTp.length - 1));
  for (let k = 0; k < curveSlope.length; k++) curveSlope[k] = (curveHs[k + 1] - curveHs[k]) / (curveTp[k + 1] - curveTp[k]);

  return {
    hsMax,
    hsMaxOpwf,
    curveTp,
    curveHs,
    curveSlope,
    alphaRow,
    alphaCols,
    alphaSlope,
    tpMin,
    tpMax,
    bandFrom,
    bandTo,
    bedMax,
    bedSoulsby: L.bedVelocityMethod === 'soulsby',
    windMax,
    // docs/domain.md#convention-7: Hs for Hs limits, the curve and bed velocity; Tp for the curve, Tp limits,
    // bands and bed velocity; wind for a wind limit.
    needHs: hasHs || hasCurve || hasBed,
    needTp: hasCurve || tpMin === tpMin || tpMax === tpMax || bands.length > 0 || hasBed,
    needBed: hasBed,
    needWind: windMax === windMax,
    minDepth,
    maxDepth,
    currentMax,
    tideWindow: tw,
    needDepth: minDepth === minDepth || maxDepth === maxDepth,
    needCurrent: currentMax === currentMax,
    hsTargets,
    bandMinHs,
    trH,
  };
}

/**
 * Hs limit of the curve at a Tp by linear interpolation, m; NaN outside the curve's closed Tp range
 * (docs/domain.md#convention-6) or for a NaN Tp.
 */
export function curveHsAt(c: CompiledLimits, tpS: number): number {
  const xs = c.curveTp;
  const n = xs.length;
  if (!(tpS >= xs[0] && tpS <= xs[n - 1])) return NaN;
  let j = 1;
  while (j < n - 1 && xs[j] < tpS) j++;
  const x0 = xs[j - 1];
  return c.curveHs[j - 1] + ((c.curveHs[j] - c.curveHs[j - 1]) * (tpS - x0)) / (xs[j] - x0);
}

/** Alpha at an Hs limit value for the compiled row (1 when alpha does not apply). */
export function alphaAt(c: CompiledLimits, hsLimitM: number): number {
  const ys = c.alphaRow;
  if (ys === null) return 1;
  const xs = c.alphaCols;
  const n = xs.length;
  if (hsLimitM <= xs[0]) return ys[0];
  if (hsLimitM >= xs[n - 1]) return ys[n - 1];
  let j = 1;
  while (xs[j] < hsLimitM) j++;
  return ys[j - 1] + ((ys[j] - ys[j - 1]) * (hsLimitM - xs[j - 1])) / (xs[j] - xs[j - 1]);
}

/**
 * Signed distance of a Tp to the excluded bands, s: outside every band, the distance to the nearest
 * edge of any band (> 0); inside a band (edges included, docs/domain.md#convention-6), minus the distance to that
 * band's nearest edge (<= 0). `relOut[0]` receives the smallest relative distance over the bands
 * and edges, distance / edge Tp (dimensionless).
 */
export function bandDistance(c: CompiledLimits, tpS: number, relOut: Float64Array): number {
  let best = Infinity;
  let bestRel = Infinity;
  for (let b = 0; b < c.bandFrom.length; b++) {
    const a = c.bandFrom[b];
    const z = c.bandTo[b];
    let d: number;
    let rel: number;
    if (tpS < a) {
      d = a - tpS;
      rel = d / a;
    } else if (tpS > z) {
      d = tpS - z;
      rel = d / z;
    } else {
      // Inside the closed band: broken; the margin is minus the distance to the nearest edge.
      const da = tpS - a;
      const dz = z - tpS;
      if (da <= dz) {
        d = -da;
        rel = -da / a;
      } else {
        d = -dz;
        rel = -dz / z;
      }
    }
    if (d < best) best = d;
    if (rel < bestRel) bestRel = rel;
  }
  relOut[0] = bestRel;
  return best;
}
