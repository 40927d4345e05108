// A worker thread running a TypeScript module, for code that runs under tsx (the server, the
// benches): Node 20 does not pass tsx's loader on to workers, so the worker registers it first.
import { Worker, type WorkerOptions } from 'node:worker_threads';

const TSX_API = import.meta.resolve('tsx/esm/api');

/** Starts a worker thread on a .ts module (a file: URL). */
export function tsWorker(moduleUrl: URL, options: Omit<WorkerOptions, 'eval'> = {}): Worker {
  const code = `import(${JSON.stringify(TSX_API)}).then((api) => { api.register(); return import(${JSON.stringify(moduleUrl.href)}); });`;
  return new Worker(code, { ...options, eval: true });
}
