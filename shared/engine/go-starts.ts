import { STATUS } from './types';
import { recordsForTr } from './workable-runs';

/**
 * Go-start flags: 1 where [t0, t0 + TR) is wholly workable, that is ceil(TR / dt) consecutive
 * workable records start at t0, all present, each at most 1.5 * dt after the one before
 * (docs/domain.md#weather-windows, #convention-9 to #convention-10). There is none in the last TR - dt of a series.
 *
 * @param timeMs record times, UTC epoch ms, ascending
 * @param status STATUS code per record
 * @param stepMs dt, ms
 * @param trH reference period TR = TPOP + TC, h
 * @param out optional buffer of the series' length
 * @returns Uint8Array, 1 at a go-start, 0 elsewhere
 * @throws RangeError for a non-positive TR or dt or arrays of unequal length.
 */
export function goStarts(timeMs: Float64Array, status: Uint8Array, stepMs: number, trH: number, out?: Uint8Array): Uint8Array {
  const need = recordsForTr(trH, stepMs);
  const n = timeMs.length;
  const flags = out ?? new Uint8Array(n);
  if (flags.length !== n) throw new RangeError('goStarts: out buffer must have the series length');
  if (status.length !== n) throw new RangeError('status and times must have the same length');
  // Same backward pass as runRemaining, without keeping the run lengths.
  const maxGap = 1.5 * stepMs;
  let run = 0;
  for (let i = n - 1; i >= 0; i--) {
    if (status[i] !== STATUS.WORKABLE) run = 0;
    else if (i === n - 1 || timeMs[i + 1] - timeMs[i] > maxGap) run = 1;
    else run++;
    flags[i] = run >= need ? 1 : 0;
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
