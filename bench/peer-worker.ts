// Worker thread of bench/peer-engine.ts: runs its share of transform, status and statistics (see
// RunShare), keeping the input and share it was last given (see EnginePool).
import { parentPort } from 'node:worker_threads';
import { runHindcastAllSites, type HindcastInput, type PoolMessage, type RunShare } from './peer-engine';

if (!parentPort) throw new Error('peer-worker.ts runs as a worker thread');
const port = parentPort;
let held: { input: HindcastInput; share: RunShare } | null = null;
port.on('message', (m: PoolMessage) => {
  if (m.input && m.share) held = { input: m.input, share: m.share };
  if (!held) throw new Error('peer-worker.ts: a run before any input');
  port.postMessage(runHindcastAllSites(held.input, held.share));
});
port.postMessage('ready');
