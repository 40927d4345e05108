/**
 * IANA time-zone names, checked with the runtime's own zone database (Intl), so the browser and
 * the server agree on what is valid.
 */

const known = new Map<string, boolean>();

/**
 * True when `timeZone` is a zone name the runtime knows (e.g. 'Europe/Oslo', 'UTC').
 * Checked with `Intl.DateTimeFormat`, which throws RangeError for unknown zones.
 * @example isValidTimeZone('Europe/Oslo') // true; isValidTimeZone('Mars/Olympus') // false
 */
export function isValidTimeZone(timeZone: string): boolean {
  if (typeof timeZone !== 'string' || timeZone.trim() === '' || timeZone.length > 64) return false;
  const cached = known.get(timeZone);
  if (cached !== undefined) return cached;
  let ok: boolean;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone });
    ok = true;
  } catch {
    ok = false;
  }
  if (known.size < 1000) known.set(timeZone, ok);
  return ok;
}
