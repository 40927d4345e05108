import { compileLimits, type CompiledLimits } from './compiled-limits';
import { evaluateStatus } from './evaluate-status';
import { assertSeriesLengths } from './evaluate-hours';
import { curveAlpha, curveClass, curveLimit, prepareCurve, type PreparedCurve } from './hs-tp-curve';
import { STATUS, type AlphaTable, type OperationSpec, type SiteSeries } from './types';

/**
 * The limit kinds the one-pass path below knows. An operation with any other limit set (a kind
 * added to the engine later) is evaluated by the general path, evaluateStatus, unchanged.
 */
const KNOWN_LIMIT_KEYS: ReadonlySet<string> = new Set([
  'hsMax',
  'hsTpCurve',
  'tpMin',
  'tpMax',
  'tpExcluded',
  'bedVelocityMax',
  'bedVelocityMethod',
  'windMax',
]);

/** The fields of an operation this path knows; any other one set sends the operation to the general path. */
const KNOWN_OPERATION_KEYS: ReadonlySet<string> = new Set(['tpopH', 'tcH', 'weatherRestricted', 'limits']);

/** Operations per group of bit masks (one bit per operation in an int32). */
const GROUP = 32;

// decodePass writes the two status bits as the code: NO_DATA 0, NOT_WORKABLE 1, MARGINAL 2, WORKABLE 3.
if (STATUS.NO_DATA !== 0 || STATUS.NOT_WORKABLE !== 1 || STATUS.MARGINAL !== 2 || STATUS.WORKABLE !== 3) {
  throw new Error('evaluateStatusMany: STATUS codes changed; update decodePass');
}

/**
 * True when {@link evaluateStatusMany} evaluates this operation in its own passes: every limit it
 * sets is of a kind those passes know, and it has no other field set beside TPOP, TC, the
 * weather-restricted flag and the limits. Otherwise the operation goes to the general path.
 */
export function statusFastPathKnows(op: OperationSpec): boolean {
  // A field of the operation beside its limits that this path does not know may be a limit too.
  const fields = op as unknown as Record<string, unknown>;
  for (const key of Object.keys(fields)) {
    if (fields[key] != null && !KNOWN_OPERATION_KEYS.has(key)) return false;
  }
  const limits = op.limits as Record<string, unknown>;
  for (const key of Object.keys(limits)) {
    if (limits[key] != null && !KNOWN_LIMIT_KEYS.has(key)) return false;
  }
  return true;
}

/** Options of {@link evaluateStatusMany}. */
export interface EvaluateStatusManyOptions {
  /** Apply alpha (OPWF = alpha * OPLIM on the Hs limits). Default true (docs/domain.md#convention-14). */
  alpha?: boolean;
  alphaTable: AlphaTable;
  /** One buffer per operation to write into, each at least as long as the series. */
  out?: Uint8Array[];
  /** Reusable work space (see {@link createStatusManyScratch}). */
  scratch?: StatusManyScratch;
  /**
   * The series' distinct Tp values and each record's index among them (prepareSeaInput's `tpIds`
   * and `tpKeys` for the data point whose Tp the series carries): Hs-Tp curves are then
   * interpolated once per distinct Tp. A record whose Tp is not its key's value (or whose index is
   * -1) is evaluated directly, so the results never depend on this option.
   */
  tpDistinct?: DistinctTp;
}

/** Distinct values of a Tp series: record i has Tp keys[ids[i]], or ids[i] = -1. */
export interface DistinctTp {
  ids: Int32Array;
  keys: Float64Array;
}

/** Work space of {@link evaluateStatusMany}: three int32 bit masks per record. */
export interface StatusManyScratch {
  missing: Int32Array;
  broken: Int32Array;
  marginal: Int32Array;
}

/** Work space for series of up to `length` records. */
export function createStatusManyScratch(length: number): StatusManyScratch {
  return { missing: new Int32Array(length), broken: new Int32Array(length), marginal: new Int32Array(length) };
}

