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

/** Work space of {@link evaluateStatusMany}: three int32 bit masks per record of one chunk. */
export interface StatusManyScratch {
  missing: Int32Array;
  broken: Int32Array;
  marginal: Int32Array;
}

/**
 * Records per step of the two passes: the masks of one chunk (3 x 4 bytes per record, 48 kB) are
 * decoded while they are still in the processor's cache, not written for the whole series and
 * read back from memory. A multiple of 4, so that every chunk but the last decodes by words.
 */
const CHUNK = 4096;

/** Work space for series of up to `length` records (the passes need one chunk of it at most). */
export function createStatusManyScratch(length: number): StatusManyScratch {
  const m = Math.min(length, CHUNK);
  return { missing: new Int32Array(m), broken: new Int32Array(m), marginal: new Int32Array(m) };
}

/**
 * Thresholds of one value, ascending, with the OR of the bits of every threshold up to each (index
 * 0: none), and a bucket index over the thresholds' range: a value finds how many thresholds lie
 * below it in about one step instead of a walk through all of them (see {@link countBelow}).
 */
interface AboveList {
  thr: Float64Array;
  /** cum[j]: bits of thresholds 0..j-1 (a value above j thresholds sets cum[j]). */
  cumBroken: Int32Array;
  cumMarginal: Int32Array;
  /** Bucket of a value: bucketOf(x, lo, scale, last). */
  lo: number;
  scale: number;
  last: number;
  /** first[b]: thresholds whose bucket is before b (each below every value in bucket b). */
  first: Int32Array;
}

/** Buckets per threshold (the index stays small: at most MAX_BUCKETS). */
const BUCKETS_PER_THRESHOLD = 64;
const MAX_BUCKETS = 4096;

/**
 * The bucket of x, 0..last: (x - lo) * scale truncated, clamped; NaN in bucket 0. Non-decreasing
 * in x (each step rounds monotonically), so a threshold in an earlier bucket than x is below x,
 * and one in a later bucket is above it.
 */
function bucketOf(x: number, lo: number, scale: number, last: number): number {
  const b = (x - lo) * scale;
  return b >= last ? last : b > 0 ? b | 0 : 0;
}

/**
 * How many thresholds lie strictly below x (NaN: none), as a walk from the first would count
 * them: the thresholds of earlier buckets, then a walk through those of x's own bucket only.
 */
function countBelow(a: AboveList, x: number): number {
  const thr = a.thr;
  const m = thr.length;
  let j = a.first[bucketOf(x, a.lo, a.scale, a.last)];
  while (j < m && x > thr[j]) j++;
  return j;
}

function aboveList(entries: { thr: number; broken: number; marginal: number }[]): AboveList {
  entries.sort((a, b) => a.thr - b.thr);
  const m = entries.length;
  const thr = Float64Array.from(entries, (e) => e.thr);
  const cumBroken = new Int32Array(m + 1);
  const cumMarginal = new Int32Array(m + 1);
  for (let j = 0; j < m; j++) {
    cumBroken[j + 1] = cumBroken[j] | entries[j].broken;
    cumMarginal[j + 1] = cumMarginal[j] | entries[j].marginal;
  }
  // Buckets over [thr[0], thr[m - 1]], and one more for every value above the last threshold.
  let lo = 0;
  let scale = 0;
  let last = 0;
  if (m > 0) {
    const span = thr[m - 1] - thr[0];
    lo = thr[0];
    last = span > 0 && Number.isFinite(span) ? Math.min(MAX_BUCKETS, BUCKETS_PER_THRESHOLD * m) : 1;
    scale = span > 0 && Number.isFinite(span) ? (last - 1) / span : 1;
  }
  const first = new Int32Array(last + 1);
  for (let j = 0; j < m; j++) {
    const b = bucketOf(thr[j], lo, scale, last);
    if (b < last) first[b + 1]++;
  }
  for (let b = 0; b < last; b++) first[b + 1] += first[b];
  return { thr, cumBroken, cumMarginal, lo, scale, last, first };
}

/** An Hs-Tp curve operation: its bit and its curve, prepared as evaluateStatus prepares it. */
interface CurveOp {
  bit: number;
  curve: PreparedCurve;
}

const EMPTY_F64 = new Float64Array(0);
const EMPTY_I32 = new Int32Array(0);

function curveOp(bit: number, c: CompiledLimits): CurveOp {
  return { bit, curve: prepareCurve(c) };
}

/**
 * The curves' terms per distinct Tp (keys), written at [c * keys.length + k] for curve c and key k,
 * so that a record's class takes two comparisons (curveClass, the same numbers): where the key is
 * inside the curve's range, `lim` holds OPLIM clamped to [sureOk, the curve's highest Hs] and `opwf`
 * OPLIM * alpha raised to sureOk; then a record above `lim` breaks the limit and one above `opwf`
 * only meets it at OPLIM, exactly as curveClass finds (the clamps stand for its two shortcuts).
 * A key outside the range sets the curve's bit in `outsideBits` (a broken limit for any Hs).
 */
