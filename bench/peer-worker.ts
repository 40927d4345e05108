// Worker thread of bench/peer-engine.ts: runs its share of transform, status and statistics (see RunShare).
import { parentPort } from 'node:worker_threads';
import { runHindcastAllSites, type HindcastInput, type RunShare } from './peer-engine';

if (!parentPort) throw new Error('peer-worker.ts runs as a worker thread');
const port = parentPort;
port.on('message', (m: { input: HindcastInput; share: RunShare }) => {
  port.postMessage(runHindcastAllSites(m.input, m.share));
});
port.postMessage('ready');