/** Thresholds of one value, ascending, with the OR of the bits of every threshold up to each (index 0: none). */
interface AboveList {
  thr: Float64Array;
  /** cum[j]: bits of thresholds 0..j-1 (a value above j thresholds sets cum[j]). */
  cumBroken: Int32Array;
  cumMarginal: Int32Array;
}

function aboveList(entries: { thr: number; broken: number; marginal: number }[]): AboveList {
  entries.sort((a, b) => a.thr - b.thr);
  const thr = Float64Array.from(entries, (e) => e.thr);
  const cumBroken = new Int32Array(entries.length + 1);
  const cumMarginal = new Int32Array(entries.length + 1);
  for (let j = 0; j < entries.length; j++) {
    cumBroken[j + 1] = cumBroken[j] | entries[j].broken;
    cumMarginal[j + 1] = cumMarginal[j] | entries[j].marginal;
  }
  return { thr, cumBroken, cumMarginal };
}

/** An Hs-Tp curve operation: its bit and its curve, prepared as evaluateStatus prepares it. */
interface CurveOp {
  bit: number;
  curve: PreparedCurve;
  /** Per distinct Tp (see curveTable); empty when the series' distinct Tp values are not given. */
  outside: Uint8Array;
  lim: Float64Array;
  opwf: Float64Array;
}

const EMPTY_U8 = new Uint8Array(0);
const EMPTY_F64 = new Float64Array(0);
const EMPTY_I32 = new Int32Array(0);

function curveOp(bit: number, c: CompiledLimits): CurveOp {
  return { bit, curve: prepareCurve(c), outside: EMPTY_U8, lim: EMPTY_F64, opwf: EMPTY_F64 };
}

/**
 * curveClass's terms per distinct Tp (keys): 1 in `outside` where the Tp is outside the curve's
 * range, else OPLIM in `lim` and OPWF (OPLIM * alpha) in `opwf`, the same numbers curveClass
 * computes for that Tp; so a record's class takes two look-ups instead of the interpolations.
 */
function curveTable(p: CurveOp, keys: Float64Array): void {
  const m = keys.length;
  p.outside = new Uint8Array(m);
  p.lim = new Float64Array(m);
  p.opwf = new Float64Array(m);
  const curve = p.curve;
  for (let k = 0; k < m; k++) {
    const t = keys[k];
    if (t < curve.tp0 || t > curve.tpN) p.outside[k] = 1;
    else {
      const lim = curveLimit(curve, t);
      p.lim[k] = lim;
      p.opwf[k] = lim * curveAlpha(curve, lim);
    }
  }
}

/** curveClass of a record whose Tp is keys[id] (curveTable), from the table. */
function curveClassTabled(p: CurveOp, h: number, id: number): number {
  if (p.outside[id] === 1 || h > p.curve.hsMax) return 2;
  if (h <= p.curve.sureOk) return 0;
  return (h > p.opwf[id] ? 1 : 0) + (h > p.lim[id] ? 1 : 0);
}

/** One group of up to 32 operations, compiled into per-value threshold lists. */
interface Group {
  needHs: number;
  needTp: number;
  needLin: number;
  needSoul: number;
  needWind: number;
  hs: AboveList;
  tpAbove: AboveList;
  /** Tp minimums as thresholds on -Tp (Tp < min exactly when -Tp > -min). */
  tpBelow: AboveList;
  lin: AboveList;
  soul: AboveList;
  wind: AboveList;
  bandFrom: Float64Array;
  bandTo: Float64Array;
  bandBit: Int32Array;
  curves: CurveOp[];
}

