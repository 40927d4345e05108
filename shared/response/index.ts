/** Vessel response from RAOs and sea partitions (docs/domain.md#vessel-response). Pure: typed arrays, no React or Express. */
export * from './jonswap';
export * from './spreading';
export * from './rao';
export * from './response';
export * from './spread-table';
export * from './moment-table';
export * from './summary';
