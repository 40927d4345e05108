import type { AlphaTable, OperationSpec } from './types';

/**
 * Largest planned duration TPOP of a weather-restricted operation, h. From memory of DNV-ST-N001
 * and its predecessor DNV-OS-H101 (which say "less than"); the bound is included here, the safe
 * side because alpha < 1 there (docs/domain.md#weather-restricted).
 */
export const WEATHER_RESTRICTED_MAX_TPOP_H = 72;

/**
 * Largest reference period TR = TPOP + TC of a weather-restricted operation, h. From memory of
 * DNV-ST-N001 and DNV-OS-H101 ("less than"); the bound is included (docs/domain.md#weather-restricted).
 */
export const WEATHER_RESTRICTED_MAX_TR_H = 96;

/**
 * Whether an operation is planned as weather-restricted: marked so, TPOP <= 72 h and TR <= 96 h
 * (both bounds included). Any other operation is not weather-restricted: a forecast plan shows its
 * hours against OPLIM for information only and never offers it a go-start, a usable window or
 * "may start now" (docs/domain.md#convention-5, docs/domain.md#convention-5); its hindcast statistics are at OPLIM.
 */
export function isWeatherRestricted(op: { tpopH: number; tcH: number; weatherRestricted: boolean }): boolean {
  return op.weatherRestricted && op.tpopH <= WEATHER_RESTRICTED_MAX_TPOP_H && op.tpopH + op.tcH <= WEATHER_RESTRICTED_MAX_TR_H;
}

/**
 * Checks that an alpha table covers every weather-restricted operation: its last TPOP bound is at
 * least {@link WEATHER_RESTRICTED_MAX_TPOP_H} (72 h). A table that stops short would leave a
 * weather-restricted operation without a row (docs/domain.md#convention-5: never a silent alpha = 1).
 *
 * @returns null when covered, else the reason.
 */
export function alphaTableCoverageProblem(table: AlphaTable): string | null {
  const last = table.tpopBoundsH[table.tpopBoundsH.length - 1];
  if (!(last >= WEATHER_RESTRICTED_MAX_TPOP_H)) {
    return `the last TPOP bound must be at least ${WEATHER_RESTRICTED_MAX_TPOP_H} h so that every weather-restricted operation (TPOP up to ${WEATHER_RESTRICTED_MAX_TPOP_H} h) has a row (here ${last} h)`;
  }
  return null;
}

/**
 * Checks an alpha table's shape: at least one row and one column, TPOP bounds and Hs columns
 * finite, positive and strictly ascending, one row of values per TPOP bound and one value per
 * column, every value in (0, 1].
 *
 * @throws RangeError naming the first defect.
 */
export function assertAlphaTable(table: AlphaTable): void {
  const { tpopBoundsH, hsColumnsM, values } = table;
  if (tpopBoundsH.length === 0 || hsColumnsM.length === 0) throw new RangeError('alpha table: needs at least one row and one column');
  assertAscending(tpopBoundsH, 'TPOP bounds');
  assertAscending(hsColumnsM, 'Hs columns');
  if (values.length !== tpopBoundsH.length) throw new RangeError('alpha table: one row of values per TPOP bound');
  for (const row of values) {
    if (row.length !== hsColumnsM.length) throw new RangeError('alpha table: one value per Hs column in every row');
    for (const v of row) {
      if (!(v > 0 && v <= 1)) throw new RangeError(`alpha table: value ${v} outside (0, 1]`);
    }
  }
}

function assertAscending(xs: readonly number[], what: string): void {
  for (let i = 0; i < xs.length; i++) {
    if (!Number.isFinite(xs[i]) || xs[i] <= 0) throw new RangeError(`alpha table: ${what} must be finite and positive`);
    if (i > 0 && !(xs[i] > xs[i - 1])) throw new RangeError(`alpha table: ${what} must be strictly ascending`);
  }
}

