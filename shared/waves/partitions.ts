/**
 * Sea-state partitions (wind sea and up to two swells) through the worksite transformation
 * (docs/domain.md#partitions):
 * - energies add: total Hs = sqrt(sum Hs_i^2) (common practice);
 * - each partition goes through steps 1-4 of docs/domain.md#transformation with its own Tp and
 *   direction; the worksite total is sqrt(sum Hs_i,site^2); the depth limit applies to the total
 *   and scales every partition by the same factor;
 * - the worksite Tp (and direction) is that of the most energetic partition at the worksite;
 * - the bed velocity is computed per partition and combined as the root of the sum of squares.
 *
 * Values per partition and record: Hs > 0 present, Hs = 0 absent (the sea has no such
 * partition that hour), NaN missing (a fill value, or the partition is not in the dataset).
 */
import { TRANSFORM_FLAG, createSiteSeries, transformToSite } from './transform';
import type { SeaSeriesInput, SiteGeometry, SiteSeries, SourcePoint, TransformOptions } from './transform';

/** The partitions a record may carry, in the order they are shown. */
export const PARTITION_NAMES = ['windSea', 'swell1', 'swell2'] as const;
export type PartitionName = (typeof PARTITION_NAMES)[number];

/** Which partitions count as swell (docs/domain.md#partitions: "swell" is all swell partitions together). */
export const SWELL_PARTITIONS: readonly PartitionName[] = ['swell1', 'swell2'];

/** One partition over a series: Hs (m), Tp (s), direction (degrees coming from); NaN = missing, Hs 0 = absent. */
export interface PartitionSeries {
  hsM: Float64Array;
  tpS: Float64Array;
  dirDeg: Float64Array;
}

/** The partitions a dataset gives (a missing key: not in the dataset). */
export type PartitionInput = Partial<Record<PartitionName, PartitionSeries>>;

/** Partitions at the worksite, every key present: NaN Hs = unknown for that record, 0 = absent. */
export type SitePartitions = Record<PartitionName, PartitionSeries>;

/** A worksite series from partitioned input: the combined sea plus each partition at the worksite. */
export interface PartitionedSiteSeries extends SiteSeries {
  /** Worksite Tp per record, s: the Tp of the most energetic partition, or the record's Tp without partitions. */
  tpS: Float64Array;
  /** Each partition at the worksite (after the depth limit's scaling). */
  partitions: SitePartitions;
}

/** Flag of a record combined from its partitions (beside TRANSFORM_FLAG's bits). */
export const PARTITIONED_FLAG = 64;

/** True when the dataset gives at least one partition. */
export function hasPartitions(p: PartitionInput | null | undefined): p is PartitionInput {
  return !!p && PARTITION_NAMES.some((k) => p[k] !== undefined);
}

/**
 * Whether record i can be combined from its partitions: every partition the dataset gives is
 * known (Hs finite, >= 0), at least one is present (Hs > 0), and every present one has a
 * positive finite Tp (and a direction when `needDir`). Partitions not in the dataset are absent.
 */
export function recordHasPartitions(p: PartitionInput, i: number, needDir: boolean): boolean {
  let any = false;
  for (const k of PARTITION_NAMES) {
    const s = p[k];
    if (!s) continue;
    const hs = s.hsM[i];
    if (!(hs >= 0 && hs < Infinity)) return false;
    if (hs === 0) continue;
    const tp = s.tpS[i];
    if (!(tp > 0 && tp < Infinity)) return false;
    if (needDir && s.dirDeg[i] !== s.dirDeg[i]) return false;
    any = true;
  }
  return any;
}

/**
 * Total Hs of a record from its partitions, sqrt(sum Hs_i^2) (docs/domain.md#partitions, common
 * practice); NaN when a partition's Hs is missing.
 */
export function totalFromPartitions(hs: readonly number[]): number {
  let e = 0;
  for (const h of hs) e += h * h;
  return Math.sqrt(e);
}

