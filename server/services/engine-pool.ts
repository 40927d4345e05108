// Heavy engine work (a cold workability table, a campaign simulation) on worker threads, so that a
// 30-year computation never holds up the requests the API thread serves meanwhile.
//
// The series go to the workers without a copy: datasetSeries keeps each stored series in shared
// memory (SharedArrayBuffer), and a message carrying views of shared memory shares it. Tasks are
// plain functions of plain data (engine-tasks.ts); the pool runs them in order per worker, on the
// least busy worker. ENGINE_THREADS sets the number of workers (default 1: the API thread and one
// engine thread on a 2-core machine); 0 runs the tasks on the API thread (as before). Engine
// threads run below the API thread's CPU priority (ENGINE_NICE, engine-priority.ts).
import os from 'node:os';
import { Worker } from 'node:worker_threads';
import { tsWorker } from '../../scripts/lib/ts-worker';
import { engineNice } from './engine-priority';
import type { EngineTaskName, EngineTasks } from './engine-tasks';
import { errorFromData, type WorkerError } from './worker-errors';

interface Pending {
  resolve: (value: unknown) => void;
  reject: (error: Error) => void;
}

interface PoolWorker {
  worker: Worker;
  busy: number;
  pending: Map<number, Pending>;
  /** Settles once the worker has loaded its modules (its first message), or has failed to. */
  loaded: Promise<void>;
}

/** Workers from ENGINE_THREADS (0 = none), default 1, at most the number of cores. */
function threadCount(): number {
  const raw = process.env.ENGINE_THREADS;
  if (raw === undefined || raw === '') return 1;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0) throw new Error(`ENGINE_THREADS must be a whole number >= 0, got ${raw}`);
  return Math.min(n, os.availableParallelism());
}

/** The bundled engine worker's URL, defined by the server bundle (scripts/lib/server-bundle.ts); undefined under tsx. */
declare const __LULLWATCH_ENGINE_WORKER__: string | undefined;
const BUNDLED_WORKER = typeof __LULLWATCH_ENGINE_WORKER__ === 'string' ? __LULLWATCH_ENGINE_WORKER__ : null;

let workers: PoolWorker[] | null = null;
let nextId = 1;

/** A new engine worker: the bundled one in the built server, else the .ts module under tsx. */
function newWorker(): Worker {
  return BUNDLED_WORKER ? new Worker(new URL(BUNDLED_WORKER)) : tsWorker(new URL('./engine-worker.ts', import.meta.url));
}

type WorkerMessage = { id: number; result?: unknown; error?: WorkerError; progress?: unknown[]; ready?: true };

function start(count: number): PoolWorker[] {
  engineNice(process.env.ENGINE_NICE); // a wrong ENGINE_NICE fails here, on the calling thread, not in each worker
  return Array.from({ length: count }, () => {
    const worker = newWorker();
    const loaded = new Promise<void>((resolve, reject) => {
      worker.once('message', () => resolve());
      worker.once('error', reject);
      worker.once('exit', (code) => reject(new Error(`an engine worker stopped while loading (exit code ${code})`)));
    });
    loaded.catch(() => undefined); // a failure reaches the tasks through failAll; startEnginePool rethrows it
    const pw: PoolWorker = { worker, busy: 0, pending: new Map(), loaded };
    // An idle pool never keeps the process alive (tests, scripts); a task in flight does (ref below).
    pw.worker.unref();
    pw.worker.on('message', (m: WorkerMessage) => {
      const p = pw.pending.get(m.id);
      if (!p) return;
      pw.pending.delete(m.id);
      if (--pw.busy === 0) pw.worker.unref();
      if (m.error) p.reject(errorFromData(m.error));
      else p.resolve(m.result);
    });
    pw.worker.on('error', (err) => failAll(pw, err));
    pw.worker.on('exit', (code) => failAll(pw, new Error(`an engine worker stopped (exit code ${code})`)));
    return pw;
  });
}

/** A worker that died fails its tasks and is replaced on the next call. */
function failAll(pw: PoolWorker, err: Error): void {
  for (const p of pw.pending.values()) p.reject(err);
  pw.pending.clear();
  pw.busy = 0;
  if (workers) workers = workers.filter((w) => w !== pw);
  if (workers?.length === 0) workers = null;
}

/**
 * Runs an engine task on a worker thread, by its name in engine-tasks.ts; with ENGINE_THREADS=0
 * it calls `inThread` (the same function) on the calling thread. The caller hands the function in
 * so this module needs no value import of the services (which import it: no cycle). Arguments and
 * results are copied between threads, except views of shared memory.
 */
