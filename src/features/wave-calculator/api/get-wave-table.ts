import type { WaveTableQuery } from '../../../../shared/schemas/wave';
import type { WaveTableRow } from '../../../../shared/waves/wave-table';
import { calculatorQuery, waveQueryString } from './calculator-query';

export type { WaveTableRow };

/** Wave-table rows by d/L0 (at most 2,000); `null` skips the request and keeps the last rows. */
export const waveTableQuery = calculatorQuery<WaveTableQuery, WaveTableRow[]>('table', (q) =>
  waveQueryString({ from: q.from, to: q.to, step: q.step }),
);
export const useWaveTable = waveTableQuery.use;
