/**
 * Transformation of sea states from the data point to a worksite (docs/domain.md#transformation,
 * steps 1-6, and #convention-1 to #convention-4, #convention-8 and #convention-17): refraction over straight,
 * parallel depth contours (Snell's law), shoaling by conservation of energy flux (linear theory at
 * Tp), a depth limit, or a transfer table instead of refraction and shoaling.
 *
 * Caution to show with the results: straight-contour refraction and shoaling only, with no
 * diffraction, currents, local wind growth or bottom friction.
 */
import { wrapDegrees180, wrapDegrees360 } from './angles';
import { DEG_TO_RAD, G_DEFAULT_MPS2, RAD_TO_DEG, TWO_PI } from './constants';
import { relativeDepthFromTable } from './dispersion-table';
import { celerities } from './celerity';
import { FloatKeyIndex } from './float-key-index';
import { csch, groupCelerityRatio } from './hyperbolic';
import { JONSWAP_GAMMA_DEFAULT, jonswapTzOverTp } from './period-conversion';
import { soulsbyVelocityPerHs } from './sea-state';
import { transferBandIndex, transferSectorIndex, validateTransferTable, type TransferTable } from './transfer-table';
import { DEEP_WATER_KD, waveNumber } from './wave-number';

export type { TransferTable } from './transfer-table';

/** The data point of a dataset. */
export interface SourcePoint {
  /** Water depth at the data point, m, > 0; Infinity = deep water (unknown depth, docs/domain.md#convention-1). */
  depthM: number;
}

/** A worksite's geometry for the transformation. */
export interface SiteGeometry {
  /** Water depth at the worksite, m, > 0 and finite. */
  depthM: number;
  /**
   * Shore-normal bearing beta, degrees: the "coming from" direction of waves that cross the depth
   * contours head-on. null: no refraction (Kr = 1, direction kept).
   */
  shoreNormalDeg: number | null;
  /** Breaker index gamma_b for Hs: depth limit Hs <= gamma_b*d (common practice 0.6), > 0. */
  breakerIndex: number;
  /** Optional transfer table; used instead of refraction and shoaling when present. */
  transferTable?: TransferTable | null;
}

/** Sea states at the data point, one record per index; NaN = missing. */
export interface SeaSeriesInput {
  /** Significant wave height Hs, m. */
  hsM: Float64Array;
  /** Peak period Tp, s (the period used for the transformation). */
  tpS: Float64Array;
  /** Mean zero-crossing period Tz, s (for the Soulsby bed velocity); may be all NaN. */
  tzS: Float64Array;
  /** Mean direction, degrees "coming from"; may be all NaN when the site has no bearing. */
  dirDeg: Float64Array;
  /**
   * Water level above the worksite's chart datum, m (docs/domain.md#tide), or absent for a fixed
   * depth. With it, each record's still-water depth is h = d_site + level: dispersion, shoaling,
   * refraction, the depth limit gamma_b*h and the bed velocities use h; h <= 0 is DRY (no data);
   * a NaN level makes the record MISSING_INPUT.
   */
  waterLevelM?: Float64Array | null;
}

/** Per-record flags of the transformation (bits). */
export const TRANSFORM_FLAG = {
  /** |theta_src| >= 90 deg: sea from the landward side; shoaling only, direction kept (docs/domain.md#convention-2). */
  LANDWARD: 1,
  /** Hs capped at gamma_b*d (docs/domain.md#convention-4: only when strictly greater). */
  DEPTH_LIMITED: 2,
  /** |sin(theta_site)| would reach or exceed 1 (site deeper than the data point): Kr = 1, direction kept. */
  REFRACTION_SKIPPED: 4,
  /** The transfer table gave the factor (ks holds it, kr = 1). */
  TRANSFER_TABLE: 8,
  /** Hs or Tp missing (or invalid), or the direction missing when it is needed: outputs are NaN. */
  MISSING_INPUT: 16,
  /** Still-water depth h = d_site + water level <= 0: the worksite is dry, no wave data (docs/domain.md#tide). */
  DRY: 32,
} as const;

export type TransformFlagName = keyof typeof TRANSFORM_FLAG;

/**
 * Names of the flags set in a flag byte, in bit order.
 * @example transformFlagNames(3) // ['LANDWARD', 'DEPTH_LIMITED']
 */
export function transformFlagNames(flags: number): TransformFlagName[] {
  return (Object.keys(TRANSFORM_FLAG) as TransformFlagName[]).filter((name) => (flags & TRANSFORM_FLAG[name]) !== 0);
}

/** Sea states at the worksite, one per input record. */
export interface SiteSeries {
  /** Hs at the worksite after the depth limit, m (NaN when MISSING_INPUT). */
  hsM: Float64Array;
  /** Mean direction at the worksite, degrees in [0, 360) (NaN when unknown or missing). */
  dirDeg: Float64Array;
  /** Shoaling coefficient Ks = sqrt(Cg_src/Cg_site); with a transfer table, the table's factor. */
  ks: Float32Array;
  /** Refraction coefficient Kr = sqrt(cos(theta_src)/cos(theta_site)); 1 when not refracted. */
  kr: Float32Array;
  /** TRANSFORM_FLAG bits. */
  flags: Uint8Array;
  /** Linear significant bed velocity at the worksite, pi*Hs/(Tp*sinh(k_p*d)), m/s. */
  bedVelocityLinearMps: Float64Array;
  /** Soulsby (2006) significant bed velocity at the worksite, m/s (Tz per docs/domain.md#convention-8). */
  bedVelocitySoulsbyMps: Float64Array;
  /** Still-water depth h per record, m, when a water level was given (docs/domain.md#tide). */
  depthM?: Float64Array;
}

