// Dataset answers shared by the API and the client.
export interface DatasetSummary {
  id: string;
  name: string;
  kind: 'hindcast' | 'forecast' | 'observation';
  dataPoint: { name: string; latitude: number | null; longitude: number | null; depthM: number | null };
  source: { kind: 'upload' | 'service'; fileName: string | null; format: string | null; issuedAt: string | null };
  stepMinutes: number;
  start: string;
  end: string;
  records: number;
  variables: string[];
  missing: Record<string, number>;
  derived: Record<string, number>;
  /** Share of records missing Hs, 0-1. */
  missingShare: number;
  /**
   * Wind height correction used at import: the anemometer height (m above the sea, 10 = already at
   * 10 m) and the exponent a of U10 = Uz (10/z)^a; nulls when not stated (forecasts from the
   * service, datasets stored before this was asked).
   */
  wind: { anemometerHeightM: number | null; exponent: number | null };
  /**
   * What the dataset's water-level column holds (docs/domain.md#tide): 'chart-datum' (m above the
   * worksite's chart datum, wins over the predicted tide) or 'residual' (surge added to it); null
   * without a water-level column.
   */
  waterLevelReference: 'chart-datum' | 'residual' | null;
  /** Records a regular series of this step would hold from start to end. */
  expectedRecords: number;
  /** Of those, rows absent from the data altogether (not the same as a row with a missing value). */
  absentRecords: number;
  /** Share of the expected records without an Hs value: missing values and absent rows together, 0-1. */
  hsGapShare: number;
  /** Ensemble members stored beside the control (0: a single forecast; docs/domain.md#forecast-uncertainty). */
  ensembleMembers: number;
  /** In the project's list: the dataset statistics use when none is named (chosen, else the newest hindcast). */
  statisticsDefault?: boolean;
  createdAt: string;
}

export interface DatasetDetail extends DatasetSummary {
  importReport: Record<string, unknown>;
}

/** 201 answer of an import. */
export interface ImportAnswer {
  id: string;
  records: number;
  start: string;
  end: string;
  stepMinutes: number;
  variables: string[];
  missing: Record<string, number>;
  skipped: number;
  /** The wind height correction used (see DatasetSummary.wind). */
  wind: { anemometerHeightM: number | null; exponent: number | null };
  /** Set when this import made a dataset shorter than a year the default for statistics. */
  warning: string | null;
  /** NetCDF imports: the point read, the variables used and what was read but not stored. */
  netcdf?: NetcdfImportInfo;
}

/** One point of a NetCDF grid, as listed for choosing. */
export interface NetcdfGridPoint {
  /** Index along the grid's dimensions (send it back as `gridPoint`). */
  index: number[];
  lat: number | null;
  lon: number | null;
  /** Share of the wave height values missing, 0-1 (over 0.5 is never chosen by default). */
  missingShare: number;
  /** Great-circle distance to the project's data point, km (null without positions). */
  distanceKm: number | null;
}

/** What a NetCDF file holds, before import (`POST .../datasets/netcdf-points`). */
export interface NetcdfPointsAnswer {
  format: 'netcdf4' | 'classic';
  dimensions: string[];
  points: NetcdfGridPoint[];
  /** Index of the sea point nearest the data point (null: none qualifies or no positions). */
  nearest: number[] | null;
  dataPoint: { name: string; lat: number | null; lon: number | null };
  /** Variables found, role = variable (how it was found). */
  variables: { role: string; variable: string; via: string }[];
  times: { count: number; first: string | null; last: string | null };
}

/** The NetCDF part of an import report. */
export interface NetcdfImportInfo {
  format: 'netcdf4' | 'classic';
  point: {
    index: number[];
    lat: number | null;
    lon: number | null;
    distanceKm: number | null;
    missingShare: number;
    chosen: 'nearest' | 'given' | 'single';
  };
  variables: { role: string; variable: string; via: string }[];
  /** Partitions found in the file (wind sea, primary swell...). */
  partitionsRead: string[];
  /**
   * Optional columns stored beside the total sea state (`windSea.hs`, `swell1.tp`, `waterLevel`,
   * `currentSpeed`, ...; shared/seadata/extra-columns.ts), sorted.
   */
  extraStored: string[];
  /** Plain statement of what was read but is not stored (the swell as a whole). */
  notStored: string[];
  notes: string[];
  depthM: number | null;
}

/** The sea-state columns every series answer has, one value per record: Hs, Tp, direction, wind speed; null = missing. */
export interface SeaStateColumns {
  hs: (number | null)[];
  tp: (number | null)[];
  dir: (number | null)[];
  wind: (number | null)[];
}

/** Records as columnar arrays; times ISO UTC; null = missing. */
export interface RecordsAnswer extends SeaStateColumns {
  time: string[];
  tz: (number | null)[];
  te: (number | null)[];
  windDir: (number | null)[];
  /** Per record: which periods were given in the source (the rest derived). */
  given: { tp: boolean[]; tz: boolean[]; te: boolean[] };
}

export interface MonthlySummaryRow {
  year: number;
  month: number;
  records: number;
  coverage: number;
  hsMean: number | null;
  hsP90: number | null;
}
