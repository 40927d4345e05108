/**
 * The project-calibrated alpha table (docs/domain.md#calibrated-alpha): per (TPOP row, Hs column),
 * the alpha such that P(Hs_obs > OPLIM | Hs_fc = alpha * OPLIM) <= p under a log-normal error
 * model fitted to the project's own forecast archive:
 *
 *   alpha = min(1, exp(-(mu + z * sigma))),  z = the (1 - p) quantile of the standard normal,
 *
 * with mu and sigma the mean and standard deviation of ln(Hs_obs/Hs_fc) in one skill bin.
 *
 * Which bin a cell uses (our rule, docs/domain.md#calibrated-alpha):
 * - lead: the largest lead a go decision needs, time to the start plus TR. The decision to start is
 *   taken on the latest issue at the start (time to the start taken as 0), so the lead is TR, at
 *   least TPOP + TC. A row stands for every TPOP up to its bound: its lead is the larger of the
 *   row's TPOP bound and the largest TR of the project's weather-restricted operations in that row.
 *   The bin is the half-open one holding that lead (a 12-h lead takes [12, 24) h: the safe side),
 *   the last bin [72, 96) h for a lead of 96 h;
 * - Hs: the bin holding the column's Hs limit (1 m in [0.5, 1.5), 6 m in [5, inf)).
 * A cell whose bin has fewer than two pairs (no standard deviation) keeps the default table's
 * value, flagged. Values are rounded down to 0.001 (the stricter side).
 *
 * Pure: no database, no clock.
 */
import { alphaRowIndex, isWeatherRestricted } from '../engine/alpha-factor';
import type { AlphaTable } from '../engine/types';
import { binIndex, FEW_ISSUES, SKILL_HS_BINS_M, SKILL_LEAD_BINS_H, type SkillBin } from './forecast-skill';
import { standardNormalQuantile } from './normal-quantile';

/**
 * alpha = min(1, exp(-(mu + z * sigma))) with z the (1 - p) standard normal quantile.
 * @param mu mean of ln(Hs_obs/Hs_fc); @param sigma its standard deviation (>= 0); @param p chance, (0, 1)
 * @example calibratedAlphaValue(0, 0.1, 1e-4) // exp(-0.3719) = 0.6894
 */
export function calibratedAlphaValue(mu: number, sigma: number, p: number): number {
  if (!Number.isFinite(mu) || !(sigma >= 0 && sigma < Infinity))
    throw new RangeError(`mu ${mu} and sigma ${sigma} must be finite, sigma >= 0`);
  const z = standardNormalQuantile(1 - p);
  return Math.min(1, Math.exp(-(mu + z * sigma)));
}

/** An operation as far as the lead rule needs it. */
export interface LeadRuleOperation {
  tpopH: number;
  tcH: number;
  weatherRestricted: boolean;
}

/**
 * Lead a go decision needs for each row of the table, h (see the module comment): the larger of
 * the row's TPOP bound and the largest TR = TPOP + TC of the weather-restricted operations in it.
 */
export function leadNeededPerRow(table: AlphaTable, operations: readonly LeadRuleOperation[]): number[] {
  const leads = [...table.tpopBoundsH];
  for (const op of operations) {
    if (!isWeatherRestricted(op)) continue;
    const row = alphaRowIndex(table, op.tpopH, op.tpopH + op.tcH, true);
    if (row >= 0) leads[row] = Math.max(leads[row], op.tpopH + op.tcH);
  }
  return leads;
}

/** One cell of the calibrated table with the data behind it. */
export interface CalibratedCell {
  /** the calibrated alpha, or the default's when `fallback` */
  alpha: number;
  defaultAlpha: number;
  /** true when the bin had too few pairs and the default value is kept */
  fallback: boolean;
  leadNeededH: number;
  /** the skill bin used */
  fromH: number;
  toH: number;
  hsFrom: number;
  hsTo: number | null;
  mean: number | null;
  sd: number | null;
  pairs: number;
  issues: number;
  /** fewer than {@link FEW_ISSUES} distinct issues in the bin */
  fewIssues: boolean;
}

export interface CalibratedTable {
  p: number;
  /** the (1 - p) standard normal quantile */
  z: number;
  table: AlphaTable;
  /** cells[row][column] */
  cells: CalibratedCell[][];
}

/**
 * The calibrated table on the shape of `base` (the default table): rows by TPOP, columns by Hs.
 * @param bins the 20 skill bins of {@link skillBins} (lead-major)
 * @throws RangeError for p outside (0, 1) or bins of another length
 */
export function calibrateAlphaTable(
  base: AlphaTable,
  bins: readonly SkillBin[],
  p: number,
  operations: readonly LeadRuleOperation[],
): CalibratedTable {
  const nHs = SKILL_HS_BINS_M.length;
  if (bins.length !== SKILL_LEAD_BINS_H.length * nHs)
    throw new RangeError(`expected ${SKILL_LEAD_BINS_H.length * nHs} skill bins, got ${bins.length}`);
  const z = standardNormalQuantile(1 - p);
  const leads = leadNeededPerRow(base, operations);
  const cells = base.tpopBoundsH.map((_, r) => {
    let leadBin = binIndex(SKILL_LEAD_BINS_H, leads[r]);
    if (leadBin < 0) leadBin = SKILL_LEAD_BINS_H.length - 1;
    return base.hsColumnsM.map((hsLimit, c): CalibratedCell => {
      let hsBin = binIndex(SKILL_HS_BINS_M, hsLimit);
      if (hsBin < 0) hsBin = 0; // a column below 0.5 m takes the smallest Hs bin
      const bin = bins[leadBin * nHs + hsBin];
      const defaultAlpha = base.values[r][c];
      const { mean, sd } = bin;
      const fallback = mean === null || sd === null;
      const alpha =
        mean === null || sd === null ? defaultAlpha : Math.max(0.001, Math.floor(calibratedAlphaValue(mean, sd, p) * 1000) / 1000);
      return {
        alpha,
        defaultAlpha,
        fallback,
        leadNeededH: leads[r],
        fromH: bin.fromH,
        toH: bin.toH,
        hsFrom: bin.hsFrom,
        hsTo: bin.hsTo,
        mean: bin.mean,
        sd: bin.sd,
        pairs: bin.pairs,
        issues: bin.issues,
        fewIssues: bin.issues < FEW_ISSUES,
      };
    });
  });
  return {
    p,
    z,
    table: {
      tpopBoundsH: [...base.tpopBoundsH],
      hsColumnsM: [...base.hsColumnsM],
      values: cells.map((row) => row.map((cell) => cell.alpha)),
    },
    cells,
  };
}
