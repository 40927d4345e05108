/**
 * Format auto-detection of an upload from its first lines.
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
