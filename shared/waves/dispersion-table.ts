/**
 * A lookup table of the linear dispersion relation in its dimensionless form (docs/domain.md#dispersion):
 * k*d*tanh(k*d) = k0*d with k0 = omega^2/g, so k*d is a function of the one number x = k0*d. With
 * the depth moving with the tide (docs/domain.md#tide) every record has its own (period, depth)
 * pair; solving each by Newton's method is what made the tidal transformation slow. The table holds
 * y = k*d and its slope on a grid uniform in ln(x) and interpolates with cubic Hermite polynomials
 * (value and exact slope at both ends of a cell, so the error shrinks with the fourth power of the
 * cell width: below 1e-10 relative with this grid, checked in tests/waves/dispersion-table.test.ts
 * against the Newton solution). Outside the grid it falls back to the exact solution.
 */
import { DEEP_WATER_KD, relativeDepthFromDeepWater } from './wave-number';

/** Smallest x = k0*d in the table; below it the exact solution is used (h of a few micrometres at 10 s). */
export const DISPERSION_TABLE_MIN_X = 1e-6;
/** Cells of the table, uniform in ln(x) between DISPERSION_TABLE_MIN_X and DEEP_WATER_KD. */
export const DISPERSION_TABLE_CELLS = 4096;

const U0 = Math.log(DISPERSION_TABLE_MIN_X);
const DU = (Math.log(DEEP_WATER_KD) - U0) / DISPERSION_TABLE_CELLS;

let values: Float64Array | null = null;
let slopes: Float64Array | null = null;

/** Builds the table once: y(x) by Newton's method and dy/du = x/(tanh y + y sech^2 y) at each node. */
function table(): { y: Float64Array; dy: Float64Array } {
  if (values && slopes) return { y: values, dy: slopes };
  const y = new Float64Array(DISPERSION_TABLE_CELLS + 1);
  const dy = new Float64Array(DISPERSION_TABLE_CELLS + 1);
  for (let i = 0; i <= DISPERSION_TABLE_CELLS; i++) {
    const x = i === DISPERSION_TABLE_CELLS ? DEEP_WATER_KD : Math.exp(U0 + i * DU);
    const kd = relativeDepthFromDeepWater(x);
    const ch = Math.cosh(kd);
    y[i] = kd;
    dy[i] = x / (Math.tanh(kd) + kd / (ch * ch));
  }
  values = y;
  slopes = dy;
  return { y, dy };
}

/**
 * k*d from x = k0*d = omega^2*d/g: from the table inside [DISPERSION_TABLE_MIN_X, DEEP_WATER_KD),
 * x itself from DEEP_WATER_KD on (deep water, as `waveNumber` does), and the exact Newton solution
 * below the table.
 *
 * @param x - k0*d, > 0.
 * @returns k*d.
 * @example relativeDepthFromTable(0.1572) // 0.4073 (T = 8 s, d = 2.5 m)
 */
export function relativeDepthFromTable(x: number): number {
  if (x >= DEEP_WATER_KD) return x;
  if (!(x >= DISPERSION_TABLE_MIN_X)) return relativeDepthFromDeepWater(x);
  const { y, dy } = table();
  const s = (Math.log(x) - U0) / DU;
  let i = Math.floor(s);
  if (i >= DISPERSION_TABLE_CELLS) i = DISPERSION_TABLE_CELLS - 1;
  const t = s - i;
  const t2 = t * t;
  const t3 = t2 * t;
  const h00 = 2 * t3 - 3 * t2 + 1;
  const h10 = t3 - 2 * t2 + t;
  const h01 = -2 * t3 + 3 * t2;
  const h11 = t3 - t2;
  return h00 * y[i] + h10 * DU * dy[i] + h01 * y[i + 1] + h11 * DU * dy[i + 1];
}