/** Options of the transformation. */
export interface TransformOptions {
  /** Gravitational acceleration, m/s2 (default 9.81). */
  g?: number;
  /** JONSWAP gamma for Tz from Tp when Tz is missing (default 3.3, docs/domain.md#convention-8). */
  gamma?: number;
  /** Output arrays to fill (each of the input length), to avoid allocation in repeated runs. */
  out?: SiteSeries;
  /**
   * 'engine' fills only what the go/no-go engine reads (hsM and both bed velocities, the same
   * values bit for bit) and leaves dirDeg, ks, kr and flags of `out` untouched: faster for
   * statistics over long series. Default 'all'.
   */
  fields?: 'all' | 'engine';
  /** The input's distinct values, from {@link prepareSeaInput} on this same input: shared by every worksite. */
  prepared?: PreparedSeaInput;
}

/**
 * The distinct Tp and direction values of a data point's series and each record's index into
 * them, found once and shared by the transformation to every worksite (see {@link prepareSeaInput}).
 */
export interface PreparedSeaInput {
  readonly input: SeaSeriesInput;
  /** Index of each record's Tp among `tpKeys`; -1 when missing, not finite or not positive. */
  readonly tpIds: Int32Array;
  readonly tpKeys: Float64Array;
  /** Index of each record's direction among `dirKeys`; -1 when missing. */
  readonly dirIds: Int32Array;
  readonly dirKeys: Float64Array;
  /** Some record has a usable Tz (finite, positive). */
  readonly anyTz: boolean;
}

/**
 * Finds the distinct Tp and direction values of a series once, for {@link transformToSite}'s
 * `prepared` option when one series goes to several worksites. The input arrays must not change
 * while the result is in use. `buffers` (each at least as long as the series) receive the record
 * indices instead of new arrays, for repeated runs (fresh memory costs a page fault per 4 kB); the
 * result's `tpIds` and `dirIds` are then views of them, valid until the buffers are used again.
 */
export function prepareSeaInput(input: SeaSeriesInput, buffers?: { tpIds: Int32Array; dirIds: Int32Array }): PreparedSeaInput {
  const n = input.hsM.length;
  if (input.tpS.length !== n || input.tzS.length !== n || input.dirDeg.length !== n) {
    throw new RangeError('hsM, tpS, tzS and dirDeg must have the same length');
  }
  if (buffers && (buffers.tpIds.length < n || buffers.dirIds.length < n)) {
    throw new RangeError(`prepareSeaInput: buffers shorter than the series (${n} records)`);
  }
  const tpIds = buffers ? buffers.tpIds.subarray(0, n) : new Int32Array(n);
  const tpKeys = new FloatKeyIndex(1024).assignIds(input.tpS, tpIds, true);
  const dirIds = buffers ? buffers.dirIds.subarray(0, n) : new Int32Array(n);
  const dirKeys = new FloatKeyIndex(1024).assignIds(input.dirDeg, dirIds, false);
  return { input, tpIds, tpKeys, dirIds, dirKeys, anyTz: hasUsableTz(input.tzS) };
}

function hasUsableTz(tz: Float64Array): boolean {
  for (let i = 0; i < tz.length; i++) if (tz[i] > 0 && tz[i] < Infinity) return true;
  return false;
}

/**
 * Allocates a `SiteSeries` of `length` records (all zero).
 * @param length - number of records, >= 0.
 */
export function createSiteSeries(length: number): SiteSeries {
  return {
    hsM: new Float64Array(length),
    dirDeg: new Float64Array(length),
    ks: new Float32Array(length),
    kr: new Float32Array(length),
    flags: new Uint8Array(length),
    bedVelocityLinearMps: new Float64Array(length),
    bedVelocitySoulsbyMps: new Float64Array(length),
  };
}

interface CheckedSetup {
  g: number;
  tzOverTp: number;
  sourceDepthM: number;
  siteDepthM: number;
  bearing: number | null;
  depthLimitM: number;
  breakerIndex: number;
  table: TransferTable | null;
}

function checkSetup(source: SourcePoint, site: SiteGeometry, options: TransformOptions | undefined): CheckedSetup {
  const g = options?.g ?? G_DEFAULT_MPS2;
  if (!(g > 0 && g < Infinity)) throw new RangeError(`g must be a positive finite number, got ${g}`);
  const tzOverTp = jonswapTzOverTp(options?.gamma ?? JONSWAP_GAMMA_DEFAULT);
  if (!(source.depthM > 0)) throw new RangeError(`source depthM must be > 0 (Infinity = deep), got ${source.depthM}`);
  if (!(site.depthM > 0 && site.depthM < Infinity)) {
    throw new RangeError(`site depthM must be a positive finite number, got ${site.depthM}`);
  }
  if (!(site.breakerIndex > 0 && site.breakerIndex < Infinity)) {
    throw new RangeError(`site breakerIndex must be a positive finite number, got ${site.breakerIndex}`);
  }
  const bearing = site.shoreNormalDeg ?? null;
  if (bearing !== null && !Number.isFinite(bearing)) {
    throw new RangeError(`site shoreNormalDeg must be a finite number or null, got ${bearing}`);
  }
  const table = site.transferTable ?? null;
  if (table) validateTransferTable(table);
  return {
    g,
    tzOverTp,
    sourceDepthM: source.depthM,
    siteDepthM: site.depthM,
    bearing: bearing === null ? null : wrapDegrees360(bearing),
    depthLimitM: site.breakerIndex * site.depthM,
    breakerIndex: site.breakerIndex,
    table,
  };
}

