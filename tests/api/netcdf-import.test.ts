// NetCDF uploads through the real import route (PGlite database, multipart upload). Expected values
// are the CSVs the independent writer (Python's netCDF4, tests/fixtures/netcdf/make_fixtures.py)
// wrote beside each file. Grid positions and distances: see tests/seadata/netcdf.test.ts.
import { readFileSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { MAX_NETCDF_UPLOAD_BYTES } from '../../server/services/dataset-import';
import { readSeries } from '../../server/services/series-store';
import { EXTRA_COLUMNS } from '../../shared/seadata';
import { DEMO_PASSWORD } from '../../seed/scenario';
import { TEST_ORIGIN, useSignedInApp } from '../support/app';

const DIR = path.resolve(import.meta.dirname, '../fixtures/netcdf');

const ctx = useSignedInApp({}, { path: '/datasets' });

const count = async () => (await ctx.as.coordinator.get(ctx.base)).body.length as number;

/** Imports a fixture (or bytes, with a file name) as the coordinator: deep data point, the given form fields. */
function importFile(file: string | Buffer, fields: Record<string, string>, fileName?: string) {
  let req = ctx.as.coordinator.post(ctx.base).field('dataPointDepth', 'deep');
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return typeof file === 'string' ? req.attach('file', path.join(DIR, file)) : req.attach('file', file, fileName);
}

/**
 * A stored column against the script's CSV (plus `add`): NaN where the CSV is empty, else within
 * 1e-6 plus float32's relative precision (2^-23, about 1.2e-7; directions scaled by 360): the
 * script reads float32 values back as float32.
 */
function expectColumn(got: Float64Array, want: (number | null)[], add = 0, scale?: number) {
  expect(got.length).toBe(want.length);
  want.forEach((w, i) => {
    if (w === null) expect(got[i], `time index ${i}`).toBeNaN();
    else
      expect(Math.abs(got[i] - (w + add)), `time index ${i}: ${got[i]} vs ${w + add}`).toBeLessThan(1e-6 + 2e-7 * (scale ?? Math.abs(w)));
  });
}

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
    const res = await ctx.as.coordinator.post(`${ctx.base}/netcdf-points`).attach('file', path.join(DIR, 'grid-3x3.nc'));
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
    const res = await importFile('grid-3x3.nc', { name: 'Grid hindcast', kind: 'hindcast' });
    expect(res.status, res.text).toBe(201);
    expect(res.body.records).toBe(48);
    expect(res.body.netcdf.point).toMatchObject({ index: [1, 1], lat: 50, lon: -6.5, distanceKm: 36.86, chosen: 'nearest' });
    const recs = await ctx.as.coordinator.get(`${ctx.base}/${res.body.id}/records`);
    const want = csvColumn('grid-3x3-j1-i1.csv', 'hs');
    recs.body.hs.forEach((h: number, i: number) => expect(Math.abs(h - want[i]!)).toBeLessThan(1e-6));
    const wind = csvColumn('grid-3x3-j1-i1.csv', 'wind');
    recs.body.wind.forEach((w: number, i: number) => expect(Math.abs(w - wind[i]!)).toBeLessThan(1e-5));
    const detail = await ctx.as.coordinator.get(`${ctx.base}/${res.body.id}`);
    expect(JSON.stringify(detail.body)).toMatch(/36\.86 km from the data point/);
  });

  it('imports another grid point when the coordinator picks it', async () => {
    const res = await importFile('grid-3x3.nc', { name: 'Grid, west point', kind: 'hindcast', gridPoint: '2,0' });
    expect(res.status, res.text).toBe(201);
    expect(res.body.netcdf.point).toMatchObject({ index: [2, 0], lat: 50.5, lon: -7, chosen: 'given' });
    const recs = await ctx.as.coordinator.get(`${ctx.base}/${res.body.id}/records`);
    const want = csvColumn('grid-3x3-j2-i0.csv', 'tp');
    recs.body.tp.forEach((x: number, i: number) => expect(Math.abs(x - want[i]!)).toBeLessThan(1e-5));
    const bad = await importFile('grid-3x3.nc', { name: 'x', kind: 'hindcast', gridPoint: '3,0' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('gridPoint');
  });

  it('a point file with partitions: total from the partitions, partitions and water level (to chart datum) stored, depth from the model', async () => {
    const refused = await importFile('point-partitions.nc', { name: 'Partitions', kind: 'hindcast' });
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toMatch(/variable zeta: water level is given above mean sea level/);
    const res = await importFile('point-partitions.nc', { name: 'Partitions', kind: 'hindcast', waterLevelOffset: '2.1' });
    expect(res.status, res.text).toBe(201);
    expect(res.body.netcdf.partitionsRead).toEqual(['wind sea', 'primary swell', 'secondary swell']);
    // The script writes no secondary-swell direction in this file.
    expect(res.body.netcdf.extraStored).toEqual([
      'swell1.dir',
      'swell1.hs',
      'swell1.tp',
      'swell2.hs',
      'swell2.tp',
      'waterLevel',
      'windSea.dir',
      'windSea.hs',
      'windSea.tp',
    ]);
    expect(res.body.netcdf.notStored).toEqual([]);
    expect(res.body.netcdf.depthM).toBe(42);
    // Water level: the script's level above mean sea level plus the stated 2.1 m to chart datum.
    const stored = await readSeries(ctx.t.deps.db, res.body.id);
    expectColumn(stored.extra.waterLevel!, csvColumn('point-partitions-water-level.csv', 'level_above_msl'), 2.1);
    const recs = await ctx.as.coordinator.get(`${ctx.base}/${res.body.id}/records`);
    const want = csvColumn('point-partitions.csv', 'hs');
    recs.body.hs.forEach((h: number | null, i: number) =>
      want[i] === null ? expect(h).toBeNull() : expect(Math.abs(h! - want[i]!)).toBeLessThan(1e-6),
    );
  });

  it('a file with its variables in groups stores its partitions, water level and current as the script wrote them', async () => {
    const res = await importFile('point-groups.nc', { name: 'Groups', kind: 'hindcast', waterLevelOffset: '0.85' });
    expect(res.status, res.text).toBe(201);
    // make_fixtures.py point_in_groups(): three partitions with Hs, Tp and direction, water level, current.
    expect(res.body.netcdf.extraStored).toEqual([...EXTRA_COLUMNS].sort());
    expect(res.body.variables).toEqual(expect.arrayContaining(['windSea.hs', 'swell2.dir', 'waterLevel', 'currentSpeed', 'currentDir']));
    const detail = await ctx.as.coordinator.get(`${ctx.base}/${res.body.id}`);
    expect(JSON.stringify(detail.body.importReport.notes)).toMatch(
      /stored beside the total sea state: currentDir \(deg\), currentSpeed \(m\/s\)/,
    );
    const s = await readSeries(ctx.t.deps.db, res.body.id);
    const csv = 'point-groups.csv';
    expectColumn(s.hs, csvColumn(csv, 'hs'));
    for (const p of ['windSea', 'swell1', 'swell2']) {
      expectColumn(s.extra[`${p}.hs` as 'windSea.hs']!, csvColumn(csv, `${p}.hs`));
      expectColumn(s.extra[`${p}.tp` as 'windSea.tp']!, csvColumn(csv, `${p}.tp`));
      // The wind sea's direction is written going-to; the CSV holds it turned to coming-from (+180°).
      expectColumn(s.extra[`${p}.dir` as 'windSea.dir']!, csvColumn(csv, `${p}.dir`), 0, 360);
    }
    expectColumn(s.extra.waterLevel!, csvColumn(csv, 'level_above_msl'), 0.85);
    // Current: speed with one fill value (time index 7), direction kept going-to as the file gives it.
    expectColumn(s.extra.currentSpeed!, csvColumn(csv, 'currentSpeed'));
    expect(s.extra.currentSpeed![7]).toBeNaN();
    expectColumn(s.extra.currentDir!, csvColumn(csv, 'currentDir'), 0, 360);
  });

  it('a grid inside a group, current as eastward and northward components: the nearest sea point with speed and going-to direction', async () => {
    const res = await importFile('grid-group.nc', { name: 'Grid in a group', kind: 'hindcast' });
    expect(res.status, res.text).toBe(201);
    // The demo data point (50.041 N, 5.988 W) is nearest to (50.0 N, 6.0 W), index [0, 1] (script's grid).
    expect(res.body.netcdf.point).toMatchObject({ index: [0, 1], lat: 50, lon: -6, chosen: 'nearest' });
    expect(res.body.netcdf.extraStored).toEqual(['currentDir', 'currentSpeed']);
    const s = await readSeries(ctx.t.deps.db, res.body.id);
    const csv = 'grid-group-j0-i1.csv';
    expectColumn(s.hs, csvColumn(csv, 'hs'));
    expectColumn(s.extra.currentSpeed!, csvColumn(csv, 'currentSpeed'));
    expectColumn(s.extra.currentDir!, csvColumn(csv, 'currentDir'), 0, 360);
  });

  it('a NetCDF forecast becomes the latest forecast, issued at its forecast_reference_time', async () => {
    const res = await importFile('forecast.nc', { name: 'Model run 2026-12-01 00Z', kind: 'forecast' });
    expect(res.status, res.text).toBe(201);
    const list = (await ctx.as.coordinator.get(ctx.base)).body as { id: string; kind: string; source: { issuedAt: string | null } }[];
    const mine = list.find((d) => d.id === res.body.id)!;
    expect(mine.source.issuedAt).toBe('2026-12-01T00:00:00.000Z');
    const forecasts = list
      .filter((d) => d.kind === 'forecast')
      .sort((a, b) => (b.source.issuedAt ?? '').localeCompare(a.source.issuedAt ?? ''));
    expect(forecasts[0].id).toBe(res.body.id);
  });

  it('refuses a non-standard calendar and a file that claims NetCDF but is not, storing nothing', async () => {
    const before = await count();
    const cal = await importFile('noleap.nc', { name: 'noleap', kind: 'hindcast' });
    expect(cal.status).toBe(400);
    expect(cal.body.error.message).toMatch(/variable time: calendar "noleap" is not supported/);
    const fake = await importFile(
      Buffer.from('time,hs\n2024-01-01T00:00Z,1\n'),
      { name: 'fake', kind: 'hindcast', format: 'netcdf' },
      'fake.nc',
    );
    expect(fake.status).toBe(400);
    expect(fake.body.error.message).toMatch(/not a NetCDF file/);
    expect(await count()).toBe(before);
  });

  it('refuses a NetCDF-4 file that makes the HDF5 reader loop within the time limit, answering other requests meanwhile, storing nothing', async () => {
    // grid-group.nc with byte 6,660 set to 111: HDF5's dimension-scale lookup loops without end
    // (found by tests/seadata/netcdf-fuzz.test.ts); the upload is read on a worker thread stopped
    // after NETCDF_TIME_LIMIT_MS (here 2 s).
    const bytes = readFileSync(path.join(DIR, 'grid-group.nc'));
    bytes[6660] = 111;
    const before = await count();
    const saved = process.env.NETCDF_TIME_LIMIT_MS;
    process.env.NETCDF_TIME_LIMIT_MS = '2000';
    try {
      let doneAt = 0;
      const upload = importFile(bytes, { name: 'looping', kind: 'hindcast' }, 'looping.nc').then((r) => {
        doneAt = performance.now();
        return r;
      });
      // Another request while the upload is being read: answered before the upload is refused.
      await new Promise((r) => setTimeout(r, 200));
      const other = await ctx.as.coordinator.get(ctx.base);
      const otherAt = performance.now();
      expect(other.status).toBe(200);
      const res = await upload;
      expect(otherAt).toBeLessThan(doneAt);
      expect(res.status, res.text).toBe(400);
      expect(res.body.error.message).toMatch(/^The NetCDF file could not be read within 2 s: it may be damaged/);
    } finally {
      if (saved === undefined) delete process.env.NETCDF_TIME_LIMIT_MS;
      else process.env.NETCDF_TIME_LIMIT_MS = saved;
    }
    expect(await count()).toBe(before);
  }, 180_000);

  it("classic and packed files import with the writer's values", async () => {
    for (const [file, csv, key] of [
      ['classic.nc', 'classic.csv', 'te'],
      ['packed.nc', 'packed.csv', 'hs'],
    ] as const) {
      const res = await importFile(file, { name: file, kind: 'hindcast' });
      expect(res.status, res.text).toBe(201);
      const recs = await ctx.as.coordinator.get(`${ctx.base}/${res.body.id}/records`);
      const want = csvColumn(csv, key);
      recs.body[key].forEach((x: number | null, i: number) =>
        want[i] === null ? expect(x).toBeNull() : expect(Math.abs(x! - want[i]!)).toBeLessThan(1e-5),
      );
    }
  });
});

