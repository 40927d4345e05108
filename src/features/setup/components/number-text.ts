import { z } from 'zod';

/**
 * Text-to-number conversion for the setup forms. Inputs keep what was typed; the shared zod
 * schemas then check numbers, so a form and the server refuse the same values with the same words.
 *
 * Accepted: an optional sign, digits with one decimal point or decimal comma ("1,5" reads 1.5, as
 * many European keyboards type it), an optional exponent. Anything else becomes NaN, which the
 * schemas refuse as "... must be a number".
 */
const NUMBER_TEXT = /^[+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?$/;

/** The number typed, NaN for blank or malformed text. */
export function numberFromText(text: string): number {
  const s = text.trim();
  if (!NUMBER_TEXT.test(s)) return Number.NaN;
  return Number(s.replace(',', '.'));
}

/** The number typed, null for blank text (an optional value left empty), NaN when malformed. */
export function numberOrNull(text: string): number | null {
  return text.trim() === '' ? null : numberFromText(text);
}

/** A number back into an input's text ('' for null or undefined). */
export function textFromNumber(value: number | null | undefined): string {
  return value === null || value === undefined || Number.isNaN(value) ? '' : String(value);
}

/** A [from, to] pair as typed (a curve point, a band, a sector). */
export const pairText = z.tuple([z.string(), z.string()]);

/** The schema entries of text inputs kept as typed: each name a string. */
export function textFields<K extends string>(...names: K[]): Record<K, z.ZodString> {
  return Object.fromEntries(names.map((name) => [name, z.string()])) as Record<K, z.ZodString>;
}