/** Period-dependent quantities of the transformation (shared by the series and single-record paths). */
interface PeriodTerms {
  cSrc: number;
  cgSrc: number;
  cSite: number;
  cgSite: number;
  /** C_site/C_src (Snell). */
  cRatio: number;
  /** sqrt(Cg_src/Cg_site). */
  ks: number;
  /** u_bs per metre of Hs at the site: pi*csch(k_p*d_site)/Tp, 1/s. */
  linearPerHs: number;
}

function periodTerms(tpS: number, setup: CheckedSetup): PeriodTerms {
  const src = celerities(tpS, setup.sourceDepthM, setup.g);
  const site = celerities(tpS, setup.siteDepthM, setup.g);
  const kSite = waveNumber(tpS, setup.siteDepthM, setup.g);
  return {
    cSrc: src.celerityMps,
    cgSrc: src.groupCelerityMps,
    cSite: site.celerityMps,
    cgSite: site.groupCelerityMps,
    cRatio: site.celerityMps / src.celerityMps,
    ks: Math.sqrt(src.groupCelerityMps / site.groupCelerityMps),
    linearPerHs: (Math.PI * csch(kSite * setup.siteDepthM)) / tpS,
  };
}

// Layout of the per-period cache (one row of STRIDE doubles per distinct Tp).
const STRIDE = 5;
const T_CRATIO = 0;
const T_KS = 1;
const T_LIN = 2;
const T_SOUL = 3; // Soulsby velocity per Hs with Tz from Tp (docs/domain.md#convention-8)
const T_BAND = 4; // transfer-table Tp band

// Layout of the per-direction cache (one row of DSTRIDE doubles per distinct direction).
const DSTRIDE = 5;
const D_WRAPPED = 0; // direction wrapped to [0, 360)
const D_LANDWARD = 1; // 1 if |theta_src| >= 90
const D_SIN = 2; // sin(theta_src)
const D_COS = 3; // cos(theta_src)
const D_SECTOR = 4; // transfer-table sector

const MODE_NONE = 0;
const MODE_REFRACT = 1;
const MODE_TABLE = 2;

/** Per-direction terms (one row of DSTRIDE doubles per distinct direction): wrapped, landward, sin and cos of theta_src, table sector. */
function directionTerms(dirKeys: Float64Array, table: TransferTable | null, beta: number): Float64Array {
  const dirTerms = new Float64Array(Math.max(1, dirKeys.length) * DSTRIDE);
  for (let id = 0; id < dirKeys.length; id++) {
    const dir = dirKeys[id];
    const b = id * DSTRIDE;
    dirTerms[b + D_WRAPPED] = wrapDegrees360(dir);
    if (table) {
      dirTerms[b + D_SECTOR] = transferSectorIndex(table, dir);
    } else {
      const theta = wrapDegrees180(dir - beta);
      const landward = theta >= 90 || theta <= -90;
      const th = theta * DEG_TO_RAD;
      dirTerms[b + D_LANDWARD] = landward ? 1 : 0;
      dirTerms[b + D_SIN] = landward ? 0 : Math.sin(th);
      dirTerms[b + D_COS] = landward ? 0 : Math.cos(th);
    }
  }
  return dirTerms;
}

/**
 * Transforms a series of sea states from the data point to a worksite (docs/domain.md#transformation, steps 1-6):
 * 1. theta_src = wrap to (-180, 180] of (Dir - beta); no bearing: Kr = 1, direction kept;
 *    |theta_src| >= 90: LANDWARD, shoaling only, direction kept.
 * 2. Snell: sin(theta_site) = (C_site/C_src) sin(theta_src), Kr = sqrt(cos(theta_src)/cos(theta_site));
 *    if |sin(theta_site)| >= 1 (site deeper than the data point): REFRACTION_SKIPPED, Kr = 1,
 *    direction kept. (docs/domain.md#convention-2 says "exceeds 1"; at exactly 1 Kr would be infinite, so that
 *    grazing case is skipped too.)
 * 3. Ks = sqrt(Cg_src/Cg_site), linear theory at Tp (docs/domain.md#convention-1 for an unknown source depth).
 * 4. Hs_site = Hs_src*Ks*Kr; direction beta + theta_site wrapped to [0, 360).
 *    With a transfer table instead of 1-4: Hs_site = Hs_src*factor(sector, band), direction kept,
 *    TRANSFER_TABLE, ks = factor, kr = 1 (docs/domain.md#convention-17). The table needs the direction, so a
 *    missing direction makes the record missing.
 * 5. Hs_site > gamma_b*d_site (strictly): capped, DEPTH_LIMITED (docs/domain.md#convention-4).
 * 6. Periods unchanged. Bed velocities at the worksite use Hs after the cap, Tp (linear) and Tz
 *    (Soulsby; from the record, else Tz = (Tz/Tp)(gamma)*Tp, docs/domain.md#convention-8), at the site depth.
 * Missing (docs/domain.md#convention-3): Hs or Tp NaN, negative or infinite, or (with a bearing or a table) the
 * direction NaN: every output is NaN and the flag is MISSING_INPUT. Invariant for every other
 * record: hs before the cap = Hs_src*ks*kr (to float32 rounding of ks, kr).
 *
 * Performance: per-period quantities (C, Cg at both depths, 1/sinh(k*d_site), the Soulsby factor,
 * the table band) are computed once per distinct Tp (and Tz) value, and per-direction ones (theta,
 * its sine and cosine, the table sector) once per distinct direction, cached by exact value, so
 * the results equal `transformOne`'s bit for bit; the loop allocates nothing per record. About
 * 15-20 million record-transforms per second on one core with `out` reused (bench/transform-bench.ts).
 * Output arrays may be the input arrays (each index is read before it is written).
 *
 * @param input - Hs (m), Tp (s), Tz (s), Dir (deg), typed arrays of equal length; NaN = missing.
 * @param source - data point (depth m, Infinity = deep).
 * @param site - worksite geometry.
 * @param options - g (m/s2), gamma (for Tz from Tp), out (arrays to fill).
 * @returns the worksite series (`options.out` when given).
 * @throws RangeError for arrays of different lengths, an `out` of the wrong length, a bad depth,
 *   bearing, breaker index, g, gamma, or transfer table.
 */
