/**
 * Sea-state data import: uploaded text (CSV, NDBC stdmet) to validated columnar records.
 * Pure TypeScript, runs in the browser and in Node.
 */

// Records and their summary
export {
  SEA_VARIABLES,
  SEA_VARIABLE_UNITS,
  SeaRecordBuilder,
  emptySeaRecords,
  detectStepMinutes,
  summarise,
  givenPeriodFlags,
  GIVEN_TP,
  GIVEN_TZ,
  GIVEN_TE,
} from './records';
export type { SeaVariable, SeaRecords, SeaRecordInput, SeaRecordsSummary } from './records';
export { EXTRA_COLUMNS, EXTRA_COLUMN_UNITS, isExtraColumn, presentExtraColumns, sliceExtra } from './extra-columns';
export type { ExtraColumn, ExtraSeries } from './extra-columns';

// Issues and validation
export { ImportError, IssueList, MAX_LISTED_ISSUES, shownText } from './issues';
export type { ImportIssue } from './issues';
export { SeaRowValidator, implausibleReason, BAD_ROW_MODES, HS_MAX_M, PERIOD_MIN_S, PERIOD_MAX_S, WIND_MAX_MS } from './validate';
export type { BadRowMode, TimeOrder, ImportReport, ImportResult } from './validate';

// Values, units, times
export { parseDecimal } from './parse-decimal';
export { DEFAULT_MISSING_CODES, MissingCodes } from './missing-codes';
export {
  SeaUnitsSchema,
  SI_UNITS,
  M_PER_FT,
  MS_PER_KNOT,
  MS_PER_KMH,
  HEIGHT_UNITS,
  SPEED_UNITS,
  DIRECTION_UNITS,
  heightFactorToM,
  speedFactorToMs,
} from './units';
export type { SeaUnits } from './units';
export {
  windSpeedAt10m,
  windHeightFactor,
  windHeightNote,
  DEFAULT_WIND_EXPONENT,
  OVER_LAND_WIND_EXPONENT,
  WIND_REFERENCE_HEIGHT_M,
} from './wind-height';
export { TimestampParser, suggestDateOrder, DATE_ORDERS } from './timestamp-parser';
export type { DateOrder, TimestampOptions } from './timestamp-parser';
export { isValidTimeZone } from './time-zone';

// NDBC
export { NdbcParser, looksLikeNdbc } from './ndbc';
export type { NdbcParserOptions } from './ndbc';

// CSV
export { ColumnMappingSchema, detectColumns, detectPartitionColumns, detectUnits, normaliseHeader, mappedVariables } from './csv-columns';
export type { ColumnMapping, DetectedColumns, PartitionColumn } from './csv-columns';
export { CsvRecordReader, DIRECTION_CONVENTIONS, WIND_MISSING_VALUE } from './csv-reader';
export type { CsvReaderOptions, CsvRowResult, DirectionConvention } from './csv-reader';
export { CsvTextParser, detectDelimiter, firstContentLine, CSV_DELIMITERS, MAX_CSV_ROW_CHARS } from './csv-text-parser';
export { MAX_COLUMNS, MAX_LINE_CHARS } from './limits';
export type { CsvDelimiter, CsvTextParserOptions } from './csv-text-parser';
export { previewCsv } from './csv-preview';
export type { CsvPreview, CsvPreviewOptions } from './csv-preview';

// Upload form and format detection
export {
  ImportFormSchema,
  DATASET_KINDS,
  IMPORT_FORMATS,
  MAX_DEPTH_M,
  csvOptionsFromForm,
  ndbcOptionsFromForm,
  anemometerHeightOf,
} from './import-options';
export type { DatasetKind, ImportFormat, ImportForm, ImportFormInput } from './import-options';
export { binaryMark, detectFormat } from './detect-format';

// NetCDF (CF conventions)
export { netcdfKind } from './detect-format';
export {
  planCfImport,
  listGridPoints,
  scanMissingShares,
  nearestSeaPoint,
  greatCircleM,
  normaliseLongitude,
  readCfPoint,
  decodeTimes,
  parseTimeUnits,
  unpack,
  standardNamesRead,
  MAX_MISSING_SHARE,
  PARTITIONS,
  PARTITION_LABELS,
  ACCEPTED_CALENDARS,
  REFUSED_CALENDARS,
} from './netcdf-cf';
export type {
  NcAttr,
  NcVar,
  NcFile,
  CfPlan,
  CfChoice,
  CfRole,
  GridPoint,
  Partition,
  PartitionSeries,
  CfPointResult,
  CfPointOptions,
  NcColumnMap,
} from './netcdf-cf';
