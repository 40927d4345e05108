// The work `npm run bench:peer` times on our side: transform the data point's series to each
// worksite, hourly status of every operation there, then every monthly and year-month statistic;
// on the main thread or on worker threads, each taking an equal share of the (worksite, operation) pairs.
import type { Worker } from 'node:worker_threads';
import { tsWorker } from '../scripts/lib/ts-worker';
import {
  DEFAULT_ALPHA_TABLE,
  calendarIndex,
  createStatisticsScratch,
  createStatusManyScratch,
  detectStepMs,
  evaluateStatusMany,
  monthlyStatisticsWithGoStarts,
  type OperationSpec,
  type SiteSeries as EngineSeries,
  type StatisticsScratch,
  type StatusManyScratch,
} from '../shared/engine/index';
import {
  createSiteSeries,
  prepareSeaInput,
  transformToSite,
  type SiteGeometry,
  type SiteSeries as TransformedSeries,
} from '../shared/waves/index';

/** The peer's input and set-up in our terms. */
export interface HindcastInput {
  timeMs: Float64Array;
  hs: Float64Array;
  tp: Float64Array;
  dir: Float64Array;
  wind: Float64Array;
  sourceDepthM: number;
  sites: SiteGeometry[];
  operations: OperationSpec[];
}

/** Milliseconds per stage and in total. */
export interface StageTimes {
  transform: number;
  status: number;
  statistics: number;
  total: number;
  /** Sum of figures of the results, so that no work can be skipped; equal on every run. */
  checksum: number;
}

/**
 * Buffers one thread keeps from run to run, as a server's engine worker keeps its workspace:
 * the worksite series, the status arrays and the statistics' scratch.
 */
interface RunBuffers {
  n: number;
  sites: TransformedSeries[];
  statuses: Uint8Array[][];
  goStart: Uint8Array;
  scratch: StatisticsScratch;
  statusScratch: StatusManyScratch;
}

let buffers: RunBuffers | null = null;

function runBuffers(n: number, sites: number, ops: number): RunBuffers {
  if (!buffers || buffers.n !== n) {
    buffers = {
      n,
      sites: [],
      statuses: [],
      goStart: new Uint8Array(n),
      scratch: createStatisticsScratch(n),
      statusScratch: createStatusManyScratch(n),
    };
  }
  while (buffers.sites.length < sites) buffers.sites.push(createSiteSeries(n));
  while (buffers.statuses.length < sites) buffers.statuses.push([]);
  for (const list of buffers.statuses) while (list.length < ops) list.push(new Uint8Array(n));
  return buffers;
}

/** A share of the work: (worksite, operation) pairs as worksite * operations + operation, ascending. */
export type PairList = number[];

/** Every (worksite, operation) pair. */
export function allPairs(input: HindcastInput): PairList {
  return Array.from({ length: input.sites.length * input.operations.length }, (_, k) => k);
}

/**
 * Transform, status and statistics of the given (worksite, operation) pairs (all when omitted), one
 * stage after the other, as the workability service does it: the data point's distinct values found
 * once for every worksite, only the fields the engine reads transformed, the status of a worksite's
 * operations in one evaluateStatusMany call, one calendar for the series, buffers reused from run
 * to run. `clock` times the stages (ms; default wall time).
 */