export function transformToSite(input: SeaSeriesInput, source: SourcePoint, site: SiteGeometry, options?: TransformOptions): SiteSeries {
  const setup = checkSetup(source, site, options);
  if (input.waterLevelM) return transformWithWaterLevel(input, input.waterLevelM, setup, options);
  const { hsM: hsIn, tpS: tpIn, tzS: tzIn, dirDeg: dirIn } = input;
  const n = hsIn.length;
  if (tpIn.length !== n || tzIn.length !== n || dirIn.length !== n) {
    throw new RangeError('hsM, tpS, tzS and dirDeg must have the same length');
  }
  const out = options?.out ?? createSiteSeries(n);
  if (
    out.hsM.length !== n ||
    out.dirDeg.length !== n ||
    out.ks.length !== n ||
    out.kr.length !== n ||
    out.flags.length !== n ||
    out.bedVelocityLinearMps.length !== n ||
    out.bedVelocitySoulsbyMps.length !== n
  ) {
    throw new RangeError(`every out array must have the input length ${n}`);
  }
  const { hsM: hsOut, dirDeg: dirOut, ks: ksOut, kr: krOut, flags: flagsOut } = out;
  const linOut = out.bedVelocityLinearMps;
  const soulOut = out.bedVelocitySoulsbyMps;

  const { g, tzOverTp, siteDepthM, depthLimitM, table } = setup;
  const mode = table ? MODE_TABLE : setup.bearing !== null ? MODE_REFRACT : MODE_NONE;
  const beta = setup.bearing ?? 0;
  const sectorCount = table ? table.directionSectorsDeg.length : 0;
  const bandCount = table ? table.tpBandsS.length : 0;
  const tableFactors = new Float64Array(sectorCount * bandCount);
  if (table) {
    for (let s = 0; s < sectorCount; s++) for (let b = 0; b < bandCount; b++) tableFactors[s * bandCount + b] = table.factors[s][b];
  }

  // Phase 1: the distinct Tp and direction values, and each record's index into them (-1 when
  // missing or invalid). Small loops of one kind each, so they are optimised at once.
  const prepared = options?.prepared;
  if (
    prepared &&
    (prepared.input.hsM !== hsIn || prepared.input.tpS !== tpIn || prepared.input.tzS !== tzIn || prepared.input.dirDeg !== dirIn)
  ) {
    throw new RangeError('options.prepared was made from another input');
  }
  let tpIds: Int32Array;
  let tpKeys: Float64Array;
  let dirIds: Int32Array | null = null;
  let dirKeys: Float64Array = new Float64Array(0);
  if (prepared) {
    tpIds = prepared.tpIds;
    tpKeys = prepared.tpKeys;
    if (mode !== MODE_NONE) {
      dirIds = prepared.dirIds;
      dirKeys = prepared.dirKeys;
    }
  } else {
    tpIds = new Int32Array(n);
    tpKeys = new FloatKeyIndex(1024).assignIds(tpIn, tpIds, true);
    if (mode !== MODE_NONE) {
      dirIds = new Int32Array(n);
      dirKeys = new FloatKeyIndex(1024).assignIds(dirIn, dirIds, false);
    }
  }

  // Phase 2: per-period terms once per distinct Tp, per-direction terms once per distinct direction.
  const terms = new Float64Array(Math.max(1, tpKeys.length) * STRIDE);
  for (let id = 0; id < tpKeys.length; id++) {
    const tp = tpKeys[id];
    const t = periodTerms(tp, setup);
    const b = id * STRIDE;
    terms[b + T_CRATIO] = t.cRatio;
    terms[b + T_KS] = t.ks;
    terms[b + T_LIN] = t.linearPerHs;
    terms[b + T_SOUL] = soulsbyVelocityPerHs(tp * tzOverTp, siteDepthM, g);
    terms[b + T_BAND] = table ? transferBandIndex(table, tp) : 0;
  }
  const dirTerms = directionTerms(dirKeys, table, beta);

  // Phase 3: every record from those tables (Soulsby from a record's own Tz only where it has one).
  const anyTz = prepared ? prepared.anyTz : hasUsableTz(tzIn);
  const soulTz = anyTz ? soulsbyFromTz(tzIn, siteDepthM, g) : tzIn;
  if (options?.fields === 'engine') {
    engineFields(hsIn, tzIn, tpIds, dirIds, mode, terms, dirTerms, tableFactors, bandCount, depthLimitM, soulTz, out);
    return out;
  }
  const missing = TRANSFORM_FLAG.MISSING_INPUT;
  for (let i = 0; i < n; i++) {
    const hs = hsIn[i];
    const tpId = tpIds[i];
    const dirId = dirIds === null ? 0 : dirIds[i];
    if (!(hs >= 0 && hs < Infinity) || tpId < 0 || dirId < 0) {
      hsOut[i] = NaN;
      dirOut[i] = NaN;
      ksOut[i] = NaN;
      krOut[i] = NaN;
      flagsOut[i] = missing;
      linOut[i] = NaN;
      soulOut[i] = NaN;
      continue;
    }
    const base = tpId * STRIDE;
    let flags = 0;
    let ks: number;
    let kr = 1;
    let dirSite: number;
    if (mode === MODE_NONE) {
      ks = terms[base + T_KS];
      dirSite = wrapDegrees360(dirIn[i]);
    } else {
      const dbase = dirId * DSTRIDE;
      if (mode === MODE_REFRACT) {
        ks = terms[base + T_KS];
        if (dirTerms[dbase + D_LANDWARD] !== 0) {
          flags = TRANSFORM_FLAG.LANDWARD;
          dirSite = dirTerms[dbase + D_WRAPPED];
        } else {
          const sinSite = dirTerms[dbase + D_SIN] * terms[base + T_CRATIO];
          const cos2Site = 1 - sinSite * sinSite;
          if (cos2Site > 0) {
            kr = Math.sqrt(dirTerms[dbase + D_COS] / Math.sqrt(cos2Site));
            dirSite = wrapDegrees360(beta + Math.asin(sinSite) * RAD_TO_DEG);
          } else {
            flags = TRANSFORM_FLAG.REFRACTION_SKIPPED;
            dirSite = dirTerms[dbase + D_WRAPPED];
          }
        }
      } else {
        ks = tableFactors[dirTerms[dbase + D_SECTOR] * bandCount + terms[base + T_BAND]];
        flags = TRANSFORM_FLAG.TRANSFER_TABLE;
        dirSite = dirTerms[dbase + D_WRAPPED];
      }
    }

    // Capped by Math.min: assigning the limit (not a computed number) to hsSite would make the
    // optimiser box every record's Hs (measured: 20 MB of garbage a 30-year worksite).
    const hsShoaled = hs * ks * kr;
    if (hsShoaled > depthLimitM) flags |= TRANSFORM_FLAG.DEPTH_LIMITED;
    const hsSite = Math.min(hsShoaled, depthLimitM);
    // Soulsby factor: Tz from the record, else from Tp (docs/domain.md#convention-8).
    const tz = tzIn[i];
    const soul = tz > 0 && tz < Infinity ? soulTz[i] : terms[base + T_SOUL];

    hsOut[i] = hsSite;
    dirOut[i] = dirSite;
    ksOut[i] = ks;
    krOut[i] = kr;
    flagsOut[i] = flags;
    linOut[i] = hsSite * terms[base + T_LIN];
    soulOut[i] = hsSite * soul;
  }
  return out;
}