/**
 * Row of the alpha table that applies to an operation, or -1 when alpha = 1 (docs/domain.md#convention-5).
 *
 * - Not weather-restricted ({@link isWeatherRestricted}: not marked so, TPOP above 72 h or TR
 *   above 96 h): -1. Its hours are at OPLIM for information only: the forecast plan gives it no
 *   go-start, window or "may start now" (docs/domain.md#convention-5), and hindcast statistics are at OPLIM.
 * - Else the first row whose TPOP bound is not exceeded (TPOP equal to a bound takes that row).
 *   A table whose last bound is below the TPOP (an old stored table; edits must cover 72 h, see
 *   {@link alphaTableCoverageProblem}) gives its last row, the smallest alpha: never alpha = 1.
 *
 * @param tpopH planned duration TPOP, h (finite, >= 0)
 * @param trH reference period TR = TPOP + TC, h (finite, >= TPOP)
 * @throws RangeError for a non-finite or negative TPOP or TR, or a malformed table.
 */
export function alphaRowIndex(table: AlphaTable, tpopH: number, trH: number, weatherRestricted: boolean): number {
  assertAlphaTable(table);
  if (!(Number.isFinite(tpopH) && tpopH >= 0)) throw new RangeError(`TPOP ${tpopH} h must be finite and >= 0`);
  if (!(Number.isFinite(trH) && trH >= 0)) throw new RangeError(`TR ${trH} h must be finite and >= 0`);
  if (!weatherRestricted || trH > WEATHER_RESTRICTED_MAX_TR_H || tpopH > WEATHER_RESTRICTED_MAX_TPOP_H) return -1;
  const bounds = table.tpopBoundsH;
  for (let r = 0; r < bounds.length; r++) if (tpopH <= bounds[r]) return r;
  return bounds.length - 1;
}

/**
 * Alpha from one row of the table at an Hs limit: linear interpolation between the Hs columns;
 * below the first or above the last column, the end column's value (docs/domain.md#convention-5).
 *
 * @param row row index from {@link alphaRowIndex}; -1 gives 1
 * @param hsLimitM Hs limit (OPLIM), m
 * @returns alpha, dimensionless, in (0, 1]; NaN when hsLimitM is NaN
 */
export function alphaInRow(table: AlphaTable, row: number, hsLimitM: number): number {
  if (row < 0) return 1;
  return interpolateClamped(table.hsColumnsM, table.values[row], hsLimitM);
}

/** Linear interpolation in ascending xs, end values outside. Internal helper, exported for the engine. */
export function interpolateClamped(xs: ArrayLike<number>, ys: ArrayLike<number>, x: number): number {
  const n = xs.length;
  if (x !== x) return NaN;
  if (x <= xs[0]) return ys[0];
  if (x >= xs[n - 1]) return ys[n - 1];
  let j = 1;
  while (xs[j] < x) j++;
  const x0 = xs[j - 1];
  const x1 = xs[j];
  return ys[j - 1] + ((ys[j] - ys[j - 1]) * (x - x0)) / (x1 - x0);
}

/**
 * Alpha factor for an Hs limit: OPWF = alpha * OPLIM (docs/domain.md#operations-and-limits;
 * table from memory of DNV-ST-N001). Row by TPOP, linear in Hs, docs/domain.md#convention-5; see
 * {@link alphaRowIndex} for when alpha is 1.
 *
 * @param tpopH planned duration TPOP, h
 * @param hsLimitM Hs limit at OPLIM, m
 * @param trH reference period TR = TPOP + TC, h
 * @param weatherRestricted false gives alpha = 1 (statuses at OPLIM, for information only)
 * @returns alpha, dimensionless, in (0, 1]
 * @throws RangeError for a malformed table or a non-finite TPOP/TR.
 * @example alphaFor(DEFAULT_ALPHA_TABLE, 24, 3, 30, true) // 0.745 (halfway 0.73..0.76)
 */
export function alphaFor(table: AlphaTable, tpopH: number, hsLimitM: number, trH: number, weatherRestricted: boolean): number {
  return alphaInRow(table, alphaRowIndex(table, tpopH, trH, weatherRestricted), hsLimitM);
}

/**
 * Alpha factor of an operation at an Hs limit (default: its Hs max).
 *
 * @param hsLimitM Hs limit, m; defaults to `op.limits.hsMax`
 * @throws RangeError when no Hs limit is given and the operation has no Hs max.
 */
export function alphaFactor(table: AlphaTable, op: OperationSpec, hsLimitM?: number): number {
  const hs = hsLimitM ?? op.limits.hsMax;
  if (hs == null) throw new RangeError('alphaFactor: no Hs limit given and the operation has no Hs max');
  return alphaFor(table, op.tpopH, hs, op.tpopH + op.tcH, op.weatherRestricted);
}
