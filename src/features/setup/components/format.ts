/** Display helpers for the setup pages: numbers without float noise, with their units. */
import { formatPosition, trimmed } from '../../../lib/format';

/** A number rounded to at most `decimals` places, trailing zeros dropped ("1.5", "16", "0.35"). */
export const fmt = (value: number, decimals = 2): string => trimmed(value, decimals);

/** A number with its unit, separated by a narrow no-break space ("1.5 m", "12 h"); degrees close up ("250°"). */
export function withUnit(value: number | null | undefined, unit: string, decimals = 2): string {
  if (value === null || value === undefined) return '–';
  return unit === '°' ? `${fmt(value, decimals)}°` : `${fmt(value, decimals)}\u202f${unit}`;
}

/** A range "13–15 s". */
export function range(from: number, to: number, unit: string, decimals = 2): string {
  return `${fmt(from, decimals)}–${fmt(to, decimals)}\u202f${unit}`;
}

/** A position as "52.4120° N, 5.3010° W". */
export const position = (latitude: number, longitude: number): string => formatPosition(latitude, longitude, 4);
