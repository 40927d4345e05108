import type { WaveTableRow } from '../../../../shared/waves/wave-table';

/** The wave-table columns in handbook order, with the plain CSV header of each. */
export const WAVE_TABLE_CSV_COLUMNS: { key: keyof WaveTableRow; header: string }[] = [
  { key: 'dOverL0', header: 'd/L0' },
  { key: 'dOverL', header: 'd/L' },
  { key: 'lOverL0', header: 'L/L0' },
  { key: 'kd', header: 'kd' },
  { key: 'tanhKd', header: 'tanh(kd)' },
  { key: 'sinhKd', header: 'sinh(kd)' },
  { key: 'coshKd', header: 'cosh(kd)' },
  { key: 'n', header: 'n' },
  { key: 'cgOverC0', header: 'Cg/C0' },
  { key: 'shoalingCoefficient', header: 'Ks' },
  { key: 'bedPressureFactor', header: 'Kp_bed' },
];

/**
 * Plain CSV of wave-table rows (RFC 4180 style, CRLF line ends): one header line naming the
 * columns, then one line per row in the order given. Numbers keep full double precision
 * (shortest round-trip form) so nothing is lost; a non-finite value is left empty.
 */
export function waveTableCsv(rows: readonly WaveTableRow[]): string {
  const lines = [WAVE_TABLE_CSV_COLUMNS.map((c) => c.header).join(',')];
  for (const row of rows) {
    lines.push(WAVE_TABLE_CSV_COLUMNS.map((c) => (Number.isFinite(row[c.key]) ? String(row[c.key]) : '')).join(','));
  }
  return lines.join('\r\n') + '\r\n';
}

/** Offers text as a file download in the browser. */
export function downloadText(fileName: string, text: string, type = 'text/csv;charset=utf-8'): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
