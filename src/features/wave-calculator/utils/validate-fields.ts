/**
 * The text of each input of a calculator form, exactly as typed; the forms read it with the shared
 * schemas of shared/schemas/wave.ts (typedNumberForm) through react-hook-form (use-wave-form.ts).
 */
export type RawFields<K extends string> = Record<K, string>;

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
