/**
 * NetCDF (CF) uploads: list a grid's points, choose the point (the nearest sea point to the data
 * point by default, docs/domain.md#netcdf), read only that point's series and store it like any
 * other import (one transaction). What the file has beyond the total sea state is stored in the
 * dataset's optional columns (shared/seadata/extra-columns.ts): the wind sea and two swells
 * (docs/domain.md#partitions), the water level brought to chart datum by the stated offset, and
 * the current (speed, direction going-to; docs/domain.md#tide). The swell as a whole
 * (sea_surface_swell_wave_*) has no column of its own: it gives the total when the file has none
 * and is reported as not stored.
 */
import {
  ImportError,
  listGridPoints,
  nearestSeaPoint,
  greatCircleM,
  planCfImport,
  readCfPoint,
  scanMissingShares,
  PARTITION_LABELS,
  MAX_MISSING_SHARE,
  type CfPlan,
  type GridPoint,
  type NcColumnMap,
  type CfPointResult,
  type ExtraColumn,
  type ExtraSeries,
} from '../../shared/seadata';
import type { NetcdfImportInfo, NetcdfPointsAnswer } from '../../shared/api-types-datasets';
import { HttpError } from '../http/errors';
import { runIsolatedTask } from './engine-pool';
import { openNetcdf, type OpenNcFile } from './netcdf-file';

function asHttp(err: unknown): unknown {
  if (err instanceof ImportError) return new HttpError('bad_file', err.message, err.issues);
  return err;
}

const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/** Opens, runs `work`, closes; file errors become 400s naming the variable. */
export async function withNetcdf<T>(path: string, work: (f: OpenNcFile) => T | Promise<T>): Promise<T> {
  let file: OpenNcFile;
  try {
    file = await openNetcdf(path);
  } catch (err) {
    throw asHttp(err);
  }
  try {
    return await work(file);
  } catch (err) {
    throw asHttp(err);
  } finally {
    file.close();
  }
}

function pointsOf(file: OpenNcFile, plan: CfPlan): GridPoint[] {
  const points = listGridPoints(file, plan);
  if (points.length > 1) scanMissingShares(file, plan, points);
  else for (const p of points) p.missingShare = 0;
  return points;
}

/** Largest grid listed point by point (a larger one is refused with advice to cut it). */
export const MAX_LISTED_POINTS = 10_000;

/** The points of a NetCDF file and the nearest sea point (the import page's table). */
export function describeNetcdf(
  file: OpenNcFile,
  dataPoint: { name: string; lat: number | null; lon: number | null },
  columns: NcColumnMap = {},
): NetcdfPointsAnswer {
  const plan = planCfImport(file, columns);
  const points = pointsOf(file, plan);
  if (points.length > MAX_LISTED_POINTS) {
    throw new HttpError(
      'bad_file',
      `The grid has ${points.length.toLocaleString('en-US')} points; at most ${MAX_LISTED_POINTS.toLocaleString('en-US')} are listed: cut the area around the data point first`,
    );
  }
  const near = dataPoint.lat !== null && dataPoint.lon !== null ? nearestSeaPoint(points, dataPoint.lat, dataPoint.lon) : null;
  const time = plan.time;
  const tShape = time.shape[0] ?? 0;
  let first: string | null = null;
  let last: string | null = null;
  if (tShape > 0) {
    const res = readCfPoint(file, { ...plan, choices: [] }, { index: [] });
    first = new Date(res.records.timeMs[0]).toISOString();
    last = new Date(res.records.timeMs[tShape - 1]).toISOString();
  }
  return {
    format: file.format,
    dimensions: plan.pointDims,
    points: points.map((p) => ({
      index: p.index,
      lat: Number.isNaN(p.lat) ? null : p.lat,
      lon: Number.isNaN(p.lon) ? null : p.lon,
      missingShare: round(p.missingShare, 4),
      distanceKm:
        dataPoint.lat !== null && dataPoint.lon !== null && !Number.isNaN(p.lat) && !Number.isNaN(p.lon)
          ? round(greatCircleM(dataPoint.lat, dataPoint.lon, p.lat, p.lon) / 1000, 2)
          : null,
    })),
    nearest: near?.point.index ?? null,
    dataPoint,
    variables: plan.choices.map(({ role, variable, via }) => ({ role, variable, via })),
    times: { count: tShape, first, last },
  };
}

