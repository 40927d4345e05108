/**
 * Format auto-detection of an upload from its first lines, and the check that it is text at all
 * (the browser runs it before the preview, the server before the import).
 */
import { looksLikeNdbc } from './ndbc';

/**
 * 'ndbc' when the text starts with an NDBC standard meteorological header (`looksLikeNdbc`),
 * otherwise 'csv' (the CSV reader then reports what it cannot read).
 * @param head the first few kilobytes of the file.
 * @example detectFormat('#YY  MM DD hh mm WDIR WSPD GST  WVHT ...') // 'ndbc'
 */
export function detectFormat(head: string): 'csv' | 'ndbc' {
  return looksLikeNdbc(head) ? 'ndbc' : 'csv';
}

/**
 * Where the first byte that no text file holds sits in the leading text of an upload, or null:
 * NUL or another C0 control character other than tab, line feed, vertical tab, form feed,
 * carriage return and SUB (0x1A, the end-of-file mark of old DOS files). A PNG or gzip header,
 * a ZIP file, an executable or random bytes all hold one within their first bytes.
 */
export function binaryMark(head: string): { line: number; column: number; code: number } | null {
  for (let i = 0; i < head.length; i++) {
    const c = head.charCodeAt(i);
    if (c < 0x20 && c !== 0x09 && c !== 0x0a && c !== 0x0b && c !== 0x0c && c !== 0x0d && c !== 0x1a) {
      let line = 1;
      for (let k = head.indexOf('\n'); k !== -1 && k < i; k = head.indexOf('\n', k + 1)) line++;
      return { line, column: i - head.lastIndexOf('\n', i - 1), code: c };
    }
  }
  return null;
}
