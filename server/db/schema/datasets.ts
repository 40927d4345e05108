import { customType, doublePrecision, index, integer, jsonb, pgTable, primaryKey, text } from 'drizzle-orm/pg-core';
import { idColumn, instantColumn, ownerColumn, stampColumn } from './columns';
import { user } from './auth';
import { projectIdColumn } from './projects';

/** Raw bytes: packed typed arrays (little-endian) of one chunk of a series. */
export const bytea = customType<{ data: Uint8Array; driverData: Uint8Array }>({
  dataType: () => 'bytea',
});

/** One packed column of a chunk (a value per record), required. */
const packedColumn = () => bytea().notNull();

/** The packed columns a forecast member stores, as its control's chunk does: Hs, Tp, direction, wind and its direction. */
const memberColumns = () => ({
  hs: packedColumn(),
  tp: packedColumn(),
  dir: packedColumn(),
  wind: packedColumn(),
  windDir: packedColumn(),
});

export const DATASET_KIND_VALUES = ['hindcast', 'forecast', 'observation'] as const;

export const dataset = pgTable(
  'dataset',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    name: text().notNull(),
    kind: text({ enum: DATASET_KIND_VALUES }).notNull(),
    dataPointName: text().notNull().default(''),
    dataPointLatitude: doublePrecision(),
    dataPointLongitude: doublePrecision(),
    /** metres; null = deep water */
    dataPointDepthM: doublePrecision(),
    /** 'upload' (with the original file name) or 'service' (with the forecast issue time). */
    sourceKind: text({ enum: ['upload', 'service'] }).notNull(),
    originalFileName: text(),
    format: text(),
    issuedAt: instantColumn(),
    stepMinutes: doublePrecision().notNull(),
    startAt: instantColumn().notNull(),
    endAt: instantColumn().notNull(),
    recordCount: integer().notNull(),
    variables: jsonb().$type<string[]>().notNull(),
    missing: jsonb().$type<Record<string, number>>().notNull(),
    /** How many records had each period derived (JONSWAP ratios) rather than given. */
    derived: jsonb().$type<Record<string, number>>().notNull(),
    /**
     * Height of the wind measurement above the sea, m, as given at import (10 = already at 10 m);
     * null when the dataset has no wind correction to state (a forecast from the service, or
     * stored before the height was asked for).
     */
    anemometerHeightM: doublePrecision(),
    /** Power-law exponent a of U10 = Uz (10/z)^a used at import; null as above. */
    windExponent: doublePrecision(),
    /**
     * What the dataset's water-level column holds (docs/domain.md#tide): 'chart-datum' (m above the
     * worksite's chart datum, wins over the prediction) or 'residual' (surge, added to the
     * prediction); null without a water-level column.
     */
    waterLevelReference: text({ enum: ['chart-datum', 'residual'] }),
    /**
     * Ensemble members stored beside the control (the dataset's own series is the control, member 0);
     * 0 without an ensemble (docs/domain.md#forecast-uncertainty). Their series: forecast_member.
     */
    ensembleMembers: integer().notNull().default(0),
    /** Import report: options used, skipped rows. */
    importReport: jsonb().$type<Record<string, unknown>>().notNull(),
    createdBy: text().references(() => user.id, { onDelete: 'set null' }),
    createdAt: stampColumn(),
  },
  (t) => [index().on(t.projectId, t.kind, t.issuedAt)],
);

/**
 * A series in columnar chunks of up to CHUNK_RECORDS records: times and values as packed
 * Float64 (NaN = missing), the given-period bitmask as bytes. One row per chunk reads back an
 * order of magnitude faster than one row per record on PGlite.
 */
export const datasetChunk = pgTable(
  'dataset_chunk',
  {
    datasetId: ownerColumn(() => dataset.id),
    seq: integer().notNull(),
    startAt: instantColumn().notNull(),
    endAt: instantColumn().notNull(),
    count: integer().notNull(),
    timeMs: packedColumn(),
    ...memberColumns(),
    tz: packedColumn(),
    te: packedColumn(),
    givenPeriods: packedColumn(),
    /** Names of the optional columns in `extra`, in order (shared/seadata/extra-columns.ts). */
    extraColumns: jsonb().$type<string[]>().notNull().default([]),
    /** The optional columns' packed Float64 values, one column after the other; null when none. */
    extra: bytea(),
  },
  (t) => [primaryKey({ columns: [t.datasetId, t.seq] })],
);

/**
 * The members of an ensemble forecast beside its control, columnar like dataset_chunk: one row
 * per (dataset, member, chunk), the values as packed Float64 (NaN = missing) aligned with the
 * dataset chunk of the same seq (the member has the control's times, which are not stored again).
 * Periods other than Tp are derived on reading (docs/domain.md#sea-states).
 */
export const forecastMember = pgTable(
  'forecast_member',
  {
    datasetId: ownerColumn(() => dataset.id),
    member: integer().notNull(),
    seq: integer().notNull(),
    count: integer().notNull(),
    ...memberColumns(),
  },
  (t) => [primaryKey({ columns: [t.datasetId, t.member, t.seq] })],
);
