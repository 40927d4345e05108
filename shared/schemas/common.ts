import { z } from 'zod';
// installs the plain-words error map for every schema that builds on these helpers
import './words';

/**
 * True when the text holds a control character other than tab, line feed and carriage return
 * (C0 and DEL). NUL above all: PostgreSQL text and jsonb cannot hold U+0000, so it would reach
 * the database as a 500; the others are invisible and have no place in names or notes.
 */
export function hasControlChars(s: string): boolean {
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if ((c < 0x20 && c !== 0x09 && c !== 0x0a && c !== 0x0d) || c === 0x7f) return true;
  }
  return false;
}

/**
 * True when the text holds half of a UTF-16 surrogate pair on its own ("\ud800" in JSON). Such a
 * string has no UTF-8 form: the database driver would store U+FFFD instead, so what is read back
 * would differ from what was sent.
 */
export function hasLoneSurrogate(s: string): boolean {
  return /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/.test(s);
}

/** True when the runtime knows the time zone (an IANA name such as 'Europe/Oslo', or an offset). */
export function isKnownTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

/** A time zone the runtime knows (see {@link isKnownTimeZone}), kept as written. */
export const knownTimeZone = () => z.string().refine(isKnownTimeZone, 'unknown time zone');

/** The checks every stored text gets (see {@link hasControlChars}, {@link hasLoneSurrogate}). */
export const storableText = <S extends z.ZodType<string>>(schema: S) =>
  schema
    .refine((s) => !hasControlChars(s), 'must not contain control characters')
    .refine((s) => !hasLoneSurrogate(s), 'must be valid Unicode text');

/** Trimmed, non-empty, single-line display text (names). */
export const nameText = (max = 120) =>
  storableText(
    z
      .string()
      .trim()
      .min(1, 'is required')
      .max(max, `must be at most ${max} characters`)
      .refine((s) => !/[\r\n]/.test(s), 'must be one line'),
  );

/** Free text (descriptions, notes). */
export const longText = (max = 4000) => storableText(z.string().trim().max(max, `must be at most ${max} characters`));

export const idParam = z.string().uuid();

/** A PATCH body: any subset of the fields, at least one given ("Nothing to change" otherwise). */
export function patchSchema<T extends z.ZodRawShape>(fields: T) {
  return z
    .object(fields)
    .partial()
    .refine((v) => Object.values(v).some((x) => x !== undefined), 'Nothing to change');
}