function curveTables(curves: CurveOp[], keys: Float64Array, lim: Float64Array, opwf: Float64Array, outsideBits: Int32Array): void {
  const m = keys.length;
  curves.forEach((p, c) => {
    const curve = p.curve;
    for (let k = 0; k < m; k++) {
      const t = keys[k];
      if (t < curve.tp0 || t > curve.tpN) {
        outsideBits[k] |= p.bit;
        lim[c * m + k] = -Infinity;
        opwf[c * m + k] = -Infinity;
      } else {
        const l = curveLimit(curve, t);
        lim[c * m + k] = Math.max(Math.min(l, curve.hsMax), curve.sureOk);
        opwf[c * m + k] = Math.max(l * curveAlpha(curve, l), curve.sureOk);
      }
    }
  });
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
 * The bits a Tp value breaks in a group (Tp maximums, Tp minimums, excluded bands), as maskPass
 * finds them per record.
 */
function tpBrokenBits(g: Group, x: number): number {
  let brk = g.tpAbove.cumBroken[countBelow(g.tpAbove, x)];
  brk |= g.tpBelow.cumBroken[countBelow(g.tpBelow, -x)];
  for (let k = 0; k < g.bandFrom.length; k++) if (x >= g.bandFrom[k] && x <= g.bandTo[k]) brk |= g.bandBit[k];
  return brk;
}

/**
 * A group's per-distinct-Tp tables (see maskPass): the bits the Tp limits and the curves' ranges
 * break for each distinct Tp, and the curves' terms (curveTables).
 */
interface TpTables {
  ids: Int32Array;
  keys: Float64Array;
  bits: Int32Array;
  cLim: Float64Array;
  cOpwf: Float64Array;
  cBit: Int32Array;
  tpLimited: boolean;
}

function tpTables(g: Group, n: number, tp: DistinctTp | undefined): TpTables {
  const tpLimited = g.needTp !== 0 || g.tpBelow.thr.length > 0 || g.bandFrom.length > 0;
  const nc = g.curves.length;
  const ids = tp !== undefined && (tpLimited || nc > 0) && tp.ids.length >= n ? tp.ids : EMPTY_I32;
  const keys = ids.length > 0 ? (tp as DistinctTp).keys : EMPTY_F64;
  const nKeys = keys.length;
  const bits = new Int32Array(nKeys);
  const cLim = new Float64Array(nc * nKeys);
  const cOpwf = new Float64Array(nc * nKeys);
  const cBit = Int32Array.from(g.curves, (p) => p.bit);
  if (tpLimited) for (let k = 0; k < nKeys; k++) bits[k] = tpBrokenBits(g, keys[k]);
  if (nKeys > 0) curveTables(g.curves, keys, cLim, cOpwf, bits);
  return { ids, keys, bits, cLim, cOpwf, cBit, tpLimited };
}

/**
 * Records [from, to) of a group against every threshold in one pass (Hs, Tp maximums, Tp minimums
 * and bands, both bed velocities, wind, then each Hs-Tp curve), setting one bit per operation in
 * three masks (record i at i - from): a needed value missing, a limit broken, an Hs limit met at
 * OPLIM only. Each value is compared with the sorted thresholds of every operation at once: the
 * count of thresholds below it (found through the list's bucket index, countBelow) indexes the OR of
 * their bits. Where the series' distinct Tp values are given, the Tp limits' bits and the curves'
 * terms come from the tables worked once per distinct value (tpTables); a record whose Tp is not
 * its key's value, or that has none, is worked directly, as evaluateStatus works it. One loop of
 * fixed shape for every mix of operations, so the JIT compiles it once; the masks are written once
 * per record.
 */
function maskPass(series: SiteSeries, g: Group, t: TpTables, from: number, to: number, s: StatusManyScratch): void {
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
  // Each list's thresholds, bits and bucket index in locals (countBelow written out in the loop).
  const hsT = g.hs.thr;
  const hsB = g.hs.cumBroken;
  const hsM = g.hs.cumMarginal;
  const mHs = hsT.length;
  const hsF = g.hs.first;
  const hsLo = g.hs.lo;
  const hsSc = g.hs.scale;
  const hsLast = g.hs.last;
  const lT = g.lin.thr;
  const lB = g.lin.cumBroken;
  const mL = lT.length;
  const sT = g.soul.thr;
  const sB = g.soul.cumBroken;
  const mS = sT.length;
  const wT = g.wind.thr;
  const wB = g.wind.cumBroken;
  const mW = wT.length;
  const wF = g.wind.first;
  const wLo = g.wind.lo;
  const wSc = g.wind.scale;
  const wLast = g.wind.last;
  const curves = g.curves;
  const nc = curves.length;
  const { ids: tpIds, keys: tpKeys, bits: tpBits, cLim, cOpwf, cBit, tpLimited } = t;
  const nKeys = tpKeys.length;
  for (let i = from; i < to; i++) {
    let x = hsV[i];
    let b = (x - hsLo) * hsSc;
    let j = hsF[b >= hsLast ? hsLast : b > 0 ? b | 0 : 0];
    while (j < mHs && x > hsT[j]) j++;
    let miss = x !== x ? needHs : 0;
    let brk = hsB[j];
    let mar = hsM[j];
    const h = x;
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
      b = (x - wLo) * wSc;
      j = wF[b >= wLast ? wLast : b > 0 ? b | 0 : 0];
      while (j < mW && x > wT[j]) j++;
      if (x !== x) miss |= needWind;
      brk |= wB[j];
    }
    // Tp limits and curves: by the distinct Tp's tables where the record's Tp is its key's value.
    const tpId = tpIds.length > 0 ? tpIds[i] : -1;
    if (tpId >= 0 && tpKeys[tpId] === tpV[i]) {
      brk |= tpBits[tpId];
      for (let c = 0, o = tpId; c < nc; c++, o += nKeys) {
        if (h > cLim[o]) brk |= cBit[c];
        else if (h > cOpwf[o]) mar |= cBit[c];
      }
    } else {
      x = tpV[i];
      if (x !== x) miss |= needTp;
      if (tpLimited) brk |= tpBrokenBits(g, x);
      for (let c = 0; c < nc; c++) {
        const k = curveClass(curves[c].curve, h, x);
        if (k === 2) brk |= cBit[c];
        else if (k === 1) mar |= cBit[c];
      }
    }
    const r = i - from;
    missing[r] = miss;
    broken[r] = brk;
    marginal[r] = mar;
  }
}

