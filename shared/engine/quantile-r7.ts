/**
 * Sample quantile by linear interpolation between order statistics: Hyndman, R. J. and Fan, Y.
 * (1996), "Sample quantiles in statistical packages", The American Statistician 50(4):361-365,
 * definition 7 (the default of R and numpy):
 *   h = (n - 1) * p, Q(p) = x[floor(h)] + (h - floor(h)) * (x[floor(h) + 1] - x[floor(h)])
 * with x sorted ascending, 0-based.
 *
 * NaN values are ignored (they are missing or censored). The input is not changed: it is copied
 * and the order statistics are found by selection (Floyd-Rivest), O(n), not by a full sort.
 *
 * @param values sample, in any order
 * @param p probability in [0, 1]
 * @returns the quantile, in the sample's unit; NaN for an empty sample (after NaN removal)
 * @throws RangeError for p outside [0, 1].
 * @example quantileR7(Float64Array.of(4, 1, 3, 2), 0.9) // 3.7
 */
export function quantileR7(values: ArrayLike<number>, p: number): number {
  assertProbability(p);
  const copy = new Float64Array(values.length);
  let m = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v === v) copy[m++] = v;
  }
  return quantileR7InPlace(copy, 0, m, p);
}

/**
 * Type 7 quantile of an already sorted sample (ascending, no NaN). See {@link quantileR7}.
 * @throws RangeError for p outside [0, 1].
 */
export function quantileR7Sorted(sorted: ArrayLike<number>, p: number): number {
  assertProbability(p);
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const v0 = sorted[lo];
  return lo + 1 < n ? v0 + (h - lo) * (sorted[lo + 1] - v0) : v0;
}

/**
 * Type 7 quantile of the NaN-free slice a[from, to), reordering that slice in place (selection).
 * For the engine's hot loops; callers own the buffer.
 */
export function quantileR7InPlace(a: Float64Array, from: number, to: number, p: number): number {
  const n = to - from;
  if (n <= 0) return NaN;
  const h = (n - 1) * p;
  const k = from + Math.floor(h);
  select(a, k, from, to - 1);
  const v0 = a[k];
  const frac = h - Math.floor(h);
  if (frac === 0 || k + 1 >= to) return v0;
  // After selection every element right of k is >= a[k]; the next order statistic is their minimum.
  let v1 = Infinity;
  for (let i = k + 1; i < to; i++) if (a[i] < v1) v1 = a[i];
  return v0 + frac * (v1 - v0);
}

function assertProbability(p: number): void {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`probability ${p} outside [0, 1]`);
}

/**
 * Floyd-Rivest selection (Floyd, R. W. and Rivest, R. L. (1975), "Algorithm 489: SELECT",
 * Communications of the ACM 18(3):173): reorders a[left..right] so that a[k] is the value it would
 * have if sorted, with smaller-or-equal values left of it and greater-or-equal right.
 */
function select(a: Float64Array, k: number, left: number, right: number): void {
  while (right > left) {
    if (right - left > 600) {
      const n = right - left + 1;
      const m = k - left + 1;
      const z = Math.log(n);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (n - s)) / n) * (m - n / 2 < 0 ? -1 : 1);
      const newLeft = Math.max(left, Math.floor(k - (m * s) / n + sd));
      const newRight = Math.min(right, Math.floor(k + ((n - m) * s) / n + sd));
      select(a, k, newLeft, newRight);
    }
    const t = a[k];
    let i = left;
    let j = right;
    swap(a, left, k);
    if (a[right] > t) swap(a, left, right);
    while (i < j) {
      swap(a, i, j);
      i++;
      j--;
      while (a[i] < t) i++;
      while (a[j] > t) j--;
    }
    if (a[left] === t) swap(a, left, j);
    else {
      j++;
      swap(a, j, right);
    }
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
  }
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/**
 * Type 7 quantile of the NaN-free slice a[from, to) for an upper probability (p >= 0.5), leaving
 * the slice unchanged: a strided sample of 64 values (256 from 4,096 values on) sets a threshold safely below the wanted
 * order statistic; one pass counts the values below it and copies the others into `tmp`; the
 * order statistic is then selected among the copies (about (1 - p) n of them). When the sample
 * misjudged (the rank falls below the threshold), the copy is redone with every value, so the
 * result is exact whatever the data. For the engine's hot loops.
 *
 * @param tmp scratch of at least to - from values
 */
export function quantileR7Upper(a: Float64Array, from: number, to: number, p: number, tmp: Float64Array): number {
  const n = to - from;
  if (n <= 0) return NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const frac = h - lo;
  let threshold = -Infinity;
  if (n >= 256) {
    // 64 values, or 256 for long slices (a threshold closer to the wanted rank: fewer copies).
    const m = n >= 4096 ? 256 : 64;
    const sample = SAMPLE;
    for (let j = 0; j < m; j++) sample[j] = a[from + Math.floor(((j + 0.5) * n) / m)];
    // Rank of the wanted statistic in the sample, less a margin of about four binomial standard
    // deviations (sqrt(64 * 0.9 * 0.1) = 2.4; sqrt(256 * 0.9 * 0.1) = 4.8).
    const r = Math.floor(p * m) - (m === 256 ? 20 : 10);
    if (r > 0) {
      select(sample, r, 0, m - 1);
      threshold = sample[r];
    }
  }
  let below = 0;
  let cnt = 0;
  for (let i = from; i < to; i++) {
    const v = a[i];
    if (v < threshold) below++;
    else tmp[cnt++] = v;
  }
  if (below > lo) {
    // The sample misjudged: take every value.
    tmp.set(a.subarray(from, to));
    below = 0;
    cnt = n;
  }
  const k = lo - below;
  select(tmp, k, 0, cnt - 1);
  const v0 = tmp[k];
  if (frac === 0 || k + 1 >= cnt) return v0;
  let v1 = Infinity;
  for (let i = k + 1; i < cnt; i++) if (tmp[i] < v1) v1 = tmp[i];
  return v0 + frac * (v1 - v0);
}

const SAMPLE = new Float64Array(256);
