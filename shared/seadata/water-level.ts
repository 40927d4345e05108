/**
 * What a dataset's water level and current columns are (docs/domain.md#tide). A water level is
 * either metres above the worksite's chart datum (measured or forecast, it wins over the predicted
 * tide) or a residual (surge) to add to the predicted tide; the importer is told which, never
 * guesses. Current directions are stored as the direction the water flows towards (the
 * oceanographic convention, unlike waves and wind); a file giving the coming-from direction is
 * converted by adding 180°.
 */

/** What a water-level column holds. */
export const WATER_LEVEL_REFERENCES = ['chart-datum', 'residual'] as const;
export type WaterLevelReference = (typeof WATER_LEVEL_REFERENCES)[number];

/** Words for a water-level reference, for reports and the dataset page. */
export const WATER_LEVEL_REFERENCE_WORDS: Readonly<Record<WaterLevelReference, string>> = {
  'chart-datum': 'm above the worksite’s chart datum (wins over the predicted tide)',
  residual: 'a residual (surge), m, added to the predicted tide',
};

/** How a file gives current directions: flowing towards (oceanographic, the default) or coming from. */
export const CURRENT_DIR_CONVENTIONS = ['going-to', 'coming-from'] as const;
export type CurrentDirConvention = (typeof CURRENT_DIR_CONVENTIONS)[number];

/**
 * Plausibility bounds of the columns, inclusive (common practice, no source): water levels within
 * ±30 m of a chart datum (the largest tidal ranges are under 17 m), current speeds up to 10 m/s
 * (the strongest tidal races run at about 8 m/s), directions 0-360°.
 */
export const WATER_LEVEL_BOUNDS_M = { min: -30, max: 30 } as const;
export const CURRENT_SPEED_MAX_MPS = 10;

/** Where the water level of a worksite record came from (docs/domain.md#tide). */
export const WATER_LEVEL_SOURCES = ['none', 'predicted', 'dataset', 'predicted+residual'] as const;
export type WaterLevelSource = (typeof WATER_LEVEL_SOURCES)[number];

/** Words for each water-level source, for the chain behind an hour. */
export const WATER_LEVEL_SOURCE_WORDS: Readonly<Record<WaterLevelSource, string>> = {
  none: 'no water level: the chart depth',
  predicted: 'the predicted tide',
  dataset: 'the dataset’s water level (chart datum)',
  'predicted+residual': 'the predicted tide plus the dataset’s residual (surge)',
};

/** The water level of each record and where it came from (index into WATER_LEVEL_SOURCES). */
export interface CombinedWaterLevel {
  /** m above the worksite's chart datum; NaN where unknown. */
  levelM: Float64Array;
  source: Uint8Array;
}

const SRC_NONE = WATER_LEVEL_SOURCES.indexOf('none');
const SRC_PREDICTED = WATER_LEVEL_SOURCES.indexOf('predicted');
const SRC_DATASET = WATER_LEVEL_SOURCES.indexOf('dataset');
const SRC_RESIDUAL = WATER_LEVEL_SOURCES.indexOf('predicted+residual');

/**
 * The worksite's water level per record (docs/domain.md#tide):
 * - a dataset level referred to chart datum wins where it has a value; elsewhere the prediction
 *   (NaN, source 'none', without one: the record is then missing);
 * - a residual is added to the prediction where it has a value; elsewhere the prediction alone;
 *   without a prediction a residual cannot give a depth and is not used;
 * - no dataset level: the prediction;
 * - neither: null (the chart depth stays, as without a tide).
 *
 * @param predicted - the predicted tide at the records, m above chart datum, or null (no tide set).
 * @param dataset - the dataset's water-level column and what it holds, or null.
 */
export function combineWaterLevel(
  predicted: Float64Array | null,
  dataset: { values: Float64Array; reference: WaterLevelReference } | null,
): CombinedWaterLevel | null {
  const n = predicted?.length ?? dataset?.values.length ?? 0;
  if (dataset && predicted && dataset.values.length !== predicted.length)
    throw new RangeError('the predicted and the dataset water levels must have the same length');
  const useDataset = dataset !== null && (dataset.reference === 'chart-datum' || predicted !== null);
  if (!predicted && !useDataset) return null;
  const levelM = new Float64Array(n);
  const source = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const p = predicted ? predicted[i] : NaN;
    const d = useDataset ? dataset.values[i] : NaN;
    if (d === d && dataset!.reference === 'chart-datum') {
      levelM[i] = d;
      source[i] = SRC_DATASET;
    } else if (d === d) {
      levelM[i] = p + d;
      source[i] = SRC_RESIDUAL;
    } else {
      levelM[i] = p;
      source[i] = predicted ? SRC_PREDICTED : SRC_NONE;
    }
  }
  return { levelM, source };
}

/** Where the current of a worksite record came from (docs/domain.md#tide). */
export const CURRENT_SOURCES = ['none', 'dataset', 'predicted'] as const;
export type CurrentSource = (typeof CURRENT_SOURCES)[number];

/** Words for each current source, for the chain behind an hour and the conditions page. */
export const CURRENT_SOURCE_WORDS: Readonly<Record<CurrentSource, string>> = {
  none: 'no current',
  dataset: 'the dataset’s current (measured or forecast)',
  predicted: 'the predicted tidal current of the chosen station',
};

/** The current of each record and where it came from (index into CURRENT_SOURCES). */
export interface CombinedCurrent {
  /** m/s; NaN where unknown. */
  speedMps: Float64Array;
  /** degrees true the water flows towards; NaN where unknown. */
  dirDeg: Float64Array;
  source: Uint8Array;
}

/**
 * The worksite's current per record (docs/domain.md#tide), as for the water level: a dataset
 * speed wins where it has a value (with the dataset's direction, NaN where it has none); elsewhere
 * the predicted tidal current (speed and direction); neither: null (a current limit finds no data).
 */
export function combineCurrent(
  predicted: { speedMps: Float64Array; dirDeg: Float64Array } | null,
  dataset: { speedMps: Float64Array; dirDeg: Float64Array | null } | null,
): CombinedCurrent | null {
  if (!predicted && !dataset) return null;
  const n = predicted?.speedMps.length ?? dataset!.speedMps.length;
  if (predicted && dataset && dataset.speedMps.length !== n)
    throw new RangeError('the predicted and the dataset currents must have the same length');
  const speedMps = new Float64Array(n);
  const dirDeg = new Float64Array(n);
  const source = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const d = dataset ? dataset.speedMps[i] : NaN;
    if (d === d) {
      speedMps[i] = d;
      dirDeg[i] = dataset!.dirDeg ? dataset!.dirDeg[i] : NaN;
      source[i] = 1;
    } else if (predicted) {
      speedMps[i] = predicted.speedMps[i];
      dirDeg[i] = predicted.dirDeg[i];
      source[i] = 2;
    } else {
      speedMps[i] = NaN;
      dirDeg[i] = NaN;
    }
  }
  return { speedMps, dirDeg, source };
}
