/**
 * Engine benchmark (issue 6): 30 years of hourly worksite series, 5 worksites x 10 operations, all
 * monthly statistics (evaluate + go-starts + windows + waiting on weather + monthly aggregation,
 * and each worksite's step detection and calendar) in one thread.
 *
 * Run alone: `npx tsx bench/engine-bench.ts`. The series are synthetic and deterministic
 * (seeded generator), with gaps and missing values; building them is not timed.
 */
import { pathToFileURL } from 'node:url';
import {
  DEFAULT_ALPHA_TABLE,
  calendarIndex,
  createEngineWorkspace,
  detectStepMs,
  operationStatistics,
  type OperationSpec,
  type SiteSeries,
} from '../shared/engine/index';
import { median, mulberry32 } from './lib/random';

const HOUR_MS = 3_600_000;

/**
 * A synthetic worksite series: 1994-01-01 to 2023-12-31 hourly (262,968 hours), seasonal Hs with
 * AR(1) storms, Tp rising with Hs, a few multi-day gaps (rows absent) and scattered NaN.
 */
export function syntheticSeries(seed: number): SiteSeries {
  const rnd = mulberry32(seed);
  const t0 = Date.UTC(1994, 0, 1);
  const hours = (Date.UTC(2024, 0, 1) - t0) / HOUR_MS;
  const time: number[] = [];
  const hs: number[] = [];
  const tp: number[] = [];
  const wind: number[] = [];
  let storm = 0;
  let gapLeft = 0;
  for (let h = 0; h < hours; h++) {
    storm = 0.97 * storm + 0.25 * (rnd() - 0.5);
    if (gapLeft > 0) {
      gapLeft--;
      continue;
    }
    if (rnd() < 0.0004) gapLeft = 1 + Math.floor(rnd() * 72);
    const season = Math.cos((2 * Math.PI * (h % 8766)) / 8766);
    const hsv = Math.max(0.05, 1.4 + 0.7 * season + 2.5 * storm + 0.1 * rnd());
    time.push(t0 + h * HOUR_MS);
    hs.push(rnd() < 0.003 ? NaN : hsv);
    tp.push(rnd() < 0.002 ? NaN : 4 + 1.6 * hsv + rnd());
    wind.push(rnd() < 0.004 ? NaN : Math.max(0, 4 + 3.5 * hsv + 2 * (rnd() - 0.5)));
  }
  const n = time.length;
  const series: SiteSeries = {
    timeMs: Float64Array.from(time),
    hsM: Float64Array.from(hs),
    tpS: Float64Array.from(tp),
    bedVelocityLinearMps: new Float64Array(n),
    bedVelocitySoulsbyMps: new Float64Array(n),
    windMps: Float64Array.from(wind),
  };
  for (let i = 0; i < n; i++) {
    // A rough stand-in for a bed velocity at ~20 m depth, not physics: only its range matters here.
    series.bedVelocityLinearMps[i] = (0.12 * series.hsM[i] * series.tpS[i]) / 10;
    series.bedVelocitySoulsbyMps[i] = 0.9 * series.bedVelocityLinearMps[i];
  }
  return series;
}

/** The bench's ten operations (the response bench adds response limits to four of them). */
export const OPERATIONS: OperationSpec[] = [
  { tpopH: 6, tcH: 6, weatherRestricted: true, limits: { hsMax: 1.5 } },
  { tpopH: 12, tcH: 6, weatherRestricted: true, limits: { hsMax: 2, windMax: 15 } },
  {
    tpopH: 24,
    tcH: 12,
    weatherRestricted: true,
    limits: {
      hsTpCurve: [
        [4, 1.2],
        [8, 2.0],
        [12, 1.6],
        [16, 1.0],
      ],
    },
  },
  { tpopH: 36, tcH: 12, weatherRestricted: true, limits: { hsMax: 2.5, tpMin: 4, tpMax: 14, tpExcluded: [[9, 10.5]] } },
  { tpopH: 48, tcH: 24, weatherRestricted: true, limits: { hsMax: 3, bedVelocityMax: 0.5, bedVelocityMethod: 'linear' } },
  { tpopH: 4, tcH: 2, weatherRestricted: false, limits: { windMax: 12 } },
  { tpopH: 72, tcH: 24, weatherRestricted: false, limits: { hsMax: 2.2, bedVelocityMax: 0.45, bedVelocityMethod: 'soulsby' } },
  {
    tpopH: 8,
    tcH: 4,
    weatherRestricted: true,
    limits: {
      hsTpCurve: [
        [3, 1],
        [6, 1.8],
        [10, 1.8],
        [14, 1.2],
      ],
      windMax: 14,
    },
  },
  {
    tpopH: 18,
    tcH: 6,
    weatherRestricted: true,
    limits: {
      hsMax: 1.8,
      tpExcluded: [
        [6, 7],
        [11, 12.5],
      ],
      tpMax: 15,
    },
  },
  { tpopH: 30, tcH: 10, weatherRestricted: true, limits: { hsMax: 2.8, tpMin: 5, windMax: 18, bedVelocityMax: 0.6 } },
];