/** Reads the chosen point of a NetCDF upload (nothing stored yet). */
export function readNetcdfPoint(
  file: OpenNcFile,
  args: {
    dataPoint: { lat: number | null; lon: number | null };
    gridPoint?: number[];
    columns?: NcColumnMap;
    waterLevelOffsetM?: number;
    onVariable?: (done: number, total: number, records: number) => void;
  },
): { result: CfPointResult; extra: ExtraSeries; info: NetcdfImportInfo } {
  const plan = planCfImport(file, args.columns ?? {});
  const sizes = plan.pointDims.map((d) => plan.reference.shape[plan.reference.dims.indexOf(d)]);
  let chosen: NetcdfImportInfo['point'];
  if (sizes.length === 0) {
    const [p] = listGridPoints(file, plan);
    chosen = {
      index: [],
      lat: nanToNull(p.lat),
      lon: nanToNull(p.lon),
      distanceKm: distanceKm(args.dataPoint, p),
      missingShare: NaN,
      chosen: 'single',
    };
  } else if (args.gridPoint) {
    const g = args.gridPoint;
    if (g.length !== sizes.length || g.some((x, k) => x >= sizes[k])) {
      throw new HttpError(
        'validation',
        `gridPoint must give ${sizes.length} indices along (${plan.pointDims.join(', ')}), each below (${sizes.join(', ')})`,
        [{ field: 'gridPoint', message: `must be ${sizes.length} indices below (${sizes.join(', ')})` }],
      );
    }
    const p = listGridPoints(file, plan).find((x) => x.index.every((v, k) => v === g[k]))!;
    chosen = {
      index: g,
      lat: nanToNull(p.lat),
      lon: nanToNull(p.lon),
      distanceKm: distanceKm(args.dataPoint, p),
      missingShare: NaN,
      chosen: 'given',
    };
  } else {
    if (args.dataPoint.lat === null || args.dataPoint.lon === null) {
      throw new HttpError('validation', 'This NetCDF file is a grid and the project has no data point position: choose the grid point', [
        { field: 'gridPoint', message: 'is required' },
      ]);
    }
    const points = pointsOf(file, plan);
    const near = nearestSeaPoint(points, args.dataPoint.lat, args.dataPoint.lon);
    if (!near) {
      throw new HttpError(
        'bad_file',
        `No grid point has at most ${MAX_MISSING_SHARE * 100}% of its wave heights missing (or positions): every point is land, ice or dry`,
      );
    }
    const p = near.point;
    chosen = {
      index: p.index,
      lat: nanToNull(p.lat),
      lon: nanToNull(p.lon),
      distanceKm: round(near.distanceM / 1000, 2),
      missingShare: round(p.missingShare, 4),
      chosen: 'nearest',
    };
  }
  const result = readCfPoint(file, plan, { index: chosen.index, waterLevelOffsetM: args.waterLevelOffsetM, onVariable: args.onVariable });
  if (Number.isNaN(chosen.missingShare)) {
    const hs = result.records.hs;
    let m = 0;
    for (let i = 0; i < hs.length; i++) if (hs[i] !== hs[i]) m++;
    chosen.missingShare = hs.length ? round(m / hs.length, 4) : 0;
  }
  const partitionsRead = Object.keys(result.partitions).map((p) => PARTITION_LABELS[p as keyof typeof PARTITION_LABELS]);
  const { extra, notStored } = extraColumnsOf(result);
  const stored = (Object.keys(extra) as ExtraColumn[]).sort();
  return {
    result,
    extra,
    info: {
      format: file.format,
      point: chosen,
      variables: plan.choices.map(({ role, variable, via }) => ({ role, variable, via })),
      partitionsRead,
      extraStored: stored,
      notStored,
      notes: [...result.notes, ...plan.ignored.map((i) => `${i.variable}: ${i.reason}`)],
      depthM: result.depthM,
    },
  };
}

const nanToNull = (x: number) => (Number.isNaN(x) ? null : x);

function distanceKm(dp: { lat: number | null; lon: number | null }, p: GridPoint): number | null {
  if (dp.lat === null || dp.lon === null || Number.isNaN(p.lat) || Number.isNaN(p.lon)) return null;
  return round(greatCircleM(dp.lat, dp.lon, p.lat, p.lon) / 1000, 2);
}

/**
 * The optional columns a point result fills: each partition's Hs, Tp and direction (coming from)
 * where the file gives them, the water level above chart datum, the current's speed and going-to
 * direction. What was read but has no column is named in `notStored`.
 */
