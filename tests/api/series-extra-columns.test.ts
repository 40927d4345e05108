/**
 * Optional series columns (water level, current, partitions) stored beside the sea state and read
 * back unchanged, across chunk boundaries and with range reads (docs/domain.md#tide,
 * docs/domain.md#partitions). Expected values are the ones written, so each check is a round trip.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Database } from '../../server/db/client';
import { project } from '../../server/db/schema';
import { createDataset, getDataset } from '../../server/services/datasets';
import { toSeaSeries } from '../../server/services/sea-series';
import { CHUNK_RECORDS, readSeries } from '../../server/services/series-store';
import { SeaRecordBuilder } from '../../shared/seadata';
import { createTestDatabase } from '../support/db';

const HOUR = 3_600_000;
const T0 = Date.UTC(2020, 0, 1);
const N = CHUNK_RECORDS + 500; // two chunks

let database: Database;
let projectId: string;

beforeAll(async () => {
  database = await createTestDatabase();
  const [p] = await database.db.insert(project).values({ name: 'Extra columns' }).returning();
  projectId = p.id;
});
afterAll(async () => database?.close());

function meta(name: string) {
  return {
    projectId,
    createdBy: null,
    name,
    kind: 'hindcast' as const,
    dataPointName: 'P',
    dataPointLatitude: null,
    dataPointLongitude: null,
    dataPointDepthM: null,
    sourceKind: 'upload' as const,
  };
}

describe('optional series columns', () => {
  it('come back unchanged, in both chunks, with missing values kept as NaN', async () => {
    const b = new SeaRecordBuilder().withExtra(['waterLevel', 'swell1.hs']);
    for (let i = 0; i < N; i++) {
      b.pushValues(T0 + i * HOUR, 1 + (i % 7) / 10, 9, NaN, NaN, 250, 8, 240);
      b.setExtra('waterLevel', i % 100 === 0 ? NaN : Math.sin(i / 10));
      b.setExtra('swell1.hs', 0.5 + (i % 13) / 100);
    }
    const records = b.finish();
    const row = await createDataset(database.db, meta('with extras'), toSeaSeries(records), {});
    const back = await readSeries(database.db, row.id);
    expect(Object.keys(back.extra).sort()).toEqual(['swell1.hs', 'waterLevel']);
    expect(Array.from(back.extra.waterLevel!)).toEqual(Array.from(records.extra!.waterLevel!));
    expect(Array.from(back.extra['swell1.hs']!)).toEqual(Array.from(records.extra!['swell1.hs']!));
    expect(Number.isNaN(back.extra.waterLevel![CHUNK_RECORDS])).toBe(CHUNK_RECORDS % 100 === 0);

    const detail = await getDataset(database.db, projectId, row.id);
    expect(detail.variables).toContain('waterLevel');
    expect(detail.missing.waterLevel).toBe(Math.ceil(N / 100));

    // A range read across the chunk boundary slices the optional columns with the rest.
    const from = T0 + (CHUNK_RECORDS - 3) * HOUR;
    const part = await readSeries(database.db, row.id, { fromMs: from, toMs: from + 5 * HOUR });
    expect(part.timeMs.length).toBe(6);
    expect(Array.from(part.extra['swell1.hs']!)).toEqual(
      Array.from(records.extra!['swell1.hs']!.subarray(CHUNK_RECORDS - 3, CHUNK_RECORDS + 3)),
    );
  });

  it('a series without them reads back with none', async () => {
    const b = new SeaRecordBuilder();
    for (let i = 0; i < 10; i++) b.pushValues(T0 + i * HOUR, 1, 9, NaN, NaN, 250, 8, 240);
    const row = await createDataset(database.db, meta('plain'), toSeaSeries(b.finish()), {});
    const back = await readSeries(database.db, row.id);
    expect(back.extra).toEqual({});
  });

  it('the builder refuses a value for a column it was not given', () => {
    const b = new SeaRecordBuilder();
    b.pushValues(T0, 1, 9, NaN, NaN, 250, 8, 240);
    expect(() => b.setExtra('waterLevel', 1)).toThrow(/waterLevel was not switched on/);
  });
});

describe('the CSV download', () => {
  it('carries the optional columns after the others', async () => {
    const { seriesCsv } = await import('../../server/services/datasets');
    const b = new SeaRecordBuilder().withExtra(['waterLevel', 'currentSpeed']);
    b.pushValues(T0, 1, 9, NaN, NaN, 250, 8, 240);
    b.setExtra('waterLevel', 1.25);
    const text = [...seriesCsv(toSeaSeries(b.finish()))].join('');
    const [header, first] = text.trim().split('\n');
    expect(header.split(',').slice(-2)).toEqual(['waterLevel_m', 'currentSpeed_mps']);
    expect(first.split(',').slice(-2)).toEqual(['1.250', '']);
  });
});
