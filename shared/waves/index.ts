/**
 * Wave physics core: linear (Airy) wave theory, sea states and the transformation of sea states
 * from a data point to a worksite. Pure TypeScript, SI units (see docs/domain.md#units).
 */

// Constants and numerics
export * from './constants';
export * from './hyperbolic';
export * from './angles';
export { FloatKeyIndex } from './float-key-index';

// One regular wave
export * from './wave-number';
export * from './celerity';
export * from './regular-wave';
export * from './wave-table';

// Sea states
export * from './period-conversion';
export * from './sea-state';

// Data point to worksite
export * from './transfer-table';
export {
  TRANSFORM_FLAG,
  createSiteSeries,
  prepareSeaInput,
  transformFlagNames,
  transformOne,
  transformToSite,
  type PreparedSeaInput,
  type SeaRecordInput,
  type SeaSeriesInput,
  type SiteGeometry,
  type SiteSeries,
  type SourcePoint,
  type TransformChain,
  type TransformFlagName,
  type TransformOptions,
} from './transform';

// Partitions (wind sea and swells) through the transformation
export {
  PARTITIONED_FLAG,
  PARTITION_NAMES,
  SWELL_PARTITIONS,
  hasPartitions,
  recordHasPartitions,
  totalFromPartitions,
  transformPartitionedOne,
  transformPartitionedToSite,
  type PartitionChain,
  type PartitionedRecord,
  type PartitionInput,
  type PartitionName,
  type PartitionSeries,
  type PartitionedSiteSeries,
  type SitePartitions,
} from './partitions';