export function extraColumnsOf(result: CfPointResult): { extra: ExtraSeries; notStored: string[] } {
  const extra: ExtraSeries = {};
  const notStored: string[] = [];
  for (const p of ['windSea', 'swell1', 'swell2'] as const) {
    const s = result.partitions[p];
    if (!s) continue;
    extra[`${p}.hs`] = s.hs;
    if (s.tp) extra[`${p}.tp`] = s.tp;
    if (s.dir) extra[`${p}.dir`] = s.dir;
  }
  if (result.partitions.swell) {
    notStored.push(
      `${PARTITION_LABELS.swell} read but not stored: datasets keep the wind sea and a primary and a secondary swell${
        result.partitions.swell1 || result.partitions.swell2 ? '' : ' (it is part of the total Hs)'
      }`,
    );
  }
  if (result.waterLevel) extra.waterLevel = result.waterLevel;
  if (result.current) {
    extra.currentSpeed = result.current.speed;
    if (result.current.dir) extra.currentDir = result.current.dir;
    else notStored.push('current direction: the file gives the current speed without direction_of_sea_water_velocity');
  }
  return { extra, notStored };
}

// ---------------------------------------------------------------------------------------------
// Uploads read on a worker thread with a time limit

/** Default time limit for reading one NetCDF upload, ms (NETCDF_TIME_LIMIT_MS). */
export const DEFAULT_NETCDF_TIME_LIMIT_MS = 60_000;
const LIMIT_SCALE_BYTES = 256 * 1024 * 1024;

/**
 * How long reading an upload of `sizeBytes` may take: NETCDF_TIME_LIMIT_MS (default 60 s), plus
 * that much again per 256 MB of file (a 339 MB 30-year grid took 22 s on a loaded machine; a
 * damaged small file that loops is stopped after the base limit).
 */
export function netcdfTimeLimitMs(sizeBytes: number): number {
  const raw = process.env.NETCDF_TIME_LIMIT_MS;
  const base = raw === undefined || raw === '' ? DEFAULT_NETCDF_TIME_LIMIT_MS : Number(raw);
  if (!Number.isFinite(base) || base <= 0) throw new Error(`NETCDF_TIME_LIMIT_MS must be a positive number of ms, got ${raw}`);
  return Math.round(base * (1 + sizeBytes / LIMIT_SCALE_BYTES));
}

type PointArgs = Omit<Parameters<typeof readNetcdfPoint>[1], 'onVariable'>;
type DataPoint = Parameters<typeof describeNetcdf>[1];

/** Engine task: the points of the NetCDF file at `path` (describeNetcdf). */
export function netcdfPointsTask(input: { path: string; dataPoint: DataPoint; columns: NcColumnMap }): Promise<NetcdfPointsAnswer> {
  return withNetcdf(input.path, (f) => describeNetcdf(f, input.dataPoint, input.columns));
}

/** Engine task: the chosen point's series of the NetCDF file at `path` (readNetcdfPoint). */
export function netcdfPointTask(
  input: { path: string; args: PointArgs },
  onVariable?: (done: number, total: number, records: number) => void,
): Promise<ReturnType<typeof readNetcdfPoint>> {
  return withNetcdf(input.path, (f) => readNetcdfPoint(f, { ...input.args, onVariable }));
}

function timeLimitError(ms: number): () => HttpError {
  return () =>
    new HttpError(
      'bad_file',
      `The NetCDF file could not be read within ${Math.round(ms / 1000)} s: it may be damaged (or too large to read here; cut it to the area and time needed)`,
    );
}

/** describeNetcdf for an upload, on a worker thread stopped after the time limit (ENGINE_THREADS=0: on this thread, unbounded). */
export function describeNetcdfUpload(
  file: { path: string; size: number },
  dataPoint: DataPoint,
  columns: NcColumnMap = {},
): Promise<NetcdfPointsAnswer> {
  const timeoutMs = netcdfTimeLimitMs(file.size);
  return runIsolatedTask(
    'netcdfPoints',
    netcdfPointsTask,
    { path: file.path, dataPoint, columns },
    { timeoutMs, timeoutError: timeLimitError(timeoutMs) },
  );
}

/** readNetcdfPoint for an upload, on a worker thread stopped after the time limit (ENGINE_THREADS=0: on this thread, unbounded). */
export function readNetcdfPointUpload(
  file: { path: string; size: number },
  args: Parameters<typeof readNetcdfPoint>[1],
): Promise<ReturnType<typeof readNetcdfPoint>> {
  const { onVariable, ...rest } = args;
  const timeoutMs = netcdfTimeLimitMs(file.size);
  return runIsolatedTask(
    'netcdfPoint',
    netcdfPointTask,
    { path: file.path, args: rest },
    { timeoutMs, timeoutError: timeLimitError(timeoutMs), onProgress: onVariable },
  );
}
