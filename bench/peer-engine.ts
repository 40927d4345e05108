// The work `npm run bench:peer` times on our side: transform the data point's series to each
// worksite, hourly status of every operation there, then every monthly and year-month statistic;
// on the main thread, or on worker threads that split each worksite's records (transform, status)
// and its operations (statistics) between them.
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
  type CalendarIndex,
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
  /**
   * Per (worksite, operation), at [site * operations + o], a sum of figures of its statistics (0
   * where another thread worked it), so that no work can be skipped and runs can be compared.
   */
  sums: number[];
  /** The sums added in index order: equal on every run, on one thread or several. */
  checksum: number;
  /** Of the status time, ms spent waiting at the barriers for the other threads (0 on one thread). */
  waitMs: number;
}

/**
 * One thread's share of a run, and what the threads share. Worksite by worksite, thread `worker`
 * of `workers` transforms records [lo, hi) and evaluates their status for every operation (both are
 * record by record), writing the codes into `status`; after a barrier the threads work the
 * statistics of the worksite's operations over the whole series, each taking the next operation
 * not yet taken (a shared counter per worksite), so that a thread given cheaper operations does not
 * wait for the other at the next barrier. Two sets of status buffers (by worksite parity) let a
 * thread start the next worksite while another still reads the last.
 */
export interface RunShare {
  worker: number;
  workers: number;
  /** sets x operations x records status codes (sets: 2 with several threads, else 1). */
  status: Uint8Array<ArrayBufferLike>;
  /**
   * Several threads only, every element set to 0 before each run: [0] the barrier counter, then
   * per worksite k the count of its operations taken ([1 + k]).
   */
  barrier: Int32Array | null;
}

/**
 * Buffers one thread keeps from run to run, as a server's engine worker keeps its workspace:
 * one worksite's series for its records, the statistics' scratch and the status scratch, the data
 * point's record indices and the calendar (fresh memory costs a page fault per 4 kB here).
 */
interface RunBuffers {
  n: number;
  part: number;
  site: TransformedSeries;
  tzS: Float64Array;
  goStart: Uint8Array;
  scratch: StatisticsScratch;
  statusScratch: StatusManyScratch;
  /** The status codes on one thread (operations x records); threads share theirs (RunShare). */
  status: Uint8Array<ArrayBufferLike>;
  /** prepareSeaInput's record indices (this thread's records) and the calendar (every record). */
  ids: { tpIds: Int32Array; dirIds: Int32Array };
  calendar: { month: Uint8Array; yearMonth: Int32Array };
}

let buffers: RunBuffers | null = null;

function runBuffers(n: number, part: number): RunBuffers {
  if (!buffers || buffers.n !== n || buffers.part !== part) {
    buffers = {
      n,
      part,
      site: createSiteSeries(part),
      tzS: new Float64Array(part),
      goStart: new Uint8Array(n),
      scratch: createStatisticsScratch(n),
      statusScratch: createStatusManyScratch(part),
      status: new Uint8Array(0),
      ids: { tpIds: new Int32Array(part), dirIds: new Int32Array(part) },
      calendar: { month: new Uint8Array(n), yearMonth: new Int32Array(n) },
    };
  }
  return buffers;
}

/** The records of share `worker` of `workers`: equal parts, each starting on a 64-record boundary. */
export function shareRange(n: number, worker: number, workers: number): [number, number] {
  const at = (w: number) => (w >= workers ? n : Math.min(n, Math.floor((n * w) / workers / 64) * 64));
  return [at(worker), at(worker + 1)];
}

/** Waits until every thread has arrived at barrier `round` (1, 2, ... within a run); gives up after a minute. */
function barrier(counter: Int32Array, workers: number, round: number): void {
  const target = round * workers;
  if (Atomics.add(counter, 0, 1) + 1 === target) {
    Atomics.notify(counter, 0);
    return;
  }
  const until = Date.now() + 60_000;
  for (let v = Atomics.load(counter, 0); v < target; v = Atomics.load(counter, 0)) {
    if (Date.now() > until || Atomics.wait(counter, 0, v, 60_000) === 'timed-out')
      throw new Error(`peer bench: a thread did not reach barrier ${round}`);
  }
}

