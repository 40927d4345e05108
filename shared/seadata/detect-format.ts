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

/**
 * The kind of NetCDF file by its first bytes, or null: classic files start with "CDF" and a
 * version byte (1 classic, 2 64-bit offset, 5 64-bit data); NetCDF-4 files are HDF5 files, whose
 * signature is \x89HDF\r\n\x1a\n (a NetCDF-4 file written with a user block would have it at
 * 512 bytes or later; not read).
 */
export function netcdfKind(head: Uint8Array): 'netcdf4' | 'classic' | null {
  if (head.length >= 4 && head[0] === 0x43 && head[1] === 0x44 && head[2] === 0x46 && (head[3] === 1 || head[3] === 2 || head[3] === 5))
    return 'classic';
  const hdf = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];
  if (head.length >= 8 && hdf.every((b, i) => head[i] === b)) return 'netcdf4';
  return null;
}
