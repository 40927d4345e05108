/** Display helpers for the setup pages: numbers without float noise, with their units. */

/** A number rounded to at most `decimals` places, trailing zeros dropped ("1.5", "16", "0.35"). */
export function fmt(value: number, decimals = 2): string {
  if (!Number.isFinite(value)) return '–';
  return String(Number(value.toFixed(decimals)));
}

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
export function position(latitude: number, longitude: number): string {
  const lat = `${Math.abs(latitude).toFixed(4)}° ${latitude < 0 ? 'S' : 'N'}`;
  const lon = `${Math.abs(longitude).toFixed(4)}° ${longitude < 0 ? 'W' : 'E'}`;
  return `${lat}, ${lon}`;
}