/**
 * Transform, status and statistics, one worksite after the other, as the workability service does
 * it: the data point's distinct values found once for every worksite, only the fields the engine
 * reads transformed, the status of a worksite's operations in one evaluateStatusMany call, one
 * calendar for the series, buffers reused from run to run. Every run works the time axis's
 * groundwork afresh (the median step, the record steps with their gaps, the calendar), as the peer
 * times its own with its statistics: the statistics read a new view of the time axis on each run,
 * so the record steps the engine keeps per time array are not found from an earlier run (an evenly
 * spaced axis is still checked record by record; only its result arrays, kept by shape, are
 * reused). On one
 * thread (the default share) every
 * record and operation; see {@link RunShare} for a thread's part. `clock` times the stages (ms;
 * default wall time), each stage's time summed over the worksites; a thread's wait at the barrier
 * counts in its status time.
 */
export function runHindcastAllSites(
  input: HindcastInput,
  share: RunShare = { worker: 0, workers: 1, status: new Uint8Array(0), barrier: null },
  clock: () => number = () => performance.now(),
): StageTimes {
  const n = input.timeMs.length;
  const nOps = input.operations.length;
  const timeAxis = input.timeMs.subarray(0); // a new view on every run (see above)
  const [lo, hi] = shareRange(n, share.worker, share.workers);
  const buf = runBuffers(n, hi - lo);
  const sets = share.workers > 1 ? 2 : 1;
  if (share.status.length < sets * nOps * n && buf.status.length < sets * nOps * n) buf.status = new Uint8Array(sets * nOps * n);
  const status = share.status.length >= sets * nOps * n ? share.status : buf.status;
  const codes = (set: number, o: number) => status.subarray((set * nOps + o) * n, (set * nOps + o + 1) * n);
  // The next operation of worksite k whose statistics this thread works (every one, on one thread).
  const counters = share.barrier;
  let taken = 0;
  const nextOp = (k: number) => (counters ? Atomics.add(counters, 1 + k, 1) : taken++);
  const t0 = clock();
  let transform = 0;
  let statusMs = 0;
  let statistics = 0;
  const sums = new Array<number>(input.sites.length * nOps).fill(0);
  let waitMs = 0;
  // This share's records of the data point; no Tz in the peer's data: Soulsby takes Tz from Tp (docs/domain.md#convention-8).
  const tzS = buf.tzS.fill(NaN);
  const sea = { hsM: input.hs.subarray(lo, hi), tpS: input.tp.subarray(lo, hi), tzS, dirDeg: input.dir.subarray(lo, hi) };
  const prepared = prepareSeaInput(sea, buf.ids);
  let t = clock();
  transform += t - t0;
  let calendar: CalendarIndex | null = null;
  let stepMs = 0;
  input.sites.forEach((site, k) => {
    const set = k % sets;
    transformToSite(sea, { depthM: input.sourceDepthM }, site, { out: buf.site, fields: 'engine', prepared });
    const t1 = clock();
    transform += t1 - t;
    const series: EngineSeries = {
      timeMs: input.timeMs.subarray(lo, hi),
      hsM: buf.site.hsM,
      tpS: sea.tpS,
      bedVelocityLinearMps: buf.site.bedVelocityLinearMps,
      bedVelocitySoulsbyMps: buf.site.bedVelocitySoulsbyMps,
      windMps: input.wind.subarray(lo, hi),
    };
    evaluateStatusMany(series, input.operations, {
      alphaTable: DEFAULT_ALPHA_TABLE,
      out: input.operations.map((_, o) => codes(set, o).subarray(lo, hi)),
      scratch: buf.statusScratch,
      // The data point's distinct periods, found once by the transform stage (every worksite has its Tp).
      tpDistinct: { ids: prepared.tpIds, keys: prepared.tpKeys },
    });
    const tw = clock();
    if (share.barrier) barrier(share.barrier, share.workers, k + 1);
    const t2 = clock();
    waitMs += t2 - tw;
    statusMs += t2 - t1;
    if (calendar === null) {
      stepMs = detectStepMs(timeAxis);
      calendar = calendarIndex(timeAxis, 'UTC', buf.calendar);
    }
    taken = 0;
    for (let o = nextOp(k); o < nOps; o = nextOp(k)) {
      const op = input.operations[o];
      const r = monthlyStatisticsWithGoStarts(timeAxis, codes(set, o), buf.goStart, stepMs, calendar, op.tpopH + op.tcH, buf.scratch);
      let sum = 0;
      for (const m of r.months)
        sum += (m.workability ?? 0) + (m.goStartShare ?? 0) + (m.wowP90Hours ?? 0) * 1e-3 + (m.windowsPerMonth ?? 0) * 1e-2;
      for (const ym of r.yearMonths) sum += (ym.wowP90Hours ?? 0) * 1e-6;
      sums[k * nOps + o] = sum;
    }
    t = clock();
    statistics += t - t2;
  });
  return { transform, status: statusMs, statistics, total: t - t0, sums, checksum: sumInOrder(sums), waitMs };
}

