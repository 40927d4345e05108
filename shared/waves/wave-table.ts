/**
 * Wave tables: the dimensionless linear-theory functions of relative depth d/L0, as in the classic
 * handbook tables (Shore Protection Manual 1984, Appendix C, Table C-1; Coastal Engineering
 * Manual EM 1110-2-1100, Part II-1).
 */
import { TWO_PI } from './constants';
import { groupCelerityRatio } from './hyperbolic';
import { relativeDepthFromDeepWater } from './wave-number';

/** Largest d/L0 a row is computed for: k*d ~ 628 there, so sinh/cosh ~ 1e272 stay finite. */
export const WAVE_TABLE_MAX_D_OVER_L0 = 100;

/** Most rows `waveTable` returns (the API and page show at most this many). */
export const WAVE_TABLE_MAX_ROWS = 2000;

/** One row of a wave table; every column is dimensionless. */
export interface WaveTableRow {
  /** d/L0, relative depth to the deep-water wavelength L0 = g*T^2/(2*pi). */
  dOverL0: number;
  /** d/L, relative depth to the local wavelength. */
  dOverL: number;
  /** L/L0 = C/C0 = tanh(kd). */
  lOverL0: number;
  /** k*d = 2*pi*d/L. */
  kd: number;
  tanhKd: number;
  sinhKd: number;
  coshKd: number;
  /** n = Cg/C = (1 + 2kd/sinh(2kd))/2. */
  n: number;
  /** Cg/C0 = n*tanh(kd). */
  cgOverC0: number;
  /** Shoaling coefficient Ks = H/H0' = sqrt(Cg0/Cg) = 1/sqrt(2*n*tanh(kd)). */
  shoalingCoefficient: number;
  /** Pressure response factor at the bed, Kp(-d) = 1/cosh(kd). */
  bedPressureFactor: number;
}

/**
 * One wave-table row for a relative depth d/L0 (SPM 1984 Appendix C, Table C-1 columns; CEM
 * Part II-1). Solves k*d*tanh(k*d) = 2*pi*d/L0 (the dispersion relation made dimensionless) and
 * derives the rest. Independent of g and of the period.
 *
 * @param dOverL0 - relative depth d/L0, 0 < d/L0 <= 100 (above 100, sinh/cosh approach the
 *   double-precision limit; every column has reached its deep-water value long before).
 * @returns the row, every column dimensionless and finite.
 * @throws RangeError if d/L0 is NaN, <= 0 or > 100.
 * @example waveTableRow(0.1).dOverL // 0.14098
 */
export function waveTableRow(dOverL0: number): WaveTableRow {
  if (!(dOverL0 > 0 && dOverL0 <= WAVE_TABLE_MAX_D_OVER_L0)) {
    throw new RangeError(`d/L0 must be in (0, ${WAVE_TABLE_MAX_D_OVER_L0}], got ${dOverL0}`);
  }
  const kd = relativeDepthFromDeepWater(TWO_PI * dOverL0);
  const tanhKd = Math.tanh(kd);
  const n = groupCelerityRatio(kd);
  const coshKd = Math.cosh(kd);
  return {
    dOverL0,
    dOverL: kd / TWO_PI,
    lOverL0: tanhKd,
    kd,
    tanhKd,
    sinhKd: Math.sinh(kd),
    coshKd,
    n,
    cgOverC0: n * tanhKd,
    shoalingCoefficient: 1 / Math.sqrt(2 * n * tanhKd),
    bedPressureFactor: 1 / coshKd,
  };
}

/**
 * Wave table from `from` to `to` (inclusive, d/L0) in steps of `step`. Row i is at
 * from + i*step, rounded to 12 significant figures so that 0.1 + 3*0.1 reads 0.4; `to` is
 * included when it lies on the grid within 1e-9 of a step.
 *
 * @param from - first d/L0, in (0, 100].
 * @param to - last d/L0, in [from, 100].
 * @param step - increment of d/L0, > 0.
 * @returns the rows, ascending in d/L0 (one row when from = to).
 * @throws RangeError if a bound is out of range, to < from, step is not positive and finite,
 *   or the table would have more than 2000 rows.
 * @example waveTable(0.1, 0.5, 0.1).length // 5
 */
export function waveTable(from: number, to: number, step: number): WaveTableRow[] {
  if (!(from > 0 && from <= WAVE_TABLE_MAX_D_OVER_L0)) {
    throw new RangeError(`from must be in (0, ${WAVE_TABLE_MAX_D_OVER_L0}], got ${from}`);
  }
  if (!(to >= from && to <= WAVE_TABLE_MAX_D_OVER_L0)) {
    throw new RangeError(`to must be in [from, ${WAVE_TABLE_MAX_D_OVER_L0}], got ${to}`);
  }
  if (!(step > 0 && Number.isFinite(step))) {
    throw new RangeError(`step must be a positive finite number, got ${step}`);
  }
  const count = Math.floor((to - from) / step + 1e-9) + 1;
  if (count > WAVE_TABLE_MAX_ROWS) {
    throw new RangeError(`the table would have ${count} rows; at most ${WAVE_TABLE_MAX_ROWS} are allowed`);
  }
  const rows: WaveTableRow[] = [];
  for (let i = 0; i < count; i++) {
    const x = Math.min(Number((from + i * step).toPrecision(12)), WAVE_TABLE_MAX_D_OVER_L0);
    rows.push(waveTableRow(x));
  }
  return rows;
}
