// An engine worker thread (see engine-pool.ts): runs the named task and answers with its result.
// Tasks may be async. An isolated task (runIsolatedTask: one task, then the worker ends) also gets
// a progress callback as its last argument, and its result's typed arrays are moved, not copied.
// Errors go back as plain data (worker-errors.ts) and are rebuilt of their own class.
import { parentPort } from 'node:worker_threads';
import { engineNice, lowerThisThread } from './engine-priority';
import { ENGINE_TASKS, type EngineTaskName } from './engine-tasks';
import { errorToData } from './worker-errors';
import { SeriesCanon } from './series-value-cache';
import { SERIES_MEMO_BYTES } from './workability';

if (!parentPort) throw new Error('engine-worker.ts runs as a worker thread');
const port = parentPort;
// Below the API thread, so requests are answered first while a computation runs (engine-priority.ts).
lowerThisThread(engineNice(process.env.ENGINE_NICE));

/**
 * Each task's series arrive as new views of the shared memory; a series equal to one received
 * before is replaced by that one, so that the caches keyed by its arrays (a worksite's predicted
 * tide and current, the calendar's groups, the record steps) find their work again. Holds no more
 * than the API thread's series memo.
 */
const canon = new SeriesCanon(SERIES_MEMO_BYTES);

/** The buffers of the typed arrays in a result (not shared memory), to move them to the API thread. */
function transferables(value: unknown, out = new Set<ArrayBuffer>(), depth = 0): Set<ArrayBuffer> {
  if (depth > 6 || value === null || typeof value !== 'object') return out;
  if (ArrayBuffer.isView(value)) {
    if (value.buffer instanceof ArrayBuffer) out.add(value.buffer);
  } else for (const v of Object.values(value)) transferables(v, out, depth + 1);
  return out;
}

port.on('message', (m: { id: number; name: EngineTaskName; args: unknown[]; isolated?: boolean }) => {
  const progress = (...values: unknown[]) => port.postMessage({ id: m.id, progress: values });
  Promise.resolve()
    .then(() =>
      (ENGINE_TASKS[m.name] as (...a: unknown[]) => unknown)(
        ...(m.isolated ? [...m.args, progress] : m.args.map((a) => canon.canonical(a))),
      ),
    )
    .then(
      (result) => port.postMessage({ id: m.id, result }, m.isolated ? [...transferables(result)] : []),
      (err: unknown) => port.postMessage({ id: m.id, error: errorToData(err) }),
    );
});
// Tells an isolated task's starter that the module is loaded (its time limit starts now).
port.postMessage({ ready: true });
