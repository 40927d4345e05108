// Worker thread of bench/peer-engine.ts: runs transform, status and statistics for the (worksite, operation) pairs it is given.
import { parentPort } from 'node:worker_threads';
import { runHindcastAllSites, type HindcastInput } from './peer-engine';

if (!parentPort) throw new Error('peer-worker.ts runs as a worker thread');
const port = parentPort;
port.on('message', (m: { input: HindcastInput; pairs: number[] }) => {
  port.postMessage(runHindcastAllSites(m.input, m.pairs));
});
port.postMessage('ready');