/**
 * Every operation's STATUS code for records [from, to) from the three masks of those records
 * (record i at i - from; outs[k]: operation k's codes). The two bits of each code (NO_DATA 00,
 * NOT_WORKABLE 01, MARGINAL 10, WORKABLE 11): high = data and nothing broken; low = data and
 * (broken, or not marginal). With `words` (every buffer starting on a 4-byte boundary, as new
 * arrays do) and `from` a multiple of 4, four records at a time (decodeWords).
 */
function decodePass(from: number, to: number, s: StatusManyScratch, outs: Uint8Array[], words: Uint32Array[] | null): void {
  const { missing, broken, marginal } = s;
  const K = outs.length;
  let i = from;
  if (words !== null && from % 4 === 0) i += decodeWords(from >>> 2, (to - from) >>> 2, missing, broken, marginal, words);
  for (; i < to; i++) {
    const r = i - from;
    const miss = missing[r];
    const brk = broken[r];
    const high = ~(miss | brk);
    const low = ~miss & (brk | ~marginal[r]);
    for (let k = 0; k < K; k++) outs[k][i] = (((high >>> k) & 1) << 1) | ((low >>> k) & 1);
  }
}

const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/** 32-bit views of the operations' code buffers (n records), or null where one does not start on a 4-byte boundary. */
function wordViews(outs: Uint8Array[], n: number): Uint32Array[] | null {
  if (!LITTLE_ENDIAN || !outs.every((o) => o.byteOffset % 4 === 0)) return null;
  return outs.map((o) => new Uint32Array(o.buffer, o.byteOffset, n >>> 2));
}

/**
 * decodePass four records at a time from word q0 (record 4 * q0, the masks' index 0) for nw words,
 * each operation's four codes written as one 32-bit word (little-endian). Returns the records done.
 */
function decodeWords(q0: number, nw: number, missing: Int32Array, broken: Int32Array, marginal: Int32Array, words: Uint32Array[]): number {
  const K = words.length;
  for (let w = 0; w < nw; w++) {
    const i = w << 2;
    const q = q0 + w;
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
 * into the two bits of each operation's STATUS code and writes every operation's code. The two
 * passes take the records a chunk at a time (CHUNK), so the masks never leave the cache. Any other
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
  const s = options.scratch && options.scratch.missing.length >= Math.min(n, CHUNK) ? options.scratch : createStatusManyScratch(n);
  const chunk = Math.min(CHUNK, s.missing.length, s.broken.length, s.marginal.length);
  for (let first = 0; first < fast.length; first += GROUP) {
    const part = compiled.slice(first, first + GROUP);
    const g = compileGroup(part);
    const tables = tpTables(g, n, options.tpDistinct);
    const outs = part.map((_, k) => result[fast[first + k]]);
    const words = wordViews(outs, n);
    for (let from = 0; from < n; from += chunk) {
      const to = Math.min(n, from + chunk);
      maskPass(series, g, tables, from, to, s);
      decodePass(from, to, s, outs, words);
    }
  }
  return result;
}
