import type { WaveTableRow } from '../../../../shared/waves/wave-table';
import { toCsv } from '../../../lib/csv';

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
  return toCsv(
    WAVE_TABLE_CSV_COLUMNS.map((c) => c.header),
    rows.map((row) => WAVE_TABLE_CSV_COLUMNS.map((c) => row[c.key])),
  );
}
