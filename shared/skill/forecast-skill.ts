/**
 * Forecast skill from the project's own archive (docs/domain.md#forecast-uncertainty): every stored
 * forecast issue is paired with what was later observed at the same times, and the log error
 * e = ln(Hs_obs / Hs_fc) is summarised per lead-time bin and forecast-Hs bin.
 *
 * Pairing (our choice, documented in docs/domain.md#forecast-skill-pairing): a forecast record at
 * valid time t is paired with the observation at t. When no observation falls exactly on t, the
 * observed Hs is interpolated linearly between the two observations around t, but only when they are
 * at most 1.5 times the observation's step apart (the gap rule of docs/domain.md#convention-9); a
 * missing (NaN) observation on either side gives no pair. Forecast records before the first or
 * after the last observation give no pair.
 *
 * Pure: no database, no clock.
 */

/** Lead-time bins, h, half-open [from, to) (docs/domain.md#forecast-uncertainty). */
export const SKILL_LEAD_BINS_H: readonly (readonly [number, number])[] = [
  [0, 12],
  [12, 24],
  [24, 48],
  [48, 72],
  [72, 96],
];

/** Forecast-Hs bins, m, half-open [from, to); below 0.5 m is left out (docs/domain.md#forecast-uncertainty). */
export const SKILL_HS_BINS_M: readonly (readonly [number, number])[] = [
  [0.5, 1.5],
  [1.5, 3],
  [3, 5],
  [5, Infinity],
];

/** Fewer distinct issues than this in a bin: the figures are shown with a warning (docs/domain.md#forecast-uncertainty). */
export const FEW_ISSUES = 30;

/** Most points the skill answer returns for the scatter plot (evenly sampled from all pairs). */
export const SKILL_POINTS_CAP = 2000;

/** One stored forecast issue: its issue time and its Hs records. */
export interface SkillIssue {
  issuedAtMs: number;
  /** valid times, UTC ms, ascending */
  timeMs: ArrayLike<number>;
  /** forecast Hs, m; NaN = missing */
  hs: ArrayLike<number>;
}

/** The observation series: times (UTC ms, strictly ascending) and Hs (m, NaN = missing). */
export interface SkillObservation {
  timeMs: ArrayLike<number>;
  hs: ArrayLike<number>;
}

/** One forecast-observation pair. */
export interface SkillPair {
  /** index of the issue in the input list */
  issue: number;
  /** lead time = valid time - issue time, h */
  leadH: number;
  /** forecast Hs, m */
  fc: number;
  /** observed Hs, m */
  obs: number;
}

/** Figures of one (lead, Hs) bin; mean and sd are of ln(Hs_obs/Hs_fc), null without enough pairs. */
export interface SkillBin {
  fromH: number;
  toH: number;
  hsFrom: number;
  /** null for the open-ended last bin (to infinity) */
  hsTo: number | null;
  pairs: number;
  /** count of distinct forecast issues with at least one pair in the bin */
  issues: number;
  /** mean log error mu; null without pairs */
  mean: number | null;
  /** sample standard deviation (n - 1) of the log error sigma; null below 2 pairs */
  sd: number | null;
}

/** Index of the half-open bin [from, to) holding x, or -1. */
export function binIndex(bins: readonly (readonly [number, number])[], x: number): number {
  for (let i = 0; i < bins.length; i++) if (x >= bins[i][0] && x < bins[i][1]) return i;
  return -1;
}

/** Median spacing of ascending times (0 with fewer than two). */
function medianSpacing(timeMs: ArrayLike<number>): number {
  const n = timeMs.length;
  if (n < 2) return 0;
  const d = new Float64Array(n - 1);
  for (let i = 1; i < n; i++) d[i - 1] = timeMs[i] - timeMs[i - 1];
  d.sort();
  const m = d.length;
  return m % 2 === 1 ? d[(m - 1) / 2] : (d[m / 2 - 1] + d[m / 2]) / 2;
}

/**
 * Observed Hs at time t (see the module comment): exact match, else linear interpolation between
 * neighbours at most `maxGapMs` apart; NaN when none.
 */