/**
 * Transforms a series to a worksite with its partitions (docs/domain.md#partitions). Without
 * partitions (none in the dataset) this is `transformToSite` exactly, with `tpS` the input's Tp
 * and every worksite partition NaN. A record whose partitions are missing or incomplete (see
 * {@link recordHasPartitions}) keeps the total's chain and NaN partitions; the others are combined:
 * - each partition transformed alone (steps 1-4, its own Tp and direction, Tz from its Tp);
 * - Hs = sqrt(sum Hs_i,site^2), capped at gamma_b*h (strictly above, DEPTH_LIMITED), every
 *   partition scaled by the same factor;
 * - Tp and direction of the most energetic partition at the worksite;
 * - bed velocities sqrt(sum u_i^2) (each method);
 * - ks = combined Hs before the cap over the input total sqrt(sum Hs_i^2), kr = 1; flags: the
 *   partitions' LANDWARD/REFRACTION_SKIPPED/TRANSFER_TABLE bits, DEPTH_LIMITED and PARTITIONED_FLAG.
 *
 * @param input - the total (as for transformToSite).
 * @param partitions - the dataset's partitions at the data point.
 */
export function transformPartitionedToSite(
  input: SeaSeriesInput,
  partitions: PartitionInput | null | undefined,
  source: SourcePoint,
  site: SiteGeometry,
  options?: Omit<TransformOptions, 'out' | 'prepared' | 'fields'>,
): PartitionedSiteSeries {
  const total = transformToSite(input, source, site, options);
  const n = input.hsM.length;
  const sitePartitions = {} as SitePartitions;
  for (const k of PARTITION_NAMES) {
    sitePartitions[k] = { hsM: new Float64Array(n).fill(NaN), tpS: new Float64Array(n).fill(NaN), dirDeg: new Float64Array(n).fill(NaN) };
  }
  const tpOut = Float64Array.from(input.tpS);
  const result: PartitionedSiteSeries = Object.assign(total, { tpS: tpOut, partitions: sitePartitions });
  if (!hasPartitions(partitions)) return result;

  // Each partition alone through steps 1-4: a breaker index so large that step 5 never caps.
  const uncapped: SiteGeometry = { ...site, breakerIndex: Number.MAX_VALUE };
  const needDir = site.shoreNormalDeg != null || !!site.transferTable;
  const noTz = new Float64Array(n).fill(NaN);
  const alone: Partial<Record<PartitionName, SiteSeries>> = {};
  for (const k of PARTITION_NAMES) {
    const p = partitions[k];
    if (!p) continue;
    if (p.hsM.length !== n || p.tpS.length !== n || p.dirDeg.length !== n) {
      throw new RangeError(`partition ${k}: hsM, tpS and dirDeg must have the input length ${n}`);
    }
    alone[k] = transformToSite(
      { hsM: p.hsM, tpS: p.tpS, tzS: noTz, dirDeg: p.dirDeg, waterLevelM: input.waterLevelM ?? null },
      source,
      uncapped,
      { ...options, out: createSiteSeries(n) },
    );
  }

  const level = input.waterLevelM ?? null;
  const keepFlags = TRANSFORM_FLAG.LANDWARD | TRANSFORM_FLAG.REFRACTION_SKIPPED | TRANSFORM_FLAG.TRANSFER_TABLE;
  for (let i = 0; i < n; i++) {
    if (!recordHasPartitions(partitions, i, needDir)) continue;
    const depth = level ? site.depthM + level[i] : site.depthM;
    if (!(depth > 0)) continue; // dry or unknown level: the total's chain already says so
    let energySrc = 0;
    let energySite = 0;
    let lin2 = 0;
    let soul2 = 0;
    let flags = PARTITIONED_FLAG;
    let best: PartitionName | null = null;
    let bestHs = -1;
    for (const k of PARTITION_NAMES) {
      const p = partitions[k];
      const a = alone[k];
      const sp = sitePartitions[k];
      if (!p || !a) {
        sp.hsM[i] = 0;
        continue;
      }
      const hsSrc = p.hsM[i];
      if (hsSrc === 0) {
        sp.hsM[i] = 0;
        continue;
      }
      const hs = a.hsM[i];
      energySrc += hsSrc * hsSrc;
      energySite += hs * hs;
      lin2 += a.bedVelocityLinearMps[i] * a.bedVelocityLinearMps[i];
      soul2 += a.bedVelocitySoulsbyMps[i] * a.bedVelocitySoulsbyMps[i];
      flags |= a.flags[i] & keepFlags;
      sp.hsM[i] = hs;
      sp.tpS[i] = p.tpS[i];
      sp.dirDeg[i] = a.dirDeg[i];
      if (hs > bestHs) {
        bestHs = hs;
        best = k;
      }
    }
    const before = Math.sqrt(energySite);
    const limit = site.breakerIndex * depth;
    let scale = 1;
    let hsSite = before;
    if (before > limit) {
      hsSite = limit;
      scale = limit / before;
      flags |= TRANSFORM_FLAG.DEPTH_LIMITED;
      for (const k of PARTITION_NAMES) sitePartitions[k].hsM[i] *= scale;
    }
    const b = sitePartitions[best as PartitionName];
    result.hsM[i] = hsSite;
    tpOut[i] = b.tpS[i];
    result.dirDeg[i] = b.dirDeg[i];
    result.ks[i] = before / Math.sqrt(energySrc);
    result.kr[i] = 1;
    result.flags[i] = flags;
    result.bedVelocityLinearMps[i] = scale * Math.sqrt(lin2);
    result.bedVelocitySoulsbyMps[i] = scale * Math.sqrt(soul2);
  }
  return result;
}