function sumInOrder(sums: readonly number[]): number {
  let total = 0;
  for (const x of sums) total += x;
  return total;
}

/** Copies a Float64Array into shared memory (so workers read it without a copy). */
function shared(a: Float64Array): Float64Array {
  const s = new Float64Array(new SharedArrayBuffer(a.byteLength));
  s.set(a);
  return s;
}

/** A message to a thread of {@link EnginePool}: a new input and share, or none to run again on those it holds. */
export interface PoolMessage {
  input?: HindcastInput;
  share?: RunShare;
}

/**
 * Worker threads that share each run (see {@link RunShare}). The input and the status buffers are
 * placed in shared memory and handed to the threads once per input (not timed, like the peer's
 * arrays already in memory); each thread keeps them from run to run, as the server's engine thread
 * keeps a series it has seen, and works the time axis's groundwork afresh on every run, as on the
 * main thread. A run's total is the wall time from posting the work to the last answer.
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

  private sharedFrom: HindcastInput | null = null;
  private barrier: Int32Array<ArrayBufferLike> = new Int32Array(0);

  async run(input: HindcastInput): Promise<StageTimes> {
    let messages: PoolMessage[] = this.workers.map(() => ({}));
    if (this.sharedFrom !== input) {
      const work: HindcastInput = {
        ...input,
        timeMs: shared(input.timeMs),
        hs: shared(input.hs),
        tp: shared(input.tp),
        dir: shared(input.dir),
        wind: shared(input.wind),
      };
      this.sharedFrom = input;
      const status = new Uint8Array(new SharedArrayBuffer(2 * input.operations.length * input.timeMs.length));
      this.barrier = new Int32Array(new SharedArrayBuffer(4 * (1 + input.sites.length)));
      const workers = this.workers.length;
      messages = this.workers.map((_, worker) => ({ input: work, share: { worker, workers, status, barrier: this.barrier } }));
    }
    this.barrier.fill(0);
    const t0 = performance.now();
    const answers = await Promise.all(
      this.workers.map(
        (w, worker) =>
          new Promise<StageTimes>((resolve, reject) => {
            const onError = (err: Error) => reject(err);
            w.once('message', (m: StageTimes) => {
              w.off('error', onError);
              resolve(m);
            });
            w.once('error', onError);
            w.postMessage(messages[worker]);
          }),
      ),
    );
    const total = performance.now() - t0;
    const slowest = (k: 'transform' | 'status' | 'statistics') => Math.max(...answers.map((a) => a[k]));
    // Each (worksite, operation) was worked by one thread: 0 in the other threads' sums.
    const sums = answers[0].sums.map((_, j) => answers.reduce((a, b) => a + b.sums[j], 0));
    return {
      transform: slowest('transform'),
      status: slowest('status'),
      statistics: slowest('statistics'),
      total,
      sums,
      checksum: sumInOrder(sums),
      waitMs: Math.max(...answers.map((a) => a.waitMs)),
    };
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