export function observedAt(obs: SkillObservation, t: number, maxGapMs: number): number {
  const times = obs.timeMs;
  let lo = 0;
  let hi = times.length - 1;
  if (hi < 0 || t < times[0] || t > times[hi]) return NaN;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (times[mid] === t) return obs.hs[mid];
    if (times[mid] < t) lo = mid + 1;
    else hi = mid - 1;
  }
  // times[hi] < t < times[lo]
  const t0 = times[hi];
  const t1 = times[lo];
  if (t1 - t0 > maxGapMs) return NaN;
  const f = (t - t0) / (t1 - t0);
  return obs.hs[hi] * (1 - f) + obs.hs[lo] * f;
}

/**
 * Pairs every forecast record with the observation at its valid time. Leads below 0 or from 96 h
 * on, forecast Hs below 0.5 m, and missing or non-positive values give no pair.
 */
export function pairForecasts(issues: readonly SkillIssue[], obs: SkillObservation): SkillPair[] {
  const maxGapMs = 1.5 * medianSpacing(obs.timeMs);
  const maxLeadH = SKILL_LEAD_BINS_H[SKILL_LEAD_BINS_H.length - 1][1];
  const minHs = SKILL_HS_BINS_M[0][0];
  const pairs: SkillPair[] = [];
  issues.forEach((issue, k) => {
    for (let i = 0; i < issue.timeMs.length; i++) {
      const leadH = (issue.timeMs[i] - issue.issuedAtMs) / 3_600_000;
      const fc = issue.hs[i];
      if (!(leadH >= 0 && leadH < maxLeadH) || !(fc >= minHs)) continue;
      const o = observedAt(obs, issue.timeMs[i], maxGapMs);
      if (!(o > 0)) continue;
      pairs.push({ issue: k, leadH, fc, obs: o });
    }
  });
  return pairs;
}

/** Mean, sample sd and counts of the log errors of some pairs (Welford's running sums). */
export function logErrorStats(pairs: readonly SkillPair[]): Pick<SkillBin, 'pairs' | 'issues' | 'mean' | 'sd'> {
  let n = 0;
  let mean = 0;
  let m2 = 0;
  const issues = new Set<number>();
  for (const p of pairs) {
    const e = Math.log(p.obs / p.fc);
    n++;
    const d = e - mean;
    mean += d / n;
    m2 += d * (e - mean);
    issues.add(p.issue);
  }
  return { pairs: n, issues: issues.size, mean: n > 0 ? mean : null, sd: n > 1 ? Math.sqrt(m2 / (n - 1)) : null };
}

/** Figures per (lead, Hs) bin, lead-major: bin (i, j) is at i * 4 + j. */
export function skillBins(pairs: readonly SkillPair[]): SkillBin[] {
  const groups: SkillPair[][] = SKILL_LEAD_BINS_H.flatMap(() => SKILL_HS_BINS_M.map(() => []));
  for (const p of pairs) {
    const i = binIndex(SKILL_LEAD_BINS_H, p.leadH);
    const j = binIndex(SKILL_HS_BINS_M, p.fc);
    if (i >= 0 && j >= 0) groups[i * SKILL_HS_BINS_M.length + j].push(p);
  }
  return groups.map((g, k) => {
    const [fromH, toH] = SKILL_LEAD_BINS_H[Math.floor(k / SKILL_HS_BINS_M.length)];
    const [hsFrom, hsTo] = SKILL_HS_BINS_M[k % SKILL_HS_BINS_M.length];
    return { fromH, toH, hsFrom, hsTo: Number.isFinite(hsTo) ? hsTo : null, ...logErrorStats(g) };
  });
}

/** Figures per lead bin over every Hs bin (the bias-by-lead-time chart). */
export function skillByLead(pairs: readonly SkillPair[]): Omit<SkillBin, 'hsFrom' | 'hsTo'>[] {
  return SKILL_LEAD_BINS_H.map(([fromH, toH]) => ({
    fromH,
    toH,
    ...logErrorStats(pairs.filter((p) => p.leadH >= fromH && p.leadH < toH && p.fc >= SKILL_HS_BINS_M[0][0])),
  }));
}

/** At most `cap` pairs, evenly spread over the list (index floor(k * n / cap)); all when fewer. */
export function samplePairs<T>(pairs: readonly T[], cap: number = SKILL_POINTS_CAP): T[] {
  if (pairs.length <= cap) return [...pairs];
  const out: T[] = [];
  for (let k = 0; k < cap; k++) out.push(pairs[Math.floor((k * pairs.length) / cap)]);
  return out;
}
