/**
 * The local time step of every record (docs/domain.md#weather-windows, docs/domain.md#convention-9 to #convention-10).
 *
 * Forecasts often change step part-way (hourly for the first days, then 3-hourly) and hindcasts may
 * be 3-hourly early and hourly later. The engine therefore never assumes one step for a whole
 * series:
 * - A stretch is a run of at least 3 consecutive equal spacings; its step is that spacing. A change
 *   of step is such a new spacing that then repeats.
 * - A spacing that belongs to no stretch is a gap when it is longer than 1.5 times the step on both
 *   sides of it (the nearest stretch before and after; with a stretch on one side only, that side's
 *   step counts for both). A gap breaks every run, as no data does. A shorter one is jitter: the
 *   next record continues the run.
 * - Record i covers [t_i, t_i + dt_i): dt_i is the step of the spacing after it (its stretch's step,
 *   or for jitter the step before), so a run crossing a change of step is covered without a hole:
 *   the last hourly record before a 3-hourly stretch lasts 3 h. A record before a gap, and the last
 *   record, take the step before; a lone record after a gap at the end takes the step after it.
 * - Run and window lengths are sums of durations; TR is measured in time (a go-start needs
 *   [t0, t0 + TR) covered by consecutive workable records); hindcast shares weight each record by
 *   its duration. With one step everywhere this is exactly the plain rules: continues within
 *   1.5 * dt, each record dt long.
 * - A series with no stretch at all (fewer than 4 records, or no 3 equal spacings in a row) uses
 *   the fallback step (the caller's dt, by default the median spacing) for every record.
 *
 * The result is kept per time array (a WeakMap), so every operation at every worksite of one series
 * shares one computation; time arrays must not change after use. An evenly spaced series' result is
 * also kept by its shape (records, spacing), so another time array of that shape shares it. Results
 * are shared: callers read them and never write into them.
 */
import { detectStepMs } from './detect-step';

/** Per-record steps of a series. */
export interface RecordSteps {
  /** Duration dt_i of each record, ms (> 0). */
  durationMs: Float64Array;
  /** 1 where the next record continues this one (the spacing is not a gap); 0 at a gap and at the last record. */
  continues: Uint8Array;
  /** The fallback step used where the series has no stretch, ms. */
  fallbackStepMs: number;
}

const cache = new WeakMap<Float64Array, RecordSteps>();

/**
 * Steps of evenly spaced series by (records, spacing, fallback): they depend on nothing else, so a
 * new time array of the same shape (another worksite's copy, a new view) gets the same arrays
 * after one pass over its times, not fresh memory. A few shapes only (oldest dropped first).
 */
const evenCache = new Map<string, RecordSteps>();
const EVEN_CACHE_SIZE = 8;

/**
 * Local steps of a series (see the module comment).
 *
 * @param timeMs record times, UTC epoch ms, strictly ascending
 * @param fallbackStepMs step for a series without any stretch, ms; default the median spacing
 *   (docs/domain.md#convention-9), or 1 h for a single record
 * @throws RangeError for a non-positive fallback step.
 */
export function recordSteps(timeMs: Float64Array, fallbackStepMs?: number): RecordSteps {
  const n = timeMs.length;
  const fallback = fallbackStepMs ?? (n >= 2 ? detectStepMs(timeMs) : 3_600_000);
  if (!(fallback > 0 && Number.isFinite(fallback))) throw new RangeError(`time step ${fallback} ms must be finite and positive`);
  const hit = cache.get(timeMs);
  if (hit && hit.fallbackStepMs === fallback && hit.durationMs.length === n) return hit;
  const steps = computeSteps(timeMs, fallback);
  cache.set(timeMs, steps);
  return steps;
}

function computeSteps(timeMs: Float64Array, fallback: number): RecordSteps {
  const n = timeMs.length;
  // One spacing throughout (the usual hindcast or forecast grid): a single stretch, so every
  // record lasts that spacing and continues into the next; the general rules below give exactly
  // this, in three passes.
  if (n >= 4) {
    const s0 = timeMs[1] - timeMs[0];
    if (s0 > 0 && s0 < Infinity && evenlySpaced(timeMs, s0)) return evenSteps(n, s0, fallback);
  }
  const durationMs = new Float64Array(n);
  const continues = new Uint8Array(n);
  const result = { durationMs, continues, fallbackStepMs: fallback };
  if (n === 0) return result;
  if (n === 1) {
    durationMs[0] = fallback;
    return result;
  }
  const m = n - 1;
  // Spacing i is timeMs[i + 1] - timeMs[i]. The two output arrays serve as the work space (no
  // temporary arrays: fresh memory costs a page fault per 4 kB): `continues[i]` first marks the
  // spacings that belong to a stretch (at least 3 equal spacings in a row), and `durationMs[i]`
  // first holds the step after each spacing (the nearest stretch at or after it; NaN for none).
  markStretches(timeMs, continues);
  let after = NaN;
  for (let i = m - 1; i >= 0; i--) {
    if (continues[i] === 1) after = timeMs[i + 1] - timeMs[i];
    durationMs[i] = after;
  }
  // Forward: the step before each spacing (the nearest stretch at or before it), then the record's.
  let before = NaN;
  let lastAfter = NaN;
  for (let i = 0; i < m; i++) {
    const s = timeMs[i + 1] - timeMs[i];
    const inStretch = continues[i] === 1;
    if (inStretch) before = s;
    let b = before;
    let a = durationMs[i];
    if (b !== b) b = a === a ? a : fallback;
    if (a !== a) a = b;
    const gap = !inStretch && s > 1.5 * b && s > 1.5 * a;
    continues[i] = gap ? 0 : 1;
    // The record takes its stretch's step: that of the spacing after it, or the step before a gap.
    durationMs[i] = inStretch ? s : b;
    lastAfter = a;
  }
  // The last record: the step of the spacing before it, or after a gap the step after that gap.
  durationMs[m] = continues[m - 1] === 1 ? durationMs[m - 1] : lastAfter;
  return result;
}

/** The steps of an evenly spaced series of n records, `step` apart (see evenCache). */
function evenSteps(n: number, step: number, fallback: number): RecordSteps {
  const key = `${n}|${step}|${fallback}`;
  const hit = evenCache.get(key);
  if (hit) return hit;
  const durationMs = new Float64Array(n).fill(step);
  const continues = new Uint8Array(n).fill(1, 0, n - 1);
  const steps = { durationMs, continues, fallbackStepMs: fallback };
  if (evenCache.size >= EVEN_CACHE_SIZE) evenCache.delete(evenCache.keys().next().value as string);
  evenCache.set(key, steps);
  return steps;
}

/** True when every spacing of the series equals `step` (compared as markStretches compares them). */
function evenlySpaced(timeMs: Float64Array, step: number): boolean {
  for (let i = 1; i + 1 < timeMs.length; i++) if (timeMs[i + 1] - timeMs[i] !== step) return false;
  return true;
}

/** Sets `inStretch[i]` to 1 where spacing i belongs to a run of >= 3 equal spacings, else 0 (i < n - 1). */
function markStretches(timeMs: Float64Array, inStretch: Uint8Array): void {
  const m = timeMs.length - 1;
  let i = 0;
  while (i < m) {
    const s = timeMs[i + 1] - timeMs[i];
    let j = i + 1;
    while (j < m && timeMs[j + 1] - timeMs[j] === s) j++;
    const v = j - i >= 3 ? 1 : 0;
    for (let k = i; k < j; k++) inStretch[k] = v;
    i = j;
  }
}
