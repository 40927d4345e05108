/**
 * Helpers the worksite, operation and setup schemas share: name keys, time zones, numbers with
 * their field's name in the message, and the free-text fields.
 */
import { z } from 'zod';
import { longText, nameText } from './common';

/**
 * Key under which names are compared for uniqueness and for the setup document's site mapping:
 * trimmed, inner white space collapsed, lower case. "Berth A" and "berth  a" are the same name.
 */
export function nameKey(name: string): string {
  return name.trim().replace(/\s+/g, ' ').toLowerCase();
}

/**
 * Canonical IANA name of a time zone, or null when the runtime does not know it.
 *
 * Checked with `Intl.DateTimeFormat` (which throws RangeError for unknown zones), so the browser
 * and the server agree on what is valid; the name is returned as the runtime spells it
 * ('europe/oslo' -> 'Europe/Oslo', 'utc' -> 'UTC'). Fixed offsets such as '+01:00' are refused
 * even where the runtime accepts them: a worksite's clock follows its zone's daylight-saving rules,
 * never a hand-made offset.
 *
 * @example canonicalTimeZone('europe/oslo') // 'Europe/Oslo'; canonicalTimeZone('Mars/Olympus') // null
 */
export function canonicalTimeZone(zone: string): string | null {
  if (typeof zone !== 'string' || zone.length === 0 || zone.length > 64) return null;
  if (!/^[A-Za-z][A-Za-z0-9_+\-/]*$/.test(zone)) return null;
  try {
    return new Intl.DateTimeFormat('en-US', { timeZone: zone }).resolvedOptions().timeZone;
  } catch {
    return null;
  }
}

export const finite = (what: string) => z.number({ error: `${what} must be a number` });

// Control characters (NUL above all, which PostgreSQL text cannot hold) and lone surrogates are
// refused by nameText and longText (common.ts); tab and line breaks stay allowed in descriptions.
export const itemName = () => nameText();
export const itemDescription = () => longText();