function compileGroup(compiled: CompiledLimits[]): Group {
  let needHs = 0;
  let needTp = 0;
  let needLin = 0;
  let needSoul = 0;
  let needWind = 0;
  const hs: { thr: number; broken: number; marginal: number }[] = [];
  const tpAbove: typeof hs = [];
  const tpBelow: typeof hs = [];
  const lin: typeof hs = [];
  const soul: typeof hs = [];
  const wind: typeof hs = [];
  const bandFrom: number[] = [];
  const bandTo: number[] = [];
  const bandBit: number[] = [];
  const curves: CurveOp[] = [];
  compiled.forEach((c, k) => {
    const bit = 1 << k;
    if (c.needHs) needHs |= bit;
    if (c.needTp) needTp |= bit;
    if (c.needWind) needWind |= bit;
    if (c.needBed) {
      if (c.bedSoulsby) {
        needSoul |= bit;
        soul.push({ thr: c.bedMax, broken: bit, marginal: 0 });
      } else {
        needLin |= bit;
        lin.push({ thr: c.bedMax, broken: bit, marginal: 0 });
      }
    }
    if (c.hsMax === c.hsMax) {
      // Above OPWF marginal, above OPLIM broken (inclusive limits; with alpha = 1 both are OPLIM).
      hs.push({ thr: c.hsMaxOpwf, broken: 0, marginal: bit });
      hs.push({ thr: c.hsMax, broken: bit, marginal: 0 });
    }
    if (c.curveTp.length >= 2) curves.push(curveOp(bit, c));
    if (c.tpMin === c.tpMin) tpBelow.push({ thr: -c.tpMin, broken: bit, marginal: 0 });
    if (c.tpMax === c.tpMax) tpAbove.push({ thr: c.tpMax, broken: bit, marginal: 0 });
    for (let b = 0; b < c.bandFrom.length; b++) {
      bandFrom.push(c.bandFrom[b]);
      bandTo.push(c.bandTo[b]);
      bandBit.push(bit);
    }
    if (c.needWind) wind.push({ thr: c.windMax, broken: bit, marginal: 0 });
  });
  return {
    needHs,
    needTp,
    needLin,
    needSoul,
    needWind,
    hs: aboveList(hs),
    tpAbove: aboveList(tpAbove),
    tpBelow: aboveList(tpBelow),
    lin: aboveList(lin),
    soul: aboveList(soul),
    wind: aboveList(wind),
    bandFrom: Float64Array.from(bandFrom),
    bandTo: Float64Array.from(bandTo),
    bandBit: Int32Array.from(bandBit),
    curves,
  };
}

/**
 * Every record of a group against every threshold in one pass (Hs, Tp maximums, Tp minimums and
 * bands, both bed velocities, wind, then each Hs-Tp curve), setting one bit per operation in three
 * masks: a needed value missing, a limit broken, an Hs limit met at OPLIM only. Each value is
 * compared with the sorted thresholds of every operation at once (the count of thresholds below
 * it indexes the OR of their bits). One loop of fixed shape for every mix of operations, so the
 * JIT compiles it once; the masks are written once per record.
 */