/**
 * Phase 3 of transformToSite for `fields: 'engine'`: Hs at the worksite and both bed velocities,
 * by the same arithmetic in the same order as the full loop (so the same values bit for bit),
 * without the worksite direction, the coefficients and the flags.
 */
function engineFields(
  hsIn: Float64Array,
  tzIn: Float64Array,
  tpIds: Int32Array,
  dirIds: Int32Array | null,
  mode: number,
  terms: Float64Array,
  dirTerms: Float64Array,
  tableFactors: Float64Array,
  bandCount: number,
  depthLimitM: number,
  soulTz: Float64Array,
  out: SiteSeries,
): void {
  const hsOut = out.hsM;
  const linOut = out.bedVelocityLinearMps;
  const soulOut = out.bedVelocitySoulsbyMps;
  const n = hsIn.length;
  for (let i = 0; i < n; i++) {
    const hs = hsIn[i];
    const tpId = tpIds[i];
    const dirId = dirIds === null ? 0 : dirIds[i];
    if (!(hs >= 0 && hs < Infinity) || tpId < 0 || dirId < 0) {
      hsOut[i] = NaN;
      linOut[i] = NaN;
      soulOut[i] = NaN;
      continue;
    }
    const base = tpId * STRIDE;
    let ks: number;
    let kr = 1;
    if (mode === MODE_TABLE) {
      ks = tableFactors[dirTerms[dirId * DSTRIDE + D_SECTOR] * bandCount + terms[base + T_BAND]];
    } else {
      ks = terms[base + T_KS];
      if (mode === MODE_REFRACT) {
        const dbase = dirId * DSTRIDE;
        if (dirTerms[dbase + D_LANDWARD] === 0) {
          const sinSite = dirTerms[dbase + D_SIN] * terms[base + T_CRATIO];
          const cos2Site = 1 - sinSite * sinSite;
          if (cos2Site > 0) kr = Math.sqrt(dirTerms[dbase + D_COS] / Math.sqrt(cos2Site));
        }
      }
    }
    // As above: Math.min, so that nothing is boxed.
    const hsSite = Math.min(hs * ks * kr, depthLimitM);
    const tz = tzIn[i];
    const soul = tz > 0 && tz < Infinity ? soulTz[i] : terms[base + T_SOUL];
    hsOut[i] = hsSite;
    linOut[i] = hsSite * terms[base + T_LIN];
    soulOut[i] = hsSite * soul;
  }
}

/**
 * The transformation with a depth that moves (docs/domain.md#tide): each record at its own
 * still-water depth h = d_site + level, by the same steps as {@link transformOne} at a fixed depth
 * of h; h <= 0: DRY, outputs NaN; a NaN level: MISSING_INPUT. Dispersion is solved per (period,
 * depth) pair through the dimensionless lookup `relativeDepthFromTable` (cubic Hermite in ln(k0*h),
 * exact fallback outside it), so the figures agree with the record-by-record chain within 1e-9
 * relative (tests/waves/transform-tide-fast.test.ts). Terms of the data point (C, Cg at Tp) are
 * cached per distinct Tp and the direction terms per distinct direction, as on the fixed-depth
 * path; `fields` is ignored (every field is filled) and `depthM` holds h.
 */