describe('NetCDF upload limits', () => {
  /** Sends only the start of a body that declares `declared` bytes; resolves with the answer. */
  async function declareHuge(declared: number, first: Buffer): Promise<{ status: number; body: string; sent: number }> {
    const server = http.createServer(ctx.t.app);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    try {
      const signIn = await request(ctx.t.app)
        .post('/api/auth/sign-in/email')
        .set('Origin', TEST_ORIGIN)
        .send({ email: 'coordinator@example.com', password: DEMO_PASSWORD });
      const cookie = (signIn.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
      const boundary = 'lullwatch-limit-test';
      const head = Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="name"\r\n\r\nHuge\r\n` +
          `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="huge.nc"\r\nContent-Type: application/x-netcdf\r\n\r\n`,
      );
      return await new Promise((resolve, reject) => {
        const req = http.request({
          host: '127.0.0.1',
          port: (server.address() as AddressInfo).port,
          method: 'POST',
          path: `${ctx.base}`,
          headers: {
            'content-type': `multipart/form-data; boundary=${boundary}`,
            'content-length': String(declared),
            origin: TEST_ORIGIN,
            cookie,
          },
        });
        let sent = 0;
        req.on('response', (res) => {
          let body = '';
          res.setEncoding('utf8');
          res.on('data', (c: string) => (body += c));
          res.on('end', () => {
            req.destroy();
            resolve({ status: res.statusCode ?? 0, body, sent });
          });
        });
        req.on('error', reject);
        // The start of the body only: the answer must come without the rest.
        for (const part of [head, first]) {
          sent += part.length;
          req.write(part);
        }
        setTimeout(() => reject(new Error('no answer within 30 s to a body declared over the limit')), 30_000).unref();
      });
    } finally {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    }
  }

  it('answers 413 to a NetCDF upload declared over 2 GB before reading its body, storing nothing', async () => {
    const before = await count();
    // The limit: 2 GB for NetCDF. The file's first bytes are a real NetCDF-4 file's.
    const nc = readFileSync(path.join(DIR, 'point-groups.nc')).subarray(0, 4096);
    const res = await declareHuge(MAX_NETCDF_UPLOAD_BYTES + 8 * 1024 * 1024, nc);
    expect(res.status, res.body).toBe(413);
    expect(JSON.parse(res.body).error).toMatchObject({ code: 'too_large', message: expect.stringMatching(/NetCDF upload limit of 2 GB/) });
    expect(res.sent).toBeLessThan(8 * 1024);
    expect(await count()).toBe(before);
  }, 60_000);

  it('takes a NetCDF file over the 100 MB text limit (refused for its content, not its size), and binary content only as NetCDF', async () => {
    const before = await count();
    // 101 MB with a classic NetCDF signature (netCDF classic format specification: 'C', 'D', 'F', 1)
    // and an empty header: over the text limit, under the NetCDF one.
    const big = Buffer.alloc(101 * 1024 * 1024);
    big.write('CDF\x01', 0, 'latin1');
    const res = await importFile(big, { name: 'Big classic', kind: 'hindcast' }, 'big.nc');
    expect(res.status, res.text).toBe(400);
    expect(res.body.error.message).toMatch(/time/);
    // The same bytes without the signature are binary text: refused as binary, naming line and column.
    const notNc = await importFile(Buffer.from('XDF\x01\x00\x00\x00\x00', 'latin1'), { name: 'Binary', kind: 'hindcast' }, 'x.nc');
    expect(notNc.status).toBe(400);
    expect(notNc.body.error.message).toMatch(/not a text file: it holds binary data \(control character U\+0001 at line 1, column 4\)/);
    expect(await count()).toBe(before);
  }, 120_000);
});
