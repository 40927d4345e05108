import { recordSteps } from './record-steps';
import { STATUS } from './types';

/** A maximal run of consecutive workable records. */
export interface WorkableRun {
  /** Index of the first record. */
  startIndex: number;
  /** Number of records. */
  count: number;
  /** Start, UTC epoch ms. */
  startMs: number;
  /** Exclusive end, UTC epoch ms: start + the sum of the records' durations (count * dt with one step, docs/domain.md#convention-10). */
  endMs: number;
  /** Length: the sum of the records' durations, h. */
  hours: number;
}

/** Milliseconds per hour. */
export const MS_PER_HOUR = 3_600_000;

/**
 * Records needed for a go-start in a series of one step: ceil(TR / dt), at least 1 (docs/domain.md#convention-10).
 * The engine itself measures TR in time (sums of record durations, see record-steps.ts), which
 * gives the same go-starts for one step. A relative tolerance of
 * 1e-9 keeps a TR that is a whole number of steps from rounding up by floating-point noise.
 *
 * @param trH reference period TR, h (> 0)
 * @param stepMs time step dt, ms (> 0)
 * @throws RangeError for a non-positive or non-finite TR or dt.
 */
export function recordsForTr(trH: number, stepMs: number): number {
  if (!(trH > 0 && Number.isFinite(trH))) throw new RangeError(`TR ${trH} h must be finite and positive`);
  assertStep(stepMs);
  return Math.max(1, Math.ceil((trH * MS_PER_HOUR) / stepMs - 1e-9));
}

/** @throws RangeError unless dt is finite and positive. */
export function assertStep(stepMs: number): void {
  if (!(stepMs > 0 && Number.isFinite(stepMs))) throw new RangeError(`time step ${stepMs} ms must be finite and positive`);
}

/**
 * TR in ms with a relative tolerance of 1e-9 below it, so a TR that is a whole number of steps is
 * met by records whose durations add up to it despite floating-point noise in trH * 3.6e6.
 */
export function trThresholdMs(trH: number): number {
  if (!(trH > 0 && Number.isFinite(trH))) throw new RangeError(`TR ${trH} h must be finite and positive`);
  return trH * MS_PER_HOUR * (1 - 1e-9);
}

/**
 * Remaining run length: for each record, the number of consecutive workable records starting at
 * it (0 when it is not workable). A record continues the one before it unless the spacing between
 * them is a gap (local step rule, see record-steps.ts; with one step: more than 1.5 * dt apart,
 * docs/domain.md#convention-9). One backward pass.
 *
 * @param stepMs fallback dt, ms, for a series without any stretch of equal spacings
 * @param out optional buffer of the series' length to write into
 * @returns Int32Array of run lengths, records
 */
export function runRemaining(timeMs: Float64Array, status: Uint8Array, stepMs: number, out?: Int32Array): Int32Array {
  assertStep(stepMs);
  const n = timeMs.length;
  if (status.length !== n) throw new RangeError('status and times must have the same length');
  const rem = out ?? new Int32Array(n);
  if (rem.length !== n) throw new RangeError('runRemaining: out buffer must have the series length');
  const cont = recordSteps(timeMs, stepMs).continues;
  let next = 0;
  for (let i = n - 1; i >= 0; i--) {
    if (status[i] !== STATUS.WORKABLE) next = 0;
    else if (cont[i] === 0) next = 1;
    else next = next + 1;
    rem[i] = next;
  }
  return rem;
}

/**
 * Maximal runs of consecutive workable records (docs/domain.md#weather-windows; docs/domain.md#convention-9 to #convention-10).
 * Only STATUS.WORKABLE counts: marginal, not workable and no data end a run, and so does a gap
 * (local step rule, record-steps.ts). A run continues across a change of step; its length is the
 * sum of its records' durations and its end start + that length (exclusive).
 *
 * @param timeMs record times, UTC epoch ms, ascending
 * @param status STATUS code per record
 * @param stepMs fallback dt, ms (a series without any stretch of equal spacings)
 */
export function workableRuns(timeMs: Float64Array, status: Uint8Array, stepMs: number): WorkableRun[] {
  const rem = runRemaining(timeMs, status, stepMs);
  const dur = recordSteps(timeMs, stepMs).durationMs;
  const runs: WorkableRun[] = [];
  for (let i = 0; i < rem.length;) {
    const count = rem[i];
    if (count === 0) {
      i++;
      continue;
    }
    const startMs = timeMs[i];
    const lengthMs = sumDurations(dur, i, i + count);
    runs.push({ startIndex: i, count, startMs, endMs: startMs + lengthMs, hours: lengthMs / MS_PER_HOUR });
    i += count;
  }
  return runs;
}

/** Sum of dur[from, to), ms. */
export function sumDurations(dur: Float64Array, from: number, to: number): number {
  let sum = 0;
  for (let k = from; k < to; k++) sum += dur[k];
  return sum;
}