/** One partition of one record, at the data point and at the worksite (NaN = unknown; Hs 0 = absent). */
export interface PartitionChain {
  name: PartitionName;
  hsSrcM: number;
  tpS: number;
  dirSrcDeg: number;
  /** Hs at the worksite after the total's depth limit scaled it, m. */
  hsM: number;
  dirDeg: number;
}

/** One record combined from its partitions (the chain behind an hour), or null when it is not. */
export interface PartitionedRecord {
  hsM: number;
  tpS: number;
  dirDeg: number;
  bedVelocityLinearMps: number;
  bedVelocitySoulsbyMps: number;
  flags: number;
  partitions: PartitionChain[];
}

/**
 * {@link transformPartitionedToSite} for one record: the combined worksite sea and each partition
 * the dataset gives; null when the record is not combined from partitions (then the total's chain,
 * transformOne, applies).
 */
export function transformPartitionedOne(
  record: { hsM: number; tpS: number; tzS?: number | null; dirDeg?: number | null; waterLevelM?: number | null },
  parts: Partial<Record<PartitionName, { hsM: number; tpS: number; dirDeg: number }>>,
  source: SourcePoint,
  site: SiteGeometry,
  options?: Omit<TransformOptions, 'out' | 'prepared' | 'fields'>,
): PartitionedRecord | null {
  const one = (x: number | null | undefined) => Float64Array.of(x ?? NaN);
  const input: PartitionInput = {};
  for (const k of PARTITION_NAMES) {
    const p = parts[k];
    if (p) input[k] = { hsM: one(p.hsM), tpS: one(p.tpS), dirDeg: one(p.dirDeg) };
  }
  if (!hasPartitions(input)) return null;
  const out = transformPartitionedToSite(
    {
      hsM: one(record.hsM),
      tpS: one(record.tpS),
      tzS: one(record.tzS),
      dirDeg: one(record.dirDeg),
      waterLevelM: record.waterLevelM == null ? null : one(record.waterLevelM),
    },
    input,
    source,
    site,
    options,
  );
  if ((out.flags[0] & PARTITIONED_FLAG) === 0) return null;
  return {
    hsM: out.hsM[0],
    tpS: out.tpS[0],
    dirDeg: out.dirDeg[0],
    bedVelocityLinearMps: out.bedVelocityLinearMps[0],
    bedVelocitySoulsbyMps: out.bedVelocitySoulsbyMps[0],
    flags: out.flags[0],
    partitions: PARTITION_NAMES.filter((k) => input[k]).map((k) => ({
      name: k,
      hsSrcM: input[k]!.hsM[0],
      tpS: input[k]!.tpS[0],
      dirSrcDeg: input[k]!.dirDeg[0],
      hsM: out.partitions[k].hsM[0],
      dirDeg: out.partitions[k].dirDeg[0],
    })),
  };
}