function transformWithWaterLevel(input: SeaSeriesInput, level: Float64Array, setup: CheckedSetup, options?: TransformOptions): SiteSeries {
  const { hsM: hsIn, tpS: tpIn, tzS: tzIn, dirDeg: dirIn } = input;
  const n = hsIn.length;
  if (tpIn.length !== n || tzIn.length !== n || dirIn.length !== n || level.length !== n) {
    throw new RangeError('hsM, tpS, tzS, dirDeg and waterLevelM must have the same length');
  }
  const out = options?.out ?? createSiteSeries(n);
  if (out.hsM.length !== n || out.flags.length !== n) throw new RangeError(`every out array must have the input length ${n}`);
  const depth = out.depthM && out.depthM.length === n ? out.depthM : new Float64Array(n);
  out.depthM = depth;
  const { g, tzOverTp, siteDepthM, table, breakerIndex } = setup;
  const mode = table ? MODE_TABLE : setup.bearing !== null ? MODE_REFRACT : MODE_NONE;
  const beta = setup.bearing ?? 0;

  const prepared = options?.prepared;
  if (
    prepared &&
    (prepared.input.hsM !== hsIn || prepared.input.tpS !== tpIn || prepared.input.tzS !== tzIn || prepared.input.dirDeg !== dirIn)
  ) {
    throw new RangeError('options.prepared was made from another input');
  }
  const tpIds = prepared ? prepared.tpIds : new Int32Array(n);
  const tpKeys = prepared ? prepared.tpKeys : new FloatKeyIndex(1024).assignIds(tpIn, tpIds, true);
  let dirIds: Int32Array | null = null;
  let dirKeys: Float64Array = new Float64Array(0);
  if (mode !== MODE_NONE) {
    dirIds = prepared ? prepared.dirIds : new Int32Array(n);
    dirKeys = prepared ? prepared.dirKeys : new FloatKeyIndex(1024).assignIds(dirIn, dirIds, false);
  }
  // Per distinct Tp: C and Cg at the data point, omega, k0 = omega^2/g and the table band.
  const srcTerms = new Float64Array(Math.max(1, tpKeys.length) * 5);
  for (let id = 0; id < tpKeys.length; id++) {
    const tp = tpKeys[id];
    const src = celerities(tp, setup.sourceDepthM, g);
    const omega = TWO_PI / tp;
    srcTerms[id * 5] = src.celerityMps;
    srcTerms[id * 5 + 1] = src.groupCelerityMps;
    srcTerms[id * 5 + 2] = omega;
    srcTerms[id * 5 + 3] = (omega * omega) / g;
    srcTerms[id * 5 + 4] = table ? transferBandIndex(table, tp) : 0;
  }
  const dirTerms = directionTerms(dirKeys, table, beta);
  const { hsM: hsOut, dirDeg: dirOut, ks: ksOut, kr: krOut, flags: flagsOut } = out;
  const linOut = out.bedVelocityLinearMps;
  const soulOut = out.bedVelocitySoulsbyMps;

  for (let i = 0; i < n; i++) {
    const eta = level[i];
    const h = siteDepthM + eta;
    depth[i] = h;
    const hs = hsIn[i];
    const tpId = tpIds[i];
    const dirId = dirIds === null ? 0 : dirIds[i];
    if (!(h > 0) || !(hs >= 0 && hs < Infinity) || tpId < 0 || dirId < 0) {
      hsOut[i] = NaN;
      dirOut[i] = NaN;
      ksOut[i] = NaN;
      krOut[i] = NaN;
      flagsOut[i] = h > 0 || eta !== eta ? TRANSFORM_FLAG.MISSING_INPUT : TRANSFORM_FLAG.DRY;
      linOut[i] = NaN;
      soulOut[i] = NaN;
      continue;
    }
    // The site's dispersion at (Tp, h), as `celerities` computes it.
    const base = tpId * 5;
    const omega = srcTerms[base + 2];
    const k0 = srcTerms[base + 3];
    const x = k0 * h;
    const deep = x >= DEEP_WATER_KD;
    const kd = deep ? x : relativeDepthFromTable(x);
    const cSite = deep || kd >= 20 ? g / omega : (omega * h) / kd;
    const nSite = kd >= 20 ? 0.5 : groupCelerityRatio(kd);
    const tp = tpKeys[tpId];

    let flags = 0;
    let ks: number;
    let kr = 1;
    let dirSite: number;
    if (mode === MODE_TABLE) {
      const dbase = dirId * DSTRIDE;
      ks = table!.factors[dirTerms[dbase + D_SECTOR]][srcTerms[base + 4]];
      flags = TRANSFORM_FLAG.TRANSFER_TABLE;
      dirSite = dirTerms[dbase + D_WRAPPED];
    } else {
      ks = Math.sqrt(srcTerms[base + 1] / (nSite * cSite));
      if (mode === MODE_NONE) {
        dirSite = wrapDegrees360(dirIn[i]);
      } else {
        const dbase = dirId * DSTRIDE;
        if (dirTerms[dbase + D_LANDWARD] !== 0) {
          flags = TRANSFORM_FLAG.LANDWARD;
          dirSite = dirTerms[dbase + D_WRAPPED];
        } else {
          const sinSite = dirTerms[dbase + D_SIN] * (cSite / srcTerms[base]);
          const cos2Site = 1 - sinSite * sinSite;
          if (cos2Site > 0) {
            kr = Math.sqrt(dirTerms[dbase + D_COS] / Math.sqrt(cos2Site));
            dirSite = wrapDegrees360(beta + Math.asin(sinSite) * RAD_TO_DEG);
          } else {
            flags = TRANSFORM_FLAG.REFRACTION_SKIPPED;
            dirSite = dirTerms[dbase + D_WRAPPED];
          }
        }
      }
    }
    let hsSite = hs * ks * kr;
    const limit = breakerIndex * h;
    if (hsSite > limit) {
      hsSite = limit;
      flags |= TRANSFORM_FLAG.DEPTH_LIMITED;
    }
    const tz = tzIn[i];
    hsOut[i] = hsSite;
    dirOut[i] = dirSite;
    ksOut[i] = ks;
    krOut[i] = kr;
    flagsOut[i] = flags;
    linOut[i] = hsSite * ((Math.PI * csch(kd)) / tp);
    soulOut[i] = hsSite * soulsbyVelocityPerHs(tz > 0 && tz < Infinity ? tz : tp * tzOverTp, h, g);
  }
  return out;
}