export function runEngineTask<K extends EngineTaskName>(
  name: K,
  inThread: EngineTasks[K],
  ...args: Parameters<EngineTasks[K]>
): Promise<ReturnType<EngineTasks[K]>> {
  const count = threadCount();
  if (count === 0) {
    return Promise.resolve().then(() => (inThread as (...a: unknown[]) => unknown)(...args)) as Promise<ReturnType<EngineTasks[K]>>;
  }
  workers ??= start(count);
  const pw = workers.reduce((a, b) => (b.busy < a.busy ? b : a));
  const id = nextId++;
  return new Promise((resolve, reject) => {
    pw.pending.set(id, { resolve: resolve as (v: unknown) => void, reject });
    if (pw.busy++ === 0) pw.worker.ref();
    pw.worker.postMessage({ id, name, args });
  });
}

/** A task of plain input, with an optional progress callback, run by {@link runIsolatedTask}. */
export type IsolatedTask<I, P extends unknown[], R> = (input: I, progress?: (...values: P) => void) => R | Promise<R>;

/**
 * Runs one engine task (by its name in engine-tasks.ts, `inThread` being the same function) on a
 * fresh worker thread that ends afterwards, or is terminated once `timeoutMs` has passed since it
 * loaded: for work that a damaged input could keep busy without end (a NetCDF file's HDF5
 * records), so that it never holds the API thread. The task may be async and may report progress
 * (its last parameter; `onProgress` gets the values). Errors come back of their own class
 * (worker-errors.ts); typed arrays in the result are moved, not copied. With ENGINE_THREADS=0 the
 * task runs on the calling thread and no time limit applies.
 */
export function runIsolatedTask<I, P extends unknown[], R>(
  name: EngineTaskName,
  inThread: IsolatedTask<I, P, R>,
  input: I,
  opts: { timeoutMs: number; timeoutError: () => Error; onProgress?: (...values: P) => void },
): Promise<R> {
  if (threadCount() === 0) return Promise.resolve().then(() => inThread(input, opts.onProgress));
  const worker = newWorker();
  return new Promise<R>((resolve, reject) => {
    let timer: NodeJS.Timeout | undefined;
    let settled = false;
    const settle = (fn: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      fn();
      void worker.terminate();
    };
    worker.on('message', (m: WorkerMessage) => {
      if (m.ready) {
        timer = setTimeout(() => settle(() => reject(opts.timeoutError())), opts.timeoutMs);
        worker.postMessage({ id: 1, name, args: [input], isolated: true });
      } else if (m.progress) {
        if (!settled) opts.onProgress?.(...(m.progress as P));
      } else if (m.error) {
        const err = errorFromData(m.error);
        settle(() => reject(err));
      } else settle(() => resolve(m.result as R));
    });
    worker.on('error', (err) => settle(() => reject(err)));
    worker.on('exit', (code) => settle(() => reject(new Error(`an engine worker stopped (exit code ${code})`))));
  });
}

/**
 * Starts the engine threads now if they are not running, and resolves once each has loaded (they
 * otherwise start at the first task). The benches use it to time a cold computation apart from the
 * threads' start, which under tsx (each module compiled on load) takes seconds. Resolves at once
 * with ENGINE_THREADS=0.
 */
export async function startEnginePool(): Promise<void> {
  const count = threadCount();
  if (count === 0) return;
  workers ??= start(count);
  await Promise.all(workers.map((pw) => pw.loaded));
}

/** Stops the workers (orderly shutdown). */
export async function closeEnginePool(): Promise<void> {
  const ws = workers ?? [];
  workers = null;
  await Promise.all(ws.map((w) => w.worker.terminate()));
}

/** A copy of a series in shared memory (SharedArrayBuffer), so messages to the workers share it instead of copying it. */
export function sharedSeries<T extends object>(series: T): T {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(series)) {
    if (v instanceof Float64Array) {
      const copy = new Float64Array(new SharedArrayBuffer(v.byteLength) as unknown as ArrayBuffer);
      copy.set(v);
      out[k] = copy;
    } else if (v instanceof Uint8Array) {
      const copy = new Uint8Array(new SharedArrayBuffer(v.byteLength) as unknown as ArrayBuffer);
      copy.set(v);
      out[k] = copy;
    } else if (k === 'extra' && v && typeof v === 'object') {
      // The optional columns (water level, current, partitions) are shared the same way.
      out[k] = sharedSeries(v as object);
    } else out[k] = v;
  }
  return out as T;
}
