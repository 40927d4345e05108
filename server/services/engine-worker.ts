// An engine worker thread (see engine-pool.ts): runs the named task and answers with its result.
import { parentPort } from 'node:worker_threads';
import { ENGINE_TASKS, type EngineTaskName } from './engine-tasks';

if (!parentPort) throw new Error('engine-worker.ts runs as a worker thread');
const port = parentPort;
port.on('message', (m: { id: number; name: EngineTaskName; args: unknown[] }) => {
  try {
    const result = (ENGINE_TASKS[m.name] as (...a: unknown[]) => unknown)(...m.args);
    port.postMessage({ id: m.id, result });
  } catch (err) {
    const e = err instanceof Error ? err : new Error(String(err));
    port.postMessage({ id: m.id, error: { name: e.name, message: e.message } });
  }
});