function maskPass(series: SiteSeries, g: Group, n: number, s: StatusManyScratch, tp: DistinctTp | undefined): void {
  const { missing, broken, marginal } = s;
  const hsV = series.hsM;
  const tpV = series.tpS;
  const linV = series.bedVelocityLinearMps;
  const soulV = series.bedVelocitySoulsbyMps;
  const windV = series.windMps;
  const needHs = g.needHs;
  const needTp = g.needTp;
  const needLin = g.needLin;
  const needSoul = g.needSoul;
  const needWind = g.needWind;
  const hsT = g.hs.thr;
  const hsB = g.hs.cumBroken;
  const hsM = g.hs.cumMarginal;
  const mHs = hsT.length;
  const taT = g.tpAbove.thr;
  const taB = g.tpAbove.cumBroken;
  const mTa = taT.length;
  const tbT = g.tpBelow.thr;
  const tbB = g.tpBelow.cumBroken;
  const mTb = tbT.length;
  const bandFrom = g.bandFrom;
  const bandTo = g.bandTo;
  const bandBit = g.bandBit;
  const nb = bandFrom.length;
  const tpLow = mTb > 0 || nb > 0;
  const lT = g.lin.thr;
  const lB = g.lin.cumBroken;
  const mL = lT.length;
  const sT = g.soul.thr;
  const sB = g.soul.cumBroken;
  const mS = sT.length;
  const wT = g.wind.thr;
  const wB = g.wind.cumBroken;
  const mW = wT.length;
  const curves = g.curves;
  const nc = curves.length;
  // Curves by table where the distinct Tp values are given (a record whose Tp is not its key's
  // value, or that has none, takes curveClass itself).
  const tpIds = tp !== undefined && nc > 0 && tp.ids.length >= n ? tp.ids : EMPTY_I32;
  const tpKeys = tpIds.length > 0 ? (tp as DistinctTp).keys : EMPTY_F64;
  if (tpIds.length > 0) for (const p of curves) curveTable(p, tpKeys);
  for (let i = 0; i < n; i++) {
    let x = hsV[i];
    let j = 0;
    while (j < mHs && x > hsT[j]) j++;
    let miss = x !== x ? needHs : 0;
    let brk = hsB[j];
    let mar = hsM[j];
    if (needTp !== 0) {
      x = tpV[i];
      j = 0;
      while (j < mTa && x > taT[j]) j++;
      if (x !== x) miss |= needTp;
      brk |= taB[j];
    }
    if (tpLow) {
      x = tpV[i];
      const y = -x;
      j = 0;
      while (j < mTb && y > tbT[j]) j++;
      brk |= tbB[j];
      for (let k = 0; k < nb; k++) if (x >= bandFrom[k] && x <= bandTo[k]) brk |= bandBit[k];
    }
    if (needLin !== 0) {
      x = linV[i];
      j = 0;
      while (j < mL && x > lT[j]) j++;
      if (x !== x) miss |= needLin;
      brk |= lB[j];
    }
    if (needSoul !== 0) {
      x = soulV[i];
      j = 0;
      while (j < mS && x > sT[j]) j++;
      if (x !== x) miss |= needSoul;
      brk |= sB[j];
    }
    if (needWind !== 0) {
      x = windV[i];
      j = 0;
      while (j < mW && x > wT[j]) j++;
      if (x !== x) miss |= needWind;
      brk |= wB[j];
    }
    const tpId = tpIds.length > 0 ? tpIds[i] : -1;
    const tabled = tpId >= 0 && tpKeys[tpId] === tpV[i];
    for (let c = 0; c < nc; c++) {
      const p = curves[c];
      const k = tabled ? curveClassTabled(p, hsV[i], tpId) : curveClass(p.curve, hsV[i], tpV[i]);
      if (k === 2) brk |= p.bit;
      else if (k === 1) mar |= p.bit;
    }
    missing[i] = miss;
    broken[i] = brk;
    marginal[i] = mar;
  }
}

/**
 * Every operation's STATUS code from the three masks, record by record (outs[k]: operation k's
 * codes). The two bits of each code (NO_DATA 00, NOT_WORKABLE 01, MARGINAL 10, WORKABLE 11):
 * high = data and nothing broken; low = data and (broken, or not marginal). Where every buffer
 * starts on a 4-byte boundary (as new arrays do), four records at a time (decodeWords).
 */
function decodePass(n: number, missing: Int32Array, broken: Int32Array, marginal: Int32Array, outs: Uint8Array[]): void {
  const K = outs.length;
  let from = 0;
  if (LITTLE_ENDIAN && outs.every((o) => o.byteOffset % 4 === 0)) {
    const words = outs.map((o) => new Uint32Array(o.buffer, o.byteOffset, n >>> 2));
    from = decodeWords(n >>> 2, missing, broken, marginal, words);
  }
  for (let i = from; i < n; i++) {
    const miss = missing[i];
    const brk = broken[i];
    const high = ~(miss | brk);
    const low = ~miss & (brk | ~marginal[i]);
    for (let k = 0; k < K; k++) outs[k][i] = (((high >>> k) & 1) << 1) | ((low >>> k) & 1);
  }
}

