/**
 * Time step dt of a series: the median spacing of its records (docs/domain.md#convention-9).
 *
 * Most series are regular, so a majority vote (Boyer-Moore) over the spacings finds the median in
 * one pass when more than half of the spacings are equal (then that value is both middle order
 * statistics); otherwise the spacings are sorted. The median of an even count is the mean of the
 * two middle spacings.
 *
 * @param timeMs record times, UTC epoch ms, strictly ascending
 * @returns dt, ms (> 0)
 * @throws RangeError for fewer than two records or times that are not finite and strictly ascending.
 * @example detectStepMs(Float64Array.of(0, 3.6e6, 7.2e6, 1.8e7)) // 3.6e6 (1 h despite the gap)
 */
export function detectStepMs(timeMs: Float64Array): number {
  const n = timeMs.length;
  if (n < 2) throw new RangeError('detectStepMs: needs at least two records');
  const bad = firstBadSpacing(timeMs);
  if (bad > 0) throw new RangeError(`detectStepMs: times must be finite and strictly ascending (index ${bad})`);
  const candidate = majorityCandidate(timeMs);
  const m = n - 1;
  if (2 * countSpacing(timeMs, candidate) > m) return candidate;
  const diffs = new Float64Array(m);
  for (let i = 1; i < n; i++) diffs[i - 1] = timeMs[i] - timeMs[i - 1];
  diffs.sort();
  return m % 2 === 1 ? diffs[(m - 1) / 2] : (diffs[m / 2 - 1] + diffs[m / 2]) / 2;
}

// Small single-loop helpers: each is optimized on its own.

/** Index of the first spacing that is not finite and positive, or 0 when all are. */
function firstBadSpacing(timeMs: Float64Array): number {
  for (let i = 1; i < timeMs.length; i++) {
    const d = timeMs[i] - timeMs[i - 1];
    if (!(d > 0 && d < Infinity)) return i;
  }
  return 0;
}

/** Boyer-Moore majority vote over the spacings: the only value that can hold a majority. */
function majorityCandidate(timeMs: Float64Array): number {
  let candidate = NaN;
  let votes = 0;
  for (let i = 1; i < timeMs.length; i++) {
    const d = timeMs[i] - timeMs[i - 1];
    if (votes === 0) {
      candidate = d;
      votes = 1;
    } else if (d === candidate) votes++;
    else votes--;
  }
  return candidate;
}

function countSpacing(timeMs: Float64Array, d: number): number {
  let count = 0;
  for (let i = 1; i < timeMs.length; i++) if (timeMs[i] - timeMs[i - 1] === d) count++;
  return count;
}
