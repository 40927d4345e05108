import type { z } from 'zod';

/** The text of each input of a form, exactly as typed. */
export type RawFields<K extends string> = Record<K, string>;

export interface FieldCheck<T, K extends string> {
  /** The parsed inputs, or null while any field is missing or out of range. */
  data: T | null;
  /** One message per field that is wrong, in words. */
  errors: Partial<Record<K, string>>;
}

/**
 * Reads typed numbers against a shared zod schema (the same one the API parses with), so the page
 * shows the server's own range messages before it asks. Blank fields are "not given"; a decimal
 * comma is read as a point (1,5 = 1.5). Blank required fields get `required[field]` as message.
 */
export function validateFields<S extends z.ZodType, K extends string>(
  schema: S,
  raw: RawFields<K>,
  required: Partial<Record<K, string>>,
): FieldCheck<z.infer<S>, K> {
  const input: Record<string, string | undefined> = {};
  for (const key of Object.keys(raw) as K[]) {
    const text = raw[key].trim().replace(',', '.');
    input[key] = text === '' ? undefined : text;
  }
  const errors: Partial<Record<K, string>> = {};
  const parsed = schema.safeParse(input);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const field = issue.path[0] as K | undefined;
      if (field !== undefined && field in raw && errors[field] === undefined) errors[field] = readable(issue.message);
    }
  }
  let missing = false;
  for (const key of Object.keys(required) as K[]) {
    if (input[key] === undefined) {
      errors[key] = required[key];
      missing = true;
    }
  }
  return { data: parsed.success && !missing ? (parsed.data as z.infer<S>) : null, errors };
}

/** Schema messages name fields as the API does ("hs must be ..."): print the symbols as engineers write them. */
export function readable(message: string): string {
  const text = message
    .trim()
    .replace(/\b(hs|tp|tz|te)\b/g, (s) => s[0].toUpperCase() + s.slice(1))
    .replace(/>=/g, '≥')
    .replace(/<=/g, '≤')
    .replace(/-depth\b/g, '−d');
  // z is a symbol and stays lower case; everything else starts as a sentence.
  return /^z\b/.test(text) ? text : text[0].toUpperCase() + text.slice(1);
}
