import type { RawFields } from '../utils/validate-fields';

/** The wave table's inputs as typed: d/L0 from, to and step. */
export type TableFields = RawFields<'from' | 'to' | 'step'>;

/** Default range: the intermediate-depth span of the handbook tables, 50 rows. */
export const DEFAULT_TABLE_FIELDS: TableFields = { from: '0.01', to: '0.5', step: '0.01' };
