/**
 * Transfer tables: site-specific Hs_site/Hs_src factors by direction sector and Tp band, from a
 * wave model study (docs/domain.md#transformation, #convention-17).
 */
import { wrapDegrees360 } from './angles';

/** Hs_site/Hs_src by direction sector and Tp band. */
export interface TransferTable {
  /**
   * Direction sectors [from, to) in degrees "coming from", 0 <= from, to <= 360, from != to.
   * A sector with from > to wraps through north (e.g. [345, 15)).
   */
  directionSectorsDeg: [number, number][];
  /** Tp bands [from, to) in s, 0 <= from < to. */
  tpBandsS: [number, number][];
  /** factors[sector][band] = Hs_site/Hs_src, finite and >= 0. */
  factors: number[][];
}

/**
 * Checks a transfer table's shape and values.
 *
 * @throws RangeError naming the first problem (empty lists, bad bounds, factor matrix of the
 *   wrong shape, a negative or non-finite factor).
 */
export function validateTransferTable(table: TransferTable): void {
  const { directionSectorsDeg: sectors, tpBandsS: bands, factors } = table;
  if (sectors.length === 0) throw new RangeError('transfer table: no direction sectors');
  if (bands.length === 0) throw new RangeError('transfer table: no Tp bands');
  sectors.forEach(([lo, hi], i) => {
    if (!(lo >= 0 && lo <= 360 && hi >= 0 && hi <= 360) || lo === hi) {
      throw new RangeError(`transfer table: direction sector ${i} [${lo}, ${hi}) must lie in [0, 360] with from != to`);
    }
  });
  bands.forEach(([lo, hi], i) => {
    if (!(lo >= 0 && hi > lo && hi < Infinity)) {
      throw new RangeError(`transfer table: Tp band ${i} [${lo}, ${hi}) must have 0 <= from < to (finite)`);
    }
  });
  if (factors.length !== sectors.length) {
    throw new RangeError(`transfer table: ${factors.length} factor rows for ${sectors.length} direction sectors`);
  }
  factors.forEach((row, i) => {
    if (row.length !== bands.length) {
      throw new RangeError(`transfer table: factor row ${i} has ${row.length} values for ${bands.length} Tp bands`);
    }
    row.forEach((f, j) => {
      if (!(f >= 0 && f < Infinity)) throw new RangeError(`transfer table: factor [${i}][${j}] = ${f} must be finite and >= 0`);
    });
  });
}

function angularDistance(a: number, b: number): number {
  const d = Math.abs(wrapDegrees360(a) - wrapDegrees360(b));
  return d > 180 ? 360 - d : d;
}

function inSector(dir: number, lo: number, hi: number): boolean {
  if (lo === 0 && hi === 360) return true;
  const from = lo === 360 ? 0 : lo;
  const to = hi === 0 ? 360 : hi;
  return from < to ? dir >= from && dir < to : dir >= from || dir < to;
}

/**
 * Index of the direction sector a direction falls in: sectors are half-open [from, to)
 * (docs/domain.md#convention-17); a direction in none of them takes the sector with the nearest edge (angular
 * distance; ties go to the sector listed first). The first matching sector wins when they overlap.
 *
 * @param table - a valid transfer table.
 * @param dirDeg - direction "coming from", degrees (wrapped to [0, 360)); must not be NaN.
 * @returns the sector index.
 */
export function transferSectorIndex(table: TransferTable, dirDeg: number): number {
  const dir = wrapDegrees360(dirDeg);
  const sectors = table.directionSectorsDeg;
  for (let i = 0; i < sectors.length; i++) {
    if (inSector(dir, sectors[i][0], sectors[i][1])) return i;
  }
  let best = 0;
  let bestDistance = Infinity;
  for (let i = 0; i < sectors.length; i++) {
    const dist = Math.min(angularDistance(dir, sectors[i][0]), angularDistance(dir, sectors[i][1]));
    if (dist < bestDistance) {
      bestDistance = dist;
      best = i;
    }
  }
  return best;
}

/**
 * Index of the Tp band a period falls in: bands are half-open [from, to) (docs/domain.md#convention-17); a period
 * in none of them (below the first, above the last, or in a gap) takes the band with the nearest
 * edge (ties go to the band listed first). The first matching band wins when they overlap.
 *
 * @param table - a valid transfer table.
 * @param tpS - peak period, s; must not be NaN.
 * @returns the band index.
 */
export function transferBandIndex(table: TransferTable, tpS: number): number {
  const bands = table.tpBandsS;
  for (let i = 0; i < bands.length; i++) {
    if (tpS >= bands[i][0] && tpS < bands[i][1]) return i;
  }
  let best = 0;
  let bestDistance = Infinity;
  for (let i = 0; i < bands.length; i++) {
    const [lo, hi] = bands[i];
    const dist = tpS < lo ? lo - tpS : tpS - hi;
    if (dist < bestDistance) {
      bestDistance = dist;
      best = i;
    }
  }
  return best;
}

/**
 * Hs_site/Hs_src of a transfer table for one direction and peak period (docs/domain.md#convention-17).
 *
 * @param table - a valid transfer table.
 * @param dirDeg - direction "coming from", degrees.
 * @param tpS - peak period, s.
 * @returns the factor, dimensionless.
 * @example transferFactor({ directionSectorsDeg: [[0, 360]], tpBandsS: [[0, 30]], factors: [[0.8]] }, 90, 10) // 0.8
 */
export function transferFactor(table: TransferTable, dirDeg: number, tpS: number): number {
  return table.factors[transferSectorIndex(table, dirDeg)][transferBandIndex(table, tpS)];
}