const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/** decodePass four records at a time, each operation's four codes written as one 32-bit word (little-endian). Returns the records done. */
function decodeWords(nw: number, missing: Int32Array, broken: Int32Array, marginal: Int32Array, words: Uint32Array[]): number {
  const K = words.length;
  for (let q = 0; q < nw; q++) {
    const i = q << 2;
    let m = missing[i];
    let b = broken[i];
    const h0 = ~(m | b);
    const l0 = ~m & (b | ~marginal[i]);
    m = missing[i + 1];
    b = broken[i + 1];
    const h1 = ~(m | b);
    const l1 = ~m & (b | ~marginal[i + 1]);
    m = missing[i + 2];
    b = broken[i + 2];
    const h2 = ~(m | b);
    const l2 = ~m & (b | ~marginal[i + 2]);
    m = missing[i + 3];
    b = broken[i + 3];
    const h3 = ~(m | b);
    const l3 = ~m & (b | ~marginal[i + 3]);
    for (let k = 0; k < K; k++) {
      words[k][q] =
        (((h0 >>> k) & 1) << 1) |
        ((l0 >>> k) & 1) |
        ((((h1 >>> k) & 1) << 9) | (((l1 >>> k) & 1) << 8)) |
        ((((h2 >>> k) & 1) << 17) | (((l2 >>> k) & 1) << 16)) |
        ((((h3 >>> k) & 1) << 25) | (((l3 >>> k) & 1) << 24));
    }
  }
  return nw << 2;
}

/**
 * Hourly status of several operations at one worksite: for every operation the same codes as
 * {@link evaluateStatus} gives (docs/domain.md#hourly-status, #convention-5 to #convention-7), faster when
 * there are several operations.
 *
 * Method: the operations whose limits are all of the kinds known here (Hs max, Hs-Tp curve, Tp
 * min/max, excluded Tp bands, bed velocity, wind) are evaluated together, 32 at a time: one pass
 * over the records compares each input value (Hs, Tp, each bed velocity, wind; each curve) with
 * the sorted thresholds of every operation and sets one bit per operation in three masks (a needed
 * value missing, a limit broken, an Hs limit met at OPLIM only); a second pass turns the masks
 * into the two bits of each operation's STATUS code and writes every operation's code. Any other
 * operation (a limit kind added to the engine later) goes to evaluateStatus unchanged, so the
 * results never depend on which path ran (a property test compares the two).
 *
 * @returns one STATUS array per operation, in the operations' order (views of `out` when given)
 * @throws RangeError as evaluateStatus does (invalid limits, unequal arrays, short buffers).
 */
export function evaluateStatusMany(series: SiteSeries, ops: readonly OperationSpec[], options: EvaluateStatusManyOptions): Uint8Array[] {
  assertSeriesLengths(series);
  const n = series.timeMs.length;
  const useAlpha = options.alpha !== false;
  const result: Uint8Array[] = new Array<Uint8Array>(ops.length);
  const fast: number[] = [];
  const compiled: CompiledLimits[] = [];
  ops.forEach((op, o) => {
    const buf = options.out?.[o];
    if (buf && buf.length < n) throw new RangeError(`evaluateStatusMany: out buffer ${o} shorter than the series`);
    // Bands over a partitioned series test the partitions too: the general path does that.
    const partitionBands = series.partitions !== undefined && (op.limits.tpExcluded?.length ?? 0) > 0;
    if (statusFastPathKnows(op) && !partitionBands) {
      compiled.push(compileLimits(op, options.alphaTable, useAlpha));
      fast.push(o);
      result[o] = buf ? (buf.length === n ? buf : buf.subarray(0, n)) : new Uint8Array(n);
    } else {
      result[o] = evaluateStatus(series, op, { alpha: options.alpha, alphaTable: options.alphaTable, out: buf });
    }
  });
  if (fast.length === 0) return result;
  const s = options.scratch && options.scratch.missing.length >= n ? options.scratch : createStatusManyScratch(n);
  for (let from = 0; from < fast.length; from += GROUP) {
    const part = compiled.slice(from, from + GROUP);
    maskPass(series, compileGroup(part), n, s, options.tpDistinct);
    decodePass(
      n,
      s.missing,
      s.broken,
      s.marginal,
      part.map((_, k) => result[fast[from + k]]),
    );
  }
  return result;
}
