// NetCDF uploads through the real import route (PGlite database, multipart upload). Expected values
// are the CSVs the independent writer (Python's netCDF4, tests/fixtures/netcdf/make_fixtures.py)
// wrote beside each file. Grid positions and distances: see tests/seadata/netcdf.test.ts.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signInAll, type TestApp } from '../support/app';

const DIR = path.resolve(import.meta.dirname, '../fixtures/netcdf');

let t: TestApp;
let as: Awaited<ReturnType<typeof signInAll>>;
let base: string;

beforeAll(async () => {
  t = await createTestApp();
  as = await signInAll(t.app);
  base = `/api/projects/${t.demo.projectId}/datasets`;
});
afterAll(async () => {
  await t.close();
});

const count = async () => (await as.coordinator.get(base)).body.length as number;

function csvColumn(name: string, key: string): (number | null)[] {
  const [head, ...rows] = readFileSync(path.join(DIR, name), 'utf8').trim().split('\n');
  const k = head.split(',').indexOf(key);
  return rows.map((r) => {
    const c = r.split(',')[k];
    return c === '' ? null : Number(c);
  });
}

describe('NetCDF import route', () => {
  it('lists the grid points and the nearest sea point to the demo data point, storing nothing', async () => {
    const before = await count();
    const res = await as.coordinator.post(`${base}/netcdf-points`).attach('file', path.join(DIR, 'grid-3x3.nc'));
    expect(res.status, res.text).toBe(200);
    expect(res.body.points).toHaveLength(9);
    expect(res.body.nearest).toEqual([1, 1]);
    expect(res.body.dimensions).toEqual(['latitude', 'longitude']);
    // The land point (50, -6) is listed with all values missing, 4.64 km away.
    expect(res.body.points[5]).toMatchObject({ index: [1, 2], lat: 50, lon: -6, missingShare: 1, distanceKm: 4.64 });
    expect(res.body.times).toEqual({ count: 48, first: '2024-03-01T00:00:00.000Z', last: '2024-03-02T23:00:00.000Z' });
    expect(await count()).toBe(before);
  });

  it("imports the grid at the nearest sea point; the stored records equal the writer's values there", async () => {
    const res = await as.coordinator
      .post(base)
      .field('name', 'Grid hindcast')
      .field('kind', 'hindcast')
      .field('dataPointDepth', 'deep')
      .attach('file', path.join(DIR, 'grid-3x3.nc'));
    expect(res.status, res.text).toBe(201);
    expect(res.body.records).toBe(48);
    expect(res.body.netcdf.point).toMatchObject({ index: [1, 1], lat: 50, lon: -6.5, distanceKm: 36.86, chosen: 'nearest' });
    const recs = await as.coordinator.get(`${base}/${res.body.id}/records`);
    const want = csvColumn('grid-3x3-j1-i1.csv', 'hs');
    recs.body.hs.forEach((h: number, i: number) => expect(Math.abs(h - want[i]!)).toBeLessThan(1e-6));
    const wind = csvColumn('grid-3x3-j1-i1.csv', 'wind');
    recs.body.wind.forEach((w: number, i: number) => expect(Math.abs(w - wind[i]!)).toBeLessThan(1e-5));
    const detail = await as.coordinator.get(`${base}/${res.body.id}`);
    expect(JSON.stringify(detail.body)).toMatch(/36\.86 km from the data point/);
  });

  it('imports another grid point when the coordinator picks it', async () => {
    const res = await as.coordinator
      .post(base)
      .field('name', 'Grid, west point')
      .field('kind', 'hindcast')
      .field('dataPointDepth', 'deep')
      .field('gridPoint', '2,0')
      .attach('file', path.join(DIR, 'grid-3x3.nc'));
    expect(res.status, res.text).toBe(201);
    expect(res.body.netcdf.point).toMatchObject({ index: [2, 0], lat: 50.5, lon: -7, chosen: 'given' });
    const recs = await as.coordinator.get(`${base}/${res.body.id}/records`);
    const want = csvColumn('grid-3x3-j2-i0.csv', 'tp');
    recs.body.tp.forEach((x: number, i: number) => expect(Math.abs(x - want[i]!)).toBeLessThan(1e-5));
    const bad = await as.coordinator
      .post(base)
      .field('name', 'x')
      .field('kind', 'hindcast')
      .field('dataPointDepth', 'deep')
      .field('gridPoint', '3,0')
      .attach('file', path.join(DIR, 'grid-3x3.nc'));
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('gridPoint');
  });

  it('a point file with partitions: total from the partitions, partitions reported as read and not stored, depth from the model', async () => {
    const refused = await as.coordinator
      .post(base)
      .field('name', 'Partitions')
      .field('kind', 'hindcast')
      .field('dataPointDepth', 'deep')
      .attach('file', path.join(DIR, 'point-partitions.nc'));
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toMatch(/variable zeta: water level is given above mean sea level/);
    const res = await as.coordinator
      .post(base)
      .field('name', 'Partitions')
      .field('kind', 'hindcast')
      .field('dataPointDepth', 'deep')
      .field('waterLevelOffset', '2.1')
      .attach('file', path.join(DIR, 'point-partitions.nc'));
    expect(res.status, res.text).toBe(201);
    expect(res.body.netcdf.partitionsRead).toEqual(['wind sea', 'primary swell', 'secondary swell']);
    expect(res.body.netcdf.notStored[0]).toMatch(/partitions read but not stored/);
    expect(res.body.netcdf.depthM).toBe(42);
    const recs = await as.coordinator.get(`${base}/${res.body.id}/records`);
    const want = csvColumn('point-partitions.csv', 'hs');
    recs.body.hs.forEach((h: number | null, i: number) =>
      want[i] === null ? expect(h).toBeNull() : expect(Math.abs(h! - want[i]!)).toBeLessThan(1e-6),
    );
  });

  it('a NetCDF forecast becomes the latest forecast, issued at its forecast_reference_time', async () => {
    const res = await as.coordinator
      .post(base)
      .field('name', 'Model run 2026-12-01 00Z')
      .field('kind', 'forecast')
      .field('dataPointDepth', 'deep')
      .attach('file', path.join(DIR, 'forecast.nc'));
    expect(res.status, res.text).toBe(201);
    const list = (await as.coordinator.get(base)).body as { id: string; kind: string; source: { issuedAt: string | null } }[];
    const mine = list.find((d) => d.id === res.body.id)!;
    expect(mine.source.issuedAt).toBe('2026-12-01T00:00:00.000Z');
    const forecasts = list
      .filter((d) => d.kind === 'forecast')
      .sort((a, b) => (b.source.issuedAt ?? '').localeCompare(a.source.issuedAt ?? ''));
    expect(forecasts[0].id).toBe(res.body.id);
  });

  it('refuses a non-standard calendar and a file that claims NetCDF but is not, storing nothing', async () => {
    const before = await count();
    const cal = await as.coordinator
      .post(base)
      .field('name', 'noleap')
      .field('kind', 'hindcast')
      .field('dataPointDepth', 'deep')
      .attach('file', path.join(DIR, 'noleap.nc'));
    expect(cal.status).toBe(400);
    expect(cal.body.error.message).toMatch(/variable time: calendar "noleap" is not supported/);
    const fake = await as.coordinator
      .post(base)
      .field('name', 'fake')
      .field('kind', 'hindcast')
      .field('format', 'netcdf')
      .field('dataPointDepth', 'deep')
      .attach('file', Buffer.from('time,hs\n2024-01-01T00:00Z,1\n'), 'fake.nc');
    expect(fake.status).toBe(400);
    expect(fake.body.error.message).toMatch(/not a NetCDF file/);
    expect(await count()).toBe(before);
  });

  it("classic and packed files import with the writer's values", async () => {
    for (const [file, csv, key] of [
      ['classic.nc', 'classic.csv', 'te'],
      ['packed.nc', 'packed.csv', 'hs'],
    ] as const) {
      const res = await as.coordinator
        .post(base)
        .field('name', file)
        .field('kind', 'hindcast')
        .field('dataPointDepth', 'deep')
        .attach('file', path.join(DIR, file));
      expect(res.status, res.text).toBe(201);
      const recs = await as.coordinator.get(`${base}/${res.body.id}/records`);
      const want = csvColumn(csv, key);
      recs.body[key].forEach((x: number | null, i: number) =>
        want[i] === null ? expect(x).toBeNull() : expect(Math.abs(x! - want[i]!)).toBeLessThan(1e-5),
      );
    }
  });
});