/** Soulsby velocity per metre of Hs from each record's own Tz (NaN where Tz is missing or invalid), cached by exact Tz. */
function soulsbyFromTz(tzIn: Float64Array, siteDepthM: number, g: number): Float64Array {
  const out = new Float64Array(tzIn.length);
  const index = new FloatKeyIndex(64);
  let values = new Float64Array(64);
  let lastTz = NaN;
  let lastSoul = NaN;
  for (let i = 0; i < tzIn.length; i++) {
    const tz = tzIn[i];
    if (!(tz > 0 && tz < Infinity)) {
      out[i] = NaN;
      continue;
    }
    if (tz !== lastTz) {
      let id = index.find(tz);
      if (id < 0) {
        id = index.add(tz);
        if (id >= values.length) {
          const grown = new Float64Array(values.length * 2);
          grown.set(values);
          values = grown;
        }
        values[id] = soulsbyVelocityPerHs(tz, siteDepthM, g);
      }
      lastTz = tz;
      lastSoul = values[id];
    }
    out[i] = lastSoul;
  }
  return out;
}

/** One record at the data point. NaN, undefined or null = missing. */
export interface SeaRecordInput {
  hsM: number;
  tpS: number;
  tzS?: number | null;
  dirDeg?: number | null;
  /** Water level above the worksite's chart datum, m; absent or null: the chart depth (docs/domain.md#tide). */
  waterLevelM?: number | null;
}

/** The whole chain behind one worksite record (for the "chain behind this hour" view). */
export interface TransformChain {
  /** Inputs as used. */
  hsSrcM: number;
  tpS: number;
  /** Tz used for the Soulsby velocity, s (given, or from Tp). */
  tzS: number;
  tzSource: 'given' | 'tp' | 'missing';
  dirSrcDeg: number;
  /** Which input was missing (the first of hs, tp, dir), or null. */
  missing: 'hs' | 'tp' | 'dir' | null;
  /** Shore-normal bearing used, degrees, or null. */
  shoreNormalDeg: number | null;
  /** Angle of incidence at the data point, degrees in (-180, 180] (NaN without bearing or with a table). */
  thetaSrcDeg: number;
  /** Angle of incidence at the worksite, degrees (= thetaSrcDeg when the direction is kept). */
  thetaSiteDeg: number;
  /** Phase and group celerity at Tp, data point and worksite, m/s. */
  cSrcMps: number;
  cSiteMps: number;
  cgSrcMps: number;
  cgSiteMps: number;
  /** Factors used: Ks (the table factor with a transfer table) and Kr. */
  ks: number;
  kr: number;
  /** The transfer table's factor, or NaN when no table is used. */
  transferFactor: number;
  /** Hs_src*Ks*Kr before the depth limit, m. */
  hsBeforeCapM: number;
  /** Water level above chart datum used, m (0 when none was given). */
  waterLevelM: number;
  /** Still-water depth h = d_site + water level the chain used, m. */
  depthM: number;
  /** gamma_b*h, m. */
  depthLimitM: number;
  /** Hs at the worksite after the limit, m. */
  hsM: number;
  /** Direction at the worksite, degrees in [0, 360). */
  dirDeg: number;
  flags: number;
  flagNames: TransformFlagName[];
  /** Bed velocities at the worksite, m/s. */
  bedVelocityLinearMps: number;
  bedVelocitySoulsbyMps: number;
}

/**
 * The chain of a record that gives no sea state at the worksite: the inputs as given, every
 * computed step NaN.
 *
 * @param record - the record (its Hs, Tp and direction are echoed).
 * @param shoreNormalDeg - the worksite's shore normal (deg) or null.
 * @param waterLevelM - the water level used (m).
 * @param depthM - the still-water depth at the worksite (m).
 * @param depthLimitM - gamma_b*h (m), NaN when not reached.
 * @param flags - TRANSFORM_FLAG bits (DRY or MISSING_INPUT).
 * @returns the `TransformChain` with NaN outputs.
 */
