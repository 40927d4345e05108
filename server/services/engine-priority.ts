// The engine threads' CPU priority. A cold 30-year computation keeps a core busy for seconds; on a
// machine with few cores the API thread then waits for its turn, and every short request with it.
// Engine threads run at a lower priority (a higher nice value), so the API thread's requests go
// first and the computation takes the time that is left; alone on the machine it runs as fast.
// Linux keeps the nice value per thread (setpriority(2), NOTES: "a per-thread attribute"), so
// os.setPriority on the calling thread lowers that thread only. Elsewhere it would lower the whole
// process, so it is left alone there.
import os from 'node:os';
import { z } from 'zod';

/** Nice value of engine threads when ENGINE_NICE is unset (0 = the API thread's priority, 19 = lowest). */
export const DEFAULT_ENGINE_NICE = 10;

/**
 * The one rule for ENGINE_NICE, read by server/env.ts at start and by each engine thread: a whole
 * number 0-19; unset or empty, the default.
 */
export const engineNiceSchema = z.preprocess(
  (v) => (v === '' ? undefined : v),
  z.coerce.number().int().min(0).max(19).default(DEFAULT_ENGINE_NICE),
);

/** ENGINE_NICE as a whole number 0-19, or the default; anything else is an error that names it. */
export function engineNice(raw: string | undefined): number {
  const parsed = engineNiceSchema.safeParse(raw);
  if (!parsed.success) throw new Error(`ENGINE_NICE must be a whole number from 0 to 19, got ${raw}`);
  return parsed.data;
}

/** Lowers the calling thread to `nice` on Linux; returns whether it did (0, or another system: no change). */
export function lowerThisThread(nice: number): boolean {
  if (process.platform !== 'linux' || nice === 0) return false;
  try {
    os.setPriority(nice);
    return true;
  } catch {
    // Not allowed here (a sandbox): the thread keeps the priority it has.
    return false;
  }
}
