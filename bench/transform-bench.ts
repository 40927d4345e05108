/**
 * Benchmark: transforming 30 years of hourly sea states (262,968 records) from the data point to
 * five worksites with `transformToSite`, from typed arrays in memory. Prints records per second
 * (record-transforms: records x worksites) for the median of several runs.
 *
 * Run directly: `npx tsx bench/transform-bench.ts`; or import `runTransformBench`.
 */
import { pathToFileURL } from 'node:url';
import {
  createSiteSeries,
  transformToSite,
  type SeaSeriesInput,
  type SiteGeometry,
  type SiteSeries,
  type SourcePoint,
} from '../shared/waves/index';
import { median, mulberry32 } from './lib/random';

/** Hourly records in 30 years (1990-2019, 7 leap days): 10,957 days x 24. */
export const BENCH_RECORDS = 262_968;

/** Timed runs; the figure is their median. */
export const BENCH_RUNS = 7;

/**
 * Synthetic hourly series: seasonal Hs with a slowly varying random component (0.1-9 m, 0.01 m
 * resolution), Tp from a steepness-like relation rounded to 0.1 s (as real data are), Tz given in
 * half the records (rounded to 0.1 s, NaN otherwise), directions with a prevailing sector rounded
 * to 1 degree, and 0.5 % missing values.
 */
export function syntheticSeries(records: number = BENCH_RECORDS, seed = 20240601): SeaSeriesInput {
  const rand = mulberry32(seed);
  const hsM = new Float64Array(records);
  const tpS = new Float64Array(records);
  const tzS = new Float64Array(records);
  const dirDeg = new Float64Array(records);
  let ar = 0;
  for (let i = 0; i < records; i++) {
    const season = 1 + 0.5 * Math.cos((2 * Math.PI * i) / 8766);
    ar = 0.995 * ar + 0.1 * (rand() - 0.5);
    const hs = Math.min(9, Math.max(0.1, season * (1.2 + 3 * Math.abs(ar)) + 0.2 * rand()));
    hsM[i] = Math.round(hs * 100) / 100;
    const tp = 3.5 * Math.sqrt(hs) + 2 + 3 * rand();
    tpS[i] = Math.round(Math.min(25, tp) * 10) / 10;
    tzS[i] = rand() < 0.5 ? Math.round(tpS[i] * (0.72 + 0.1 * rand()) * 10) / 10 : NaN;
    dirDeg[i] = Math.round((250 + 80 * (rand() - 0.5) + (rand() < 0.2 ? 180 * rand() : 0)) % 360);
    if (rand() < 0.005) hsM[i] = NaN;
    if (rand() < 0.005) tpS[i] = NaN;
  }
  return { hsM, tpS, tzS, dirDeg };
}

/** The five worksites: different depths and shore-normal bearings (one with a transfer table). */
export const BENCH_SITES: SiteGeometry[] = [
  { depthM: 6, shoreNormalDeg: 270, breakerIndex: 0.6 },
  { depthM: 12, shoreNormalDeg: 240, breakerIndex: 0.6 },
  { depthM: 25, shoreNormalDeg: 300, breakerIndex: 0.6 },
  { depthM: 45, shoreNormalDeg: null, breakerIndex: 0.6 },
  {
    depthM: 18,
    shoreNormalDeg: 255,
    breakerIndex: 0.6,
    transferTable: {
      directionSectorsDeg: [
        [180, 225],
        [225, 270],
        [270, 315],
        [315, 360],
      ],
      tpBandsS: [
        [0, 6],
        [6, 10],
        [10, 14],
        [14, 30],
      ],
      factors: [
        [0.7, 0.75, 0.8, 0.85],
        [0.85, 0.9, 0.92, 0.95],
        [0.8, 0.85, 0.9, 0.93],
        [0.5, 0.55, 0.6, 0.65],
      ],
    },
  },
];

/** Source point of the synthetic dataset: 60 m of water. */
export const BENCH_SOURCE: SourcePoint = { depthM: 60 };

/** Result of `runTransformBench`. */
export interface TransformBenchResult {
  /** Record-transforms per second (records x worksites / median pass time), output arrays reused. */
  recordsPerSecond: number;
  /** Median time of one pass (all records to all five worksites), ms, output arrays reused. */
  medianMs: number;
  /** The same with fresh output arrays allocated in every pass (as a one-off API call would). */
  allocatingRecordsPerSecond: number;
  allocatingMedianMs: number;
  /** Fastest pass, ms, output arrays reused (less sensitive to other load on the machine). */
  bestMs: number;
  /**
   * Median CPU time (user + system) of a pass, ms, output arrays reused: the per-core cost when
   * other processes share the cores (wall time then includes time spent descheduled).
   */
  medianCpuMs: number;
}

/**
 * Runs the benchmark: one warm-up pass, then `BENCH_RUNS` timed passes, each transforming the
 * whole series to all five worksites. The headline figure reuses output arrays (`options.out`,
 * the allocation-light path a long job uses); the allocating figure is measured too.
 *
 * @returns record-transforms per second (records x 5 / median pass time) and the median pass time, ms.
 */
