/**
 * Optional columns of a sea-state series: values some datasets carry beside the total sea state
 * (docs/domain.md#tide for water level and current, docs/domain.md#partitions for wind sea and
 * swells). A dataset either has a column or not; within a column NaN means a missing value.
 *
 * Units (SI, docs/domain.md#units):
 * - `waterLevel`: m (its reference, chart datum or a residual to add to the predicted tide, is
 *   stated by the dataset, never guessed);
 * - `currentSpeed`: m/s; `currentDir`: degrees clockwise from true north (the convention of the
 *   importer that fills it is documented beside it);
 * - `<partition>.hs` m, `<partition>.tp` s, `<partition>.dir` degrees coming from, for the wind sea
 *   and up to two swells.
 */

/** The optional columns, in storage order. */
export const EXTRA_COLUMNS = [
  'waterLevel',
  'currentSpeed',
  'currentDir',
  'windSea.hs',
  'windSea.tp',
  'windSea.dir',
  'swell1.hs',
  'swell1.tp',
  'swell1.dir',
  'swell2.hs',
  'swell2.tp',
  'swell2.dir',
] as const;

/** One of {@link EXTRA_COLUMNS}. */
export type ExtraColumn = (typeof EXTRA_COLUMNS)[number];

/** Unit of each optional column, for reports and headers. */
export const EXTRA_COLUMN_UNITS: Readonly<Record<ExtraColumn, string>> = {
  waterLevel: 'm',
  currentSpeed: 'm/s',
  currentDir: 'deg',
  'windSea.hs': 'm',
  'windSea.tp': 's',
  'windSea.dir': 'deg',
  'swell1.hs': 'm',
  'swell1.tp': 's',
  'swell1.dir': 'deg',
  'swell2.hs': 'm',
  'swell2.tp': 's',
  'swell2.dir': 'deg',
};

/** The optional columns a series has; a missing key means the dataset does not have it. */
export type ExtraSeries = Partial<Record<ExtraColumn, Float64Array>>;

const KNOWN = new Set<string>(EXTRA_COLUMNS);

/** True when `name` is one of {@link EXTRA_COLUMNS}. */
export function isExtraColumn(name: string): name is ExtraColumn {
  return KNOWN.has(name);
}

/** The columns present in `extra`, in storage order. */
export function presentExtraColumns(extra: ExtraSeries): ExtraColumn[] {
  return EXTRA_COLUMNS.filter((c) => extra[c] !== undefined);
}

/** Records lo (inclusive) to hi (exclusive) of every present column, copied. */
export function sliceExtra(extra: ExtraSeries, lo: number, hi: number): ExtraSeries {
  const out: ExtraSeries = {};
  for (const c of presentExtraColumns(extra)) out[c] = extra[c]!.slice(lo, hi);
  return out;
}