const TIME_ZONES = ['UTC', 'Europe/Oslo', 'Australia/Sydney', 'America/Halifax', 'Asia/Singapore'];

/**
 * One full pass: 5 worksites x 10 operations, all monthly statistics. Returns the elapsed (wall)
 * time, the process CPU time (user + system; less sensitive to other load on the machine) and a
 * checksum that keeps the work observable.
 */
export function onePass(
  sites: SiteSeries[],
  operations: readonly OperationSpec[] = OPERATIONS,
): { ms: number; cpuMs: number; checksum: number } {
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  let checksum = 0;
  const workspace = createEngineWorkspace(Math.max(...sites.map((s) => s.timeMs.length)));
  sites.forEach((series, s) => {
    const stepMs = detectStepMs(series.timeMs);
    const calendar = calendarIndex(series.timeMs, TIME_ZONES[s]);
    for (const op of operations) {
      const r = operationStatistics(series, op, calendar, { alphaTable: DEFAULT_ALPHA_TABLE, stepMs, workspace });
      for (const m of r.statistics.months) checksum += (m.workability ?? 0) + (m.wowP90Hours ?? 0) * 1e-3;
      checksum += r.statistics.yearMonths.length;
    }
  });
  const ms = performance.now() - t0;
  const cpu = process.cpuUsage(cpu0);
  return { ms, cpuMs: (cpu.user + cpu.system) / 1000, checksum };
}

/** Result of {@link runEngineBench}. */
export interface EngineBenchResult {
  records: number[];
  combos: number;
  /** First (cold) pass in this process, wall time, ms. */
  coldMs: number;
  /** CPU time of the cold pass, ms. */
  coldCpuMs: number;
  /** Median of the warm passes, wall time, ms. */
  medianMs: number;
  /** Median CPU time of the warm passes, ms. */
  medianCpuMs: number;
  warmMs: number[];
  checksum: number;
}

/** Builds the synthetic sites, runs one cold pass and `warmRuns` warm passes, prints and returns the times. */
export async function runEngineBench(warmRuns = 7): Promise<EngineBenchResult> {
  const sites = [11, 22, 33, 44, 55].map(syntheticSeries);
  const cold = onePass(sites);
  const warm = Array.from({ length: warmRuns }, () => onePass(sites));
  const warmMs = warm.map((w) => w.ms);
  const result: EngineBenchResult = {
    records: sites.map((s) => s.timeMs.length),
    combos: sites.length * OPERATIONS.length,
    coldMs: cold.ms,
    coldCpuMs: cold.cpuMs,
    medianMs: median(warmMs),
    medianCpuMs: median(warm.map((w) => w.cpuMs)),
    warmMs,
    checksum: cold.checksum,
  };
  console.log(
    `engine: ${result.combos} worksite x operation monthly statistics over ${result.records.join('/')} records\n` +
      `  cold:  ${cold.ms.toFixed(0)} ms (CPU ${cold.cpuMs.toFixed(0)} ms)\n` +
      `  warm:  median ${result.medianMs.toFixed(0)} ms (CPU ${result.medianCpuMs.toFixed(0)} ms) of ${warmRuns} runs: ` +
      `${warmMs.map((x) => x.toFixed(0)).join(', ')} ms`,
  );
  return result;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runEngineBench().catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  });
}
