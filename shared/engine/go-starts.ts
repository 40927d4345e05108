import { STATUS } from './types';
import { recordSteps } from './record-steps';
import { assertStep, trThresholdMs } from './workable-runs';

/**
 * Go-start flags: 1 where [t0, t0 + TR) is wholly workable: the consecutive workable records from
 * t0 (none separated by a gap) cover at least TR in time, their durations summed (docs/domain.md,
 * "Weather windows"; docs/domain.md#convention-9 to #convention-10; local steps in record-steps.ts). With one step dt this is
 * ceil(TR / dt) records, and there is none in the last (ceil(TR / dt) - 1) * dt of a series.
 *
 * @param timeMs record times, UTC epoch ms, ascending
 * @param status STATUS code per record
 * @param stepMs fallback dt, ms (a series without any stretch of equal spacings)
 * @param trH reference period TR = TPOP + TC, h
 * @param out optional buffer of the series' length
 * @returns Uint8Array, 1 at a go-start, 0 elsewhere
 * @throws RangeError for a non-positive TR or dt or arrays of unequal length.
 */
export function goStarts(timeMs: Float64Array, status: Uint8Array, stepMs: number, trH: number, out?: Uint8Array): Uint8Array {
  assertStep(stepMs);
  const trMs = trThresholdMs(trH);
  const n = timeMs.length;
  const flags = out ?? new Uint8Array(n);
  if (flags.length !== n) throw new RangeError('goStarts: out buffer must have the series length');
  if (status.length !== n) throw new RangeError('status and times must have the same length');
  const { durationMs, continues } = recordSteps(timeMs, stepMs);
  // Backward pass: covered time of the workable run from each record on.
  let runMs = 0;
  for (let i = n - 1; i >= 0; i--) {
    if (status[i] !== STATUS.WORKABLE) runMs = 0;
    else if (continues[i] === 0) runMs = durationMs[i];
    else runMs += durationMs[i];
    flags[i] = runMs >= trMs ? 1 : 0;
  }
  return flags;
}

/**
 * Index of the next go-start at or after each record (one backward pass), -1 when there is none
 * before the series ends. Used for waiting on weather and campaign simulation.
 *
 * @param goStart go-start flags
 * @param out optional buffer of the same length
 */
export function nextGoStartIndex(goStart: Uint8Array, out?: Int32Array): Int32Array {
  const n = goStart.length;
  const next = out ?? new Int32Array(n);
  if (next.length !== n) throw new RangeError('nextGoStartIndex: out buffer must have the flags length');
  let j = -1;
  for (let i = n - 1; i >= 0; i--) {
    if (goStart[i] !== 0) j = i;
    next[i] = j;
  }
  return next;
}