export function runHindcastAllSites(
  input: HindcastInput,
  pairs: PairList = allPairs(input),
  clock: () => number = () => performance.now(),
): StageTimes {
  const n = input.timeMs.length;
  const nOps = input.operations.length;
  const indices = [...new Set(pairs.map((p) => Math.floor(p / nOps)))];
  const opsOf = indices.map((s) => pairs.filter((p) => Math.floor(p / nOps) === s).map((p) => p % nOps));
  const buf = runBuffers(n, indices.length, nOps);
  const t0 = clock();
  const tzS = new Float64Array(n).fill(NaN); // no Tz in the peer's data: Soulsby takes Tz from Tp (docs/domain.md#convention-8)
  const sea = { hsM: input.hs, tpS: input.tp, tzS, dirDeg: input.dir };
  const prepared = prepareSeaInput(sea);
  const transformed = indices.map((s, k) =>
    transformToSite(sea, { depthM: input.sourceDepthM }, input.sites[s], { out: buf.sites[k], fields: 'engine', prepared }),
  );
  const t1 = clock();
  const series: EngineSeries[] = transformed.map((t) => ({
    timeMs: input.timeMs,
    hsM: t.hsM,
    tpS: input.tp,
    bedVelocityLinearMps: t.bedVelocityLinearMps,
    bedVelocitySoulsbyMps: t.bedVelocitySoulsbyMps,
    windMps: input.wind,
  }));
  const statuses = series.map((s, k) =>
    evaluateStatusMany(
      s,
      opsOf[k].map((o) => input.operations[o]),
      {
        alphaTable: DEFAULT_ALPHA_TABLE,
        out: buf.statuses[k],
        scratch: buf.statusScratch,
        // The data point's distinct periods, found once by the transform stage (every worksite has its Tp).
        tpDistinct: { ids: prepared.tpIds, keys: prepared.tpKeys },
      },
    ),
  );
  const t2 = clock();
  let checksum = 0;
  const stepMs = detectStepMs(input.timeMs);
  const calendar = calendarIndex(input.timeMs, 'UTC');
  series.forEach((s, k) => {
    opsOf[k].forEach((o, j) => {
      const op = input.operations[o];
      const r = monthlyStatisticsWithGoStarts(s.timeMs, statuses[k][j], buf.goStart, stepMs, calendar, op.tpopH + op.tcH, buf.scratch);
      for (const m of r.months)
        checksum += (m.workability ?? 0) + (m.goStartShare ?? 0) + (m.wowP90Hours ?? 0) * 1e-3 + (m.windowsPerMonth ?? 0) * 1e-2;
      for (const ym of r.yearMonths) checksum += (ym.wowP90Hours ?? 0) * 1e-6;
    });
  });
  const t3 = clock();
  return { transform: t1 - t0, status: t2 - t1, statistics: t3 - t2, total: t3 - t0, checksum };
}

/** Copies a Float64Array into shared memory (so workers read it without a copy). */
function shared(a: Float64Array): Float64Array {
  const s = new Float64Array(new SharedArrayBuffer(a.byteLength));
  s.set(a);
  return s;
}

/**
 * Worker threads that each take an equal share of the (worksite, operation) pairs. The input is placed in shared memory once per
 * input (not timed, like the peer's arrays already in memory); a run's total is the wall time from
 * posting the work to the last answer.
 */
export class EnginePool {
  private constructor(private readonly workers: Worker[]) {}

  static async start(threads: number): Promise<EnginePool> {
    const url = new URL('./peer-worker.ts', import.meta.url);
    const workers = Array.from({ length: threads }, () => tsWorker(url));
    await Promise.all(
      workers.map(
        (w) =>
          new Promise<void>((resolve, reject) => {
            w.once('message', () => resolve());
            w.once('error', reject);
          }),
      ),
    );
    return new EnginePool(workers);
  }

  private sharedInput: HindcastInput | null = null;
  private sharedFrom: HindcastInput | null = null;

  async run(input: HindcastInput): Promise<StageTimes> {
    if (this.sharedFrom !== input) {
      this.sharedInput = {
        ...input,
        timeMs: shared(input.timeMs),
        hs: shared(input.hs),
        tp: shared(input.tp),
        dir: shared(input.dir),
        wind: shared(input.wind),
      };
      this.sharedFrom = input;
    }
    const work = this.sharedInput as HindcastInput;
    // The (worksite, operation) pairs in equal contiguous shares (5 x 10 on 2 threads: 25 each; a
    // worksite split between two threads is transformed by both, a small part of the work).
    const pairs = allPairs(work);
    const per = Math.ceil(pairs.length / this.workers.length);
    const parts = this.workers.map((_, w) => pairs.slice(w * per, (w + 1) * per));
    const t0 = performance.now();
    const answers = await Promise.all(
      this.workers.map(
        (w, i) =>
          new Promise<StageTimes>((resolve, reject) => {
            w.once('message', (m: StageTimes) => resolve(m));
            w.once('error', reject);
            w.postMessage({ input: work, pairs: parts[i] });
          }),
      ),
    );
    const total = performance.now() - t0;
    const slowest = (k: 'transform' | 'status' | 'statistics') => Math.max(...answers.map((a) => a[k]));
    return {
      transform: slowest('transform'),
      status: slowest('status'),
      statistics: slowest('statistics'),
      total,
      checksum: answers.reduce((a, b) => a + b.checksum, 0),
    };
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