export async function runTransformBench(): Promise<TransformBenchResult> {
  const input = syntheticSeries();
  const reuse = BENCH_SITES.map(() => createSiteSeries(BENCH_RECORDS));
  const passReuse = (): void => {
    BENCH_SITES.forEach((site, s) => transformToSite(input, BENCH_SOURCE, site, { out: reuse[s] }));
  };
  const passAllocating = (): SiteSeries[] => BENCH_SITES.map((site) => transformToSite(input, BENCH_SOURCE, site));
  // Warm-up (JIT), and a check that the outputs are sane.
  passReuse();
  for (const out of passAllocating()) {
    let finite = 0;
    for (let i = 0; i < out.hsM.length; i++) if (Number.isFinite(out.hsM[i])) finite++;
    if (finite < 0.98 * BENCH_RECORDS) throw new Error('benchmark sanity check failed: too many missing outputs');
  }
  const cpuTimes: number[] = [];
  const time = async (pass: () => unknown): Promise<number[]> => {
    const times: number[] = [];
    cpuTimes.length = 0;
    for (let run = 0; run < BENCH_RUNS; run++) {
      const c0 = process.cpuUsage();
      const t0 = performance.now();
      pass();
      times.push(performance.now() - t0);
      const c = process.cpuUsage(c0);
      cpuTimes.push((c.user + c.system) / 1000);
      await Promise.resolve();
    }
    return times;
  };
  const reuseTimes = await time(passReuse);
  const medianMs = median(reuseTimes);
  const medianCpuMs = median(cpuTimes);
  const allocatingMedianMs = median(await time(passAllocating));
  const transforms = BENCH_RECORDS * BENCH_SITES.length;
  return {
    recordsPerSecond: transforms / (medianMs / 1000),
    medianMs,
    allocatingRecordsPerSecond: transforms / (allocatingMedianMs / 1000),
    allocatingMedianMs,
    bestMs: Math.min(...reuseTimes),
    medianCpuMs,
  };
}

/** One line of the figures, printed by `npm run bench` and when this file is run directly. */
export function describeTransformBench(r: TransformBenchResult): string {
  return (
    `transform: ${BENCH_RECORDS} hourly records x ${BENCH_SITES.length} worksites, median of ${BENCH_RUNS} runs: ` +
    `${r.medianMs.toFixed(1)} ms, ${(r.recordsPerSecond / 1e6).toFixed(1)} million record-transforms/s (one core, ` +
    `output arrays reused); fresh output arrays: ${r.allocatingMedianMs.toFixed(1)} ms, ` +
    `${(r.allocatingRecordsPerSecond / 1e6).toFixed(1)} million/s; fastest pass ${r.bestMs.toFixed(1)} ms ` +
    `(${((BENCH_RECORDS * BENCH_SITES.length) / r.bestMs / 1e3).toFixed(1)} million/s); median CPU time ` +
    `${r.medianCpuMs.toFixed(1)} ms (${((BENCH_RECORDS * BENCH_SITES.length) / r.medianCpuMs / 1e3).toFixed(1)} million/s per core)`
  );
}

/**
 * A synthetic water level for the tide figure, m: an invented 1.8 m M2 and 0.6 m S2 around mean sea
 * level (M2 28.9841042 deg/h, S2 30 deg/h, Schureman 1958), one value per hourly record.
 */
export function syntheticWaterLevel(records: number = BENCH_RECORDS): Float64Array {
  const deg = Math.PI / 180;
  return Float64Array.from({ length: records }, (_, i) => 1.8 * Math.cos(28.9841042 * i * deg) + 0.6 * Math.cos(30 * i * deg + 1));
}

/** Result of `runTideTransformBench`: median pass times (all records to all five worksites), ms. */
export interface TideTransformBenchResult {
  fixedMs: number;
  tideMs: number;
}

/**
 * The transformation with the tide on (a water level per record, docs/domain.md#tide) against the
 * fixed depth, output arrays reused, median of `BENCH_RUNS` passes each.
 */
export async function runTideTransformBench(): Promise<TideTransformBenchResult> {
  const input = syntheticSeries();
  const tidal = { ...input, waterLevelM: syntheticWaterLevel() };
  const reuse = BENCH_SITES.map(() => createSiteSeries(BENCH_RECORDS));
  const timed = async (sea: SeaSeriesInput): Promise<number> => {
    BENCH_SITES.forEach((site, s) => transformToSite(sea, BENCH_SOURCE, site, { out: reuse[s] }));
    const times: number[] = [];
    for (let run = 0; run < BENCH_RUNS; run++) {
      const t0 = performance.now();
      BENCH_SITES.forEach((site, s) => transformToSite(sea, BENCH_SOURCE, site, { out: reuse[s] }));
      times.push(performance.now() - t0);
      await Promise.resolve();
    }
    return median(times);
  };
  return { fixedMs: await timed(input), tideMs: await timed(tidal) };
}

/** One line of the tide figure, printed by `npm run bench`. */
export function describeTideTransformBench(r: TideTransformBenchResult): string {
  const transforms = BENCH_RECORDS * BENCH_SITES.length;
  return (
    `transform with the tide: ${BENCH_RECORDS} hourly records x ${BENCH_SITES.length} worksites, median of ${BENCH_RUNS} runs: ` +
    `tide off ${r.fixedMs.toFixed(1)} ms (${(transforms / r.fixedMs / 1e3).toFixed(1)} million/s), ` +
    `tide on ${r.tideMs.toFixed(1)} ms (${(transforms / r.tideMs / 1e3).toFixed(1)} million/s), ` +
    `${(r.tideMs / r.fixedMs).toFixed(1)}x the fixed-depth time`
  );
}

const invokedDirectly = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href;
if (invokedDirectly) {
  void runTransformBench()
    .then((r) => console.log(describeTransformBench(r)))
    .then(runTideTransformBench)
    .then((r) => console.log(describeTideTransformBench(r)));
}
