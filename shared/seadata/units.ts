/**
 * Units accepted in imported CSV files and their exact factors to SI.
 *
 * - 1 international foot = 0.3048 m exactly (international yard and pound agreement, 1959; NIST
 *   SP 811 appendix B).
 * - 1 knot = 1 international nautical mile per hour = 1852 m / 3600 s exactly (nautical mile
 *   defined as 1852 m, International Hydrographic Conference 1929; NIST SP 811 appendix B).
 * - 1 km/h = 1000 m / 3600 s.
 * (NIST SP 811 references are from memory.)
 * Directions are degrees (coming from, clockwise from true north) only.
 */
import { z } from 'zod';
import '../schemas/words';

/** Metres per international foot (exact). */
export const M_PER_FT = 0.3048;
/** Metres per second per knot (exact: 1852/3600). */
export const MS_PER_KNOT = 1852 / 3600;
/** Metres per second per km/h (exact: 1000/3600). */
export const MS_PER_KMH = 1000 / 3600;

export const HEIGHT_UNITS = ['m', 'ft'] as const;
export const SPEED_UNITS = ['m/s', 'kn', 'km/h'] as const;
export const DIRECTION_UNITS = ['deg'] as const;

/** Units of the value columns of a CSV file. Periods are always seconds. */
export const SeaUnitsSchema = z.object({
  /** Wave height unit. */
  height: z.enum(HEIGHT_UNITS).default('m'),
  /** Wind speed unit. */
  speed: z.enum(SPEED_UNITS).default('m/s'),
  /** Direction unit (degrees only). */
  direction: z.enum(DIRECTION_UNITS).default('deg'),
});
export type SeaUnits = z.output<typeof SeaUnitsSchema>;

/** SI units: m, m/s, degrees. */
export const SI_UNITS: SeaUnits = { height: 'm', speed: 'm/s', direction: 'deg' };

/** Factor from `unit` to metres. */
export function heightFactorToM(unit: SeaUnits['height']): number {
  return unit === 'ft' ? M_PER_FT : 1;
}

/** Factor from `unit` to m/s. */
export function speedFactorToMs(unit: SeaUnits['speed']): number {
  if (unit === 'kn') return MS_PER_KNOT;
  if (unit === 'km/h') return MS_PER_KMH;
  return 1;
}
