// The engine threads (server/services/engine-pool.ts) started ahead of the first task, as the
// benches start them to time a cold computation apart from the threads' start. The real worker
// thread runs here (under tsx); the answer is checked against the same task run on this thread.
import { afterAll, describe, expect, it } from 'vitest';
import { generateSyntheticSea } from '../../server/forecast/synthetic-sea';
import { closeEnginePool, runEngineTask, startEnginePool } from '../../server/services/engine-pool';

afterAll(() => closeEnginePool());

describe('startEnginePool', () => {
  it('resolves once the engine thread has loaded; a second call finds it running; tasks then run on it', async () => {
    await startEnginePool();
    const t0 = performance.now();
    await startEnginePool(); // already loaded: nothing to wait for
    expect(performance.now() - t0).toBeLessThan(1000);
    const request = { startMs: Date.UTC(2026, 0, 1), hours: 48, seed: 4242 };
    const viaThread = await runEngineTask('syntheticSea', generateSyntheticSea, request);
    const here = generateSyntheticSea(request);
    expect(here.hsM.length).toBeGreaterThan(40);
    expect(Array.from(viaThread.hsM)).toEqual(Array.from(here.hsM));
  }, 60_000);
});
