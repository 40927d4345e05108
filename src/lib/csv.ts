// CSV built in the browser for the "Download CSV" buttons of every feature.

import { csvField } from '../../shared/csv-field';

/** One CSV field: quoted when needed; a text that a spreadsheet would run as a formula is defused (shared/csv-field.ts). */
export { csvField };

/** A CSV document (CRLF line ends, RFC 4180) from a header and rows. */
export function toCsv(header: string[], rows: (string | number | boolean | null | undefined)[][]): string {
  return [header, ...rows].map((r) => r.map(csvField).join(',')).join('\r\n') + '\r\n';
}

/** Hands a CSV document to the browser as a download. */
export function downloadCsv(fileName: string, text: string, type = 'text/csv;charset=utf-8'): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** A file-name-safe slug of a name. */
export function slug(name: string): string {
  return (
    name
      .replace(/[^A-Za-z0-9._-]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'export'
  );
}
