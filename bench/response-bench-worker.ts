// Worker thread of bench/response-bench.ts: one cold run (and warm runs) in a fresh isolate.
import { parentPort, workerData } from 'node:worker_threads';
import { responseRunInThisThread } from './response-bench';

if (!parentPort) throw new Error('response-bench-worker.ts runs as a worker thread');
const port = parentPort;
const { withResponses, warmRuns } = workerData as { withResponses: boolean; warmRuns: number };
port.postMessage(responseRunInThisThread(withResponses, warmRuns));