function unresolvedChain(
  record: SeaRecordInput,
  shoreNormalDeg: number | null,
  waterLevelM: number,
  depthM: number,
  depthLimitM: number,
  flags: number,
): TransformChain {
  return {
    hsSrcM: record.hsM,
    tpS: record.tpS,
    tzS: NaN,
    tzSource: 'missing',
    dirSrcDeg: record.dirDeg ?? NaN,
    missing: null,
    shoreNormalDeg,
    thetaSrcDeg: NaN,
    thetaSiteDeg: NaN,
    cSrcMps: NaN,
    cSiteMps: NaN,
    cgSrcMps: NaN,
    cgSiteMps: NaN,
    ks: NaN,
    kr: NaN,
    transferFactor: NaN,
    hsBeforeCapM: NaN,
    waterLevelM,
    depthM,
    depthLimitM,
    hsM: NaN,
    dirDeg: NaN,
    flags,
    flagNames: transformFlagNames(flags),
    bedVelocityLinearMps: NaN,
    bedVelocitySoulsbyMps: NaN,
  };
}

/**
 * Transforms one record and returns every step of the chain (same rules as `transformToSite`, and
 * the same numbers bit for bit: the series path caches exactly these per-period terms).
 *
 * @param record - Hs (m), Tp (s), Tz (s, optional), Dir (deg, optional); NaN/null = missing.
 * @param source - data point (depth m, Infinity = deep).
 * @param site - worksite geometry.
 * @param options - g (m/s2), gamma (for Tz from Tp).
 * @returns the `TransformChain` (NaN outputs and MISSING_INPUT when a needed value is missing).
 * @throws RangeError for a bad depth, bearing, breaker index, g, gamma or transfer table.
 */
export function transformOne(
  record: SeaRecordInput,
  source: SourcePoint,
  site: SiteGeometry,
  options?: Omit<TransformOptions, 'out'>,
): TransformChain {
  const eta = record.waterLevelM ?? 0;
  const h = site.depthM + eta;
  if (!(h > 0)) {
    // Dry (or an unknown level): no wave data at the worksite this hour (docs/domain.md#tide).
    checkSetup(source, site, options);
    const flags = eta === eta ? TRANSFORM_FLAG.DRY : TRANSFORM_FLAG.MISSING_INPUT;
    return unresolvedChain(record, site.shoreNormalDeg ?? null, eta, h, NaN, flags);
  }
  const setup = checkSetup(source, eta === 0 ? site : { ...site, depthM: h }, options);
  const { g, tzOverTp, siteDepthM, depthLimitM, table, bearing } = setup;
  const hs = record.hsM;
  const tp = record.tpS;
  const dir = record.dirDeg ?? NaN;
  const tzGiven = record.tzS ?? NaN;
  const chain = unresolvedChain(record, bearing, eta, h, depthLimitM, TRANSFORM_FLAG.MISSING_INPUT);
  if (!(hs >= 0 && hs < Infinity)) return { ...chain, missing: 'hs' };
  if (!(tp > 0 && tp < Infinity)) return { ...chain, missing: 'tp' };
  if ((table || bearing !== null) && Number.isNaN(dir)) return { ...chain, missing: 'dir' };

  const terms = periodTerms(tp, setup);
  let flags = 0;
  let ks: number;
  let kr = 1;
  let dirSite: number;
  let thetaSrc = NaN;
  let thetaSite = NaN;
  let factor = NaN;
  if (table) {
    factor = table.factors[transferSectorIndex(table, dir)][transferBandIndex(table, tp)];
    ks = factor;
    flags = TRANSFORM_FLAG.TRANSFER_TABLE;
    dirSite = wrapDegrees360(dir);
  } else if (bearing !== null) {
    ks = terms.ks;
    thetaSrc = wrapDegrees180(dir - bearing);
    thetaSite = thetaSrc;
    if (thetaSrc >= 90 || thetaSrc <= -90) {
      flags = TRANSFORM_FLAG.LANDWARD;
      dirSite = wrapDegrees360(dir);
    } else {
      const th = thetaSrc * DEG_TO_RAD;
      const sinSite = Math.sin(th) * terms.cRatio;
      const cos2Site = 1 - sinSite * sinSite;
      if (cos2Site > 0) {
        kr = Math.sqrt(Math.cos(th) / Math.sqrt(cos2Site));
        thetaSite = Math.asin(sinSite) * RAD_TO_DEG;
        dirSite = wrapDegrees360(bearing + thetaSite);
      } else {
        flags = TRANSFORM_FLAG.REFRACTION_SKIPPED;
        dirSite = wrapDegrees360(dir);
      }
    }
  } else {
    ks = terms.ks;
    dirSite = wrapDegrees360(dir);
  }
  const hsBeforeCap = hs * ks * kr;
  let hsSite = hsBeforeCap;
  if (hsSite > depthLimitM) {
    hsSite = depthLimitM;
    flags |= TRANSFORM_FLAG.DEPTH_LIMITED;
  }
  const tzFromRecord = tzGiven > 0 && tzGiven < Infinity;
  const tz = tzFromRecord ? tzGiven : tp * tzOverTp;
  return {
    ...chain,
    tzS: tz,
    tzSource: tzFromRecord ? 'given' : 'tp',
    thetaSrcDeg: thetaSrc,
    thetaSiteDeg: thetaSite,
    cSrcMps: terms.cSrc,
    cSiteMps: terms.cSite,
    cgSrcMps: terms.cgSrc,
    cgSiteMps: terms.cgSite,
    ks,
    kr,
    transferFactor: factor,
    hsBeforeCapM: hsBeforeCap,
    hsM: hsSite,
    dirDeg: dirSite,
    flags,
    flagNames: transformFlagNames(flags),
    bedVelocityLinearMps: hsSite * terms.linearPerHs,
    bedVelocitySoulsbyMps: hsSite * soulsbyVelocityPerHs(tz, siteDepthM, g),
  };
}
