// The engine thread runs below the API thread's CPU priority (server/services/engine-priority.ts).
// Checked on the real thing: an engine worker thread is started and the kernel's per-thread nice
// values are read from /proc (proc(5): field 19 of /proc/[pid]/task/[tid]/stat is the nice value).
import fs from 'node:fs';
import os from 'node:os';
import { describe, expect, it } from 'vitest';
import { tsWorker } from '../../scripts/lib/ts-worker';
import { loadEnv } from '../../server/env';
import { DEFAULT_ENGINE_NICE, engineNice } from '../../server/services/engine-priority';

/** Nice value of each thread of this process, by thread id. */
function threadNices(): Map<number, number> {
  const out = new Map<number, number>();
  for (const tid of fs.readdirSync('/proc/self/task')) {
    const stat = fs.readFileSync(`/proc/self/task/${tid}/stat`, 'utf8');
    // Fields after "(comm)": state is field 3, so nice (field 19) is index 16 of the rest.
    const rest = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    out.set(Number(tid), Number(rest[16]));
  }
  return out;
}

describe('engine thread priority', () => {
  it('reads ENGINE_NICE as a whole number from 0 to 19 and names it when wrong', () => {
    expect(engineNice(undefined)).toBe(DEFAULT_ENGINE_NICE);
    expect(engineNice('')).toBe(DEFAULT_ENGINE_NICE);
    expect(engineNice('0')).toBe(0);
    expect(engineNice('19')).toBe(19);
    for (const bad of ['-1', '20', '2.5', 'low'])
      expect(() => engineNice(bad)).toThrow(`ENGINE_NICE must be a whole number from 0 to 19, got ${bad}`);
  });

  it('the server reads ENGINE_NICE by the same rule at start (an empty value is the default there too)', () => {
    expect(loadEnv({ ENGINE_NICE: '' }).ENGINE_NICE).toBe(DEFAULT_ENGINE_NICE);
    expect(loadEnv({}).ENGINE_NICE).toBe(DEFAULT_ENGINE_NICE);
    expect(loadEnv({ ENGINE_NICE: '3' }).ENGINE_NICE).toBe(3);
    expect(() => loadEnv({ ENGINE_NICE: '20' })).toThrow(/ENGINE_NICE/);
  });

  it.runIf(process.platform === 'linux')('lowers the engine worker thread only, not the thread that started it', async () => {
    const own = os.getPriority();
    const before = threadNices();
    const worker = tsWorker(new URL('../../server/services/engine-worker.ts', import.meta.url), {
      env: { ...process.env, ENGINE_NICE: '7' },
    });
    try {
      // The worker says it is ready once its module has run (and lowered itself).
      await new Promise<void>((resolve, reject) => {
        worker.on('message', (m: { ready?: true }) => m.ready && resolve());
        worker.on('error', reject);
      });
      const after = threadNices();
      const lowered = [...after].filter(([tid, nice]) => !before.has(tid) && nice === 7);
      expect(lowered).toHaveLength(1);
      expect(after.get(process.pid)).toBe(before.get(process.pid));
      expect(os.getPriority()).toBe(own);
      // Every thread that was there before keeps its priority.
      for (const [tid, nice] of before) if (after.has(tid)) expect(after.get(tid)).toBe(nice);
    } finally {
      await worker.terminate();
    }
  });
});
