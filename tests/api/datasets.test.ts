import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { useSignedInApp, postForm } from '../support/app';
import { createApp } from '../../server/app';

// Real NDBC buoy data (public domain, NOAA NDBC), copied unchanged into tests/fixtures/ndbc.
const NDBC_FIXTURES = path.resolve(import.meta.dirname, '../fixtures/ndbc');

const ctx = useSignedInApp({}, { path: '/datasets' });

async function datasetCount(): Promise<number> {
  return (await ctx.as.coordinator.get(ctx.base)).body.length;
}

describe('importing sea-state files', () => {
  it('refuses an NDBC file with wind but no anemometerHeight (400 naming the field), storing nothing', async () => {
    const before = await datasetCount();
    const res = await postForm(
      ctx.as.coordinator,
      ctx.base,
      { name: 'Buoy 46026, no height', kind: 'observation', format: 'auto', dataPointDepth: 'deep' },
      path.join(NDBC_FIXTURES, '46026h2016.txt'),
    );
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ field: 'anemometerHeight', message: 'is required for an NDBC file with wind' }]);
    expect(await datasetCount()).toBe(before);
  });

  it('imports a real NDBC historical file and reads it back as columns, wind brought to 10 m', async () => {
    const res = await postForm(
      ctx.as.coordinator,
      ctx.base,
      { name: 'Buoy 46026, 2016', kind: 'observation', format: 'auto', dataPointDepth: 'deep', anemometerHeight: '4.1' },
      path.join(NDBC_FIXTURES, '46026h2016.txt'),
    );
    expect(res.status, res.text).toBe(201);
    expect(res.body.wind).toEqual({ anemometerHeightM: 4.1, exponent: 0.11 });
    // tests/fixtures/ndbc/README.md: 8655 data rows, 2015-12-31 23:50 to 2016-12-31 22:50 UTC.
    expect(res.body.records).toBe(8655);
    expect(res.body.start).toBe('2015-12-31T23:50:00.000Z');
    expect(res.body.end).toBe('2016-12-31T22:50:00.000Z');
    expect(res.body.stepMinutes).toBe(60);

    const recs = await ctx.as.client.get(`${ctx.base}/${res.body.id}/records?from=2016-01-01T00:00:00Z&to=2016-01-01T01:59:00Z`);
    expect(recs.status).toBe(200);
    // Raw lines: "2016 01 01 00 50 100  1.3  2.0  1.21 13.79  8.40 276 ..." and
    //            "2016 01 01 01 50  43  1.8  2.5  1.18 10.81  8.49 274 ..."
    expect(recs.body.time).toEqual(['2016-01-01T00:50:00.000Z', '2016-01-01T01:50:00.000Z']);
    expect(recs.body.hs).toEqual([1.21, 1.18]);
    expect(recs.body.tp).toEqual([13.79, 10.81]);
    expect(recs.body.tz).toEqual([8.4, 8.49]);
    expect(recs.body.dir).toEqual([276, 274]);
    expect(recs.body.windDir).toEqual([100, 43]);
    // WSPD 1.3 and 1.8 m/s at 4.1 m; U10 = Uz (10/4.1)^0.11 (Hsu, Meindl & Gilhousen 1994), factor
    // 1.103046 worked by hand in tests/seadata/ndbc.test.ts: 1.43396 and 1.98548 m/s.
    expect(Math.abs(recs.body.wind[0] - 1.43396)).toBeLessThan(5e-5);
    expect(Math.abs(recs.body.wind[1] - 1.98548)).toBeLessThan(5e-5);
    expect(recs.body.given.tp).toEqual([true, true]);
    expect(recs.body.given.te).toEqual([false, false]); // Te derived from Tp (docs/domain.md#convention-8)
    expect(recs.body.te[0]).toBeCloseTo(0.9 * 13.79, 1);

    const detail = await ctx.as.skipper.get(`${ctx.base}/${res.body.id}`);
    expect(detail.body.source).toMatchObject({ kind: 'upload', fileName: '46026h2016.txt', format: 'ndbc' });
    expect(detail.body.dataPoint.depthM).toBeNull();
    expect(detail.body.wind).toEqual({ anemometerHeightM: 4.1, exponent: 0.11 });
    expect(detail.body.importReport).toMatchObject({ anemometerHeightM: 4.1, windExponent: 0.11 });
    expect(String(detail.body.importReport.notes)).toMatch(/anemometer height 4\.1 m to 10 m/);
  });

  it('imports a CSV with the mapping, units and time zone given', async () => {
    const csv = '\uFEFFDate;Hm0 [ft];Tp;Wind speed (kn)\r\n2026-03-29 00:00;3,28084;8,0;10\r\n2026-03-29 03:00;6,56168;9,5;20\r\n';
    const res = await postForm(
      ctx.as.coordinator,
      ctx.base,
      {
        name: 'Consultant extract',
        kind: 'hindcast',
        dataPointDepth: '35',
        timeZone: 'Europe/Oslo',
        units: JSON.stringify({ height: 'ft', speed: 'kn' }),
      },
      Buffer.from(csv, 'utf8'),
      'extract.csv',
    );
    expect(res.status, res.text).toBe(201);
    expect(res.body.records).toBe(2);
    // 00:00 in Oslo on 29 March 2026 is still winter time (UTC+1); 03:00 is after the change (UTC+2).
    expect(res.body.start).toBe('2026-03-28T23:00:00.000Z');
    expect(res.body.end).toBe('2026-03-29T01:00:00.000Z');
    const recs = await ctx.as.coordinator.get(`${ctx.base}/${res.body.id}/records`);
    // 1 ft = 0.3048 m exactly; 1 kn = 1852/3600 m/s exactly (international definitions).
    expect(recs.body.hs[0]).toBeCloseTo(1.0, 5);
    expect(recs.body.hs[1]).toBeCloseTo(2.0, 5);
    expect(recs.body.wind[1]).toBeCloseTo((20 * 1852) / 3600, 6);
  });

  // Issue 22: the headline counted missing values only, so a file with whole hours left out
  // looked complete.
  it('counts absent rows as well as missing values in the dataset headline', async () => {
    // Hourly from 00:00 to 06:00 (7 steps): 03:00 and 04:00 are not in the file, 02:00 has no Hs.
    const csv =
      'time,hs,tp\n2026-01-01 00:00,1.0,8\n2026-01-01 01:00,1.1,8\n2026-01-01 02:00,NaN,8\n2026-01-01 05:00,1.2,8\n2026-01-01 06:00,1.3,8\n';
    const res = await postForm(
      ctx.as.coordinator,
      ctx.base,
      { name: 'Gappy buoy', kind: 'observation', dataPointDepth: '35' },
      Buffer.from(csv, 'utf8'),
      'gappy.csv',
    );
    expect(res.status, res.text).toBe(201);
    const d = (await ctx.as.coordinator.get(`${ctx.base}/${res.body.id}`)).body;
    expect(d).toMatchObject({ records: 5, expectedRecords: 7, absentRecords: 2, missing: expect.objectContaining({ hs: 1 }) });
    // (1 missing + 2 absent) / 7 expected.
    expect(d.hsGapShare).toBeCloseTo(3 / 7, 12);
  });

  // Issue 22: a 6-day "hindcast" silently became the default for all statistics.
  it('warns when a hindcast shorter than a year becomes the default, and lets the coordinator choose the default', async () => {
    const hours = Array.from({ length: 6 * 24 }, (_, k) => `${new Date(Date.UTC(2025, 5, 1) + k * 3_600_000).toISOString()},1.0,8`);
    const upload = (name: string) =>
      postForm(
        ctx.as.coordinator,
        ctx.base,
        { name, kind: 'hindcast', dataPointDepth: 'deep' },
        Buffer.from(`time,hs,tp\n${hours.join('\n')}\n`, 'utf8'),
        'short.csv',
      );
    const first = await upload('Six days of hindcast');
    expect(first.status, first.text).toBe(201);
    // 144 hourly records: 6 days from the first record to the end of the last.
    expect(first.body.warning).toMatch(/^Six days of hindcast spans 6 days, less than a year, and became the default for every statistic/);
    let list = (await ctx.as.coordinator.get(ctx.base)).body as { id: string; statisticsDefault: boolean }[];
    expect(list.filter((d) => d.statisticsDefault).map((d) => d.id)).toEqual([first.body.id]);

    // Chosen explicitly, it stays the default when a newer hindcast arrives (which then warns of nothing).
    const chosen = await ctx.as.coordinator
      .put(`/api/projects/${ctx.t.demo.projectId}/default-hindcast`)
      .send({ datasetId: first.body.id });
    expect(chosen.status, chosen.text).toBe(200);
    expect(chosen.body.warning).toMatch(/is now the default/);
    const second = await upload('Another short hindcast');
    expect(second.body.warning).toBeNull();
    list = (await ctx.as.coordinator.get(ctx.base)).body;
    expect(list.filter((d) => d.statisticsDefault).map((d) => d.id)).toEqual([first.body.id]);

    // Cleared: the newest hindcast is the default again. Forecasts and strangers' ids are refused.
    expect((await ctx.as.coordinator.put(`/api/projects/${ctx.t.demo.projectId}/default-hindcast`).send({ datasetId: null })).status).toBe(
      200,
    );
    list = (await ctx.as.coordinator.get(ctx.base)).body;
    expect(list.filter((d) => d.statisticsDefault).map((d) => d.id)).toEqual([second.body.id]);
    expect((await ctx.as.coordinator.put(`/api/projects/${ctx.t.demo.projectId}/default-hindcast`).send({ datasetId: 'x' })).status).toBe(
      400,
    );
    expect((await ctx.as.client.put(`/api/projects/${ctx.t.demo.projectId}/default-hindcast`).send({ datasetId: null })).status).toBe(403);
    await ctx.as.coordinator.delete(`${ctx.base}/${first.body.id}`);
    await ctx.as.coordinator.delete(`${ctx.base}/${second.body.id}`);
  });

  it('refuses a bad file whole, naming the line, and stores nothing', async () => {
    const before = await datasetCount();
    const csv = 'time,hs,tp\n2026-01-01T00:00Z,1.0,8\n2026-01-01T01:00Z,-1.0,8\n2026-01-01T02:00Z,1.0,80\n';
    const res = await postForm(
      ctx.as.coordinator,
      ctx.base,
      { name: 'Bad', kind: 'hindcast', dataPointDepth: 'deep' },
      Buffer.from(csv),
      'bad.csv',
    );
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_file');
    const lines = res.body.error.details.map((d: { line: number }) => d.line);
    expect(lines).toContain(3); // negative Hs
    expect(lines).toContain(4); // period outside 0.5-40 s
    expect(await datasetCount()).toBe(before);
  });

  it('skips bad rows when asked and lists them in the import report', async () => {
    const csv = 'time,hs,tp\n2026-01-01T00:00Z,1.0,8\n2026-01-01T01:00Z,-1.0,8\n2026-01-01T02:00Z,1.2,8\n';
    const res = await postForm(
      ctx.as.coordinator,
      ctx.base,
      { name: 'Skipping', kind: 'hindcast', dataPointDepth: 'deep', onBadRows: 'skip' },
      Buffer.from(csv),
      'skip.csv',
    );
    expect(res.status, res.text).toBe(201);
    expect(res.body.records).toBe(2);
    expect(res.body.skipped).toBe(1);
    const detail = await ctx.as.coordinator.get(`${ctx.base}/${res.body.id}`);
    expect(detail.body.importReport.issues[0]).toMatchObject({ line: 3 });
  });

  it('refuses binary content and a missing file with a clear message', async () => {
    const before = await datasetCount();
    const bin = await postForm(
      ctx.as.coordinator,
      ctx.base,
      { name: 'Binary', kind: 'hindcast', dataPointDepth: 'deep' },
      Buffer.from([0x50, 0x4b, 0x03, 0x04, 0, 0, 0, 1, 2, 3]),
      '../../etc/passwd.csv',
    );
    expect(bin.status).toBe(400);
    expect(bin.body.error.message).toMatch(/binary/);
    const none = await ctx.as.coordinator.post(ctx.base).field('name', 'Nothing').field('kind', 'hindcast').field('dataPointDepth', 'deep');
    expect(none.status).toBe(400);
    expect(none.body.error.details[0].field).toBe('file');
    expect(await datasetCount()).toBe(before);
  });

  it('refuses a file over 100 MB with 413 and the limit stated', async () => {
    const big = Buffer.alloc(100 * 1024 * 1024 + 10, 0x31);
    const res = await postForm(ctx.as.coordinator, ctx.base, { name: 'Huge', kind: 'hindcast', dataPointDepth: 'deep' }, big, 'huge.csv');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/100 MB/);
  });

  it('lets only coordinators import or delete, and keeps other projects out', async () => {
    for (const agent of [ctx.as.skipper, ctx.as.client]) {
      const res = await agent
        .post(ctx.base)
        .field('name', 'x')
        .field('kind', 'hindcast')
        .field('dataPointDepth', 'deep')
        .attach('file', Buffer.from('time,hs\n'), 'x.csv');
      expect(res.status).toBe(403);
    }
    const list = await ctx.as.coordinator.get(ctx.base);
    const id = list.body[0].id;
    expect((await ctx.as.client.delete(`${ctx.base}/${id}`)).status).toBe(403);
    expect((await request(ctx.t.app).get(ctx.base)).status).toBe(401);
    // The dataset belongs to project A: under project B's address it does not exist.
    expect((await ctx.as.coordinator.get(`/api/projects/${ctx.t.demo.secondProjectId}/datasets/${id}`)).status).toBe(404);
    expect((await ctx.as.coordinator.get(`${ctx.base}/not-an-id`)).status).toBe(404);
    expect((await ctx.as.coordinator.get(`${ctx.base}/00000000-0000-4000-8000-000000000000/records`)).status).toBe(404);
  });

  it('downloads the records as CSV and deletes a dataset', async () => {
    const list = await ctx.as.coordinator.get(ctx.base);
    const target = list.body.find((d: { name: string }) => d.name === 'Skipping');
    const csv = await ctx.as.client.get(`${ctx.base}/${target.id}/csv`);
    expect(csv.status).toBe(200);
    expect(csv.text.split('\n')[1]).toMatch(/^2026-01-01T00:00:00.000Z,1.000,8.00,/);
    const del = await ctx.as.coordinator.delete(`${ctx.base}/${target.id}`);
    expect(del.status).toBe(204);
    expect((await ctx.as.coordinator.get(`${ctx.base}/${target.id}`)).status).toBe(404);
  });
});

describe('fetching forecasts', () => {
  it('stores a forecast issue from the service, and not twice', async () => {
    const url = `/api/projects/${ctx.t.demo.projectId}/forecasts/fetch`;
    const first = await ctx.as.coordinator.post(url).send({});
    expect(first.status, first.text).toBe(201);
    // The fake service: hourly to +72 h, then 3-hourly to +240 h (129 records).
    expect(first.body.records).toBe(129);
    const again = await ctx.as.coordinator.post(url).send({});
    expect(again.status).toBe(200);
    expect(again.body.isNew).toBe(false);
    expect((await ctx.as.skipper.post(url).send({})).status).toBe(403);
  });

  it('keeps the previous forecast when the service fails', async () => {
    const before = await datasetCount();
    ctx.t.forecast.fake!.setFailure('http500', 1);
    const res = await ctx.as.coordinator.post(`/api/projects/${ctx.t.demo.projectId}/forecasts/fetch`).send({});
    expect(res.status).toBe(503);
    expect(res.body.error.message).toMatch(/previous forecast is kept/);
    ctx.t.forecast.fake!.setFailure('malformed', 1);
    const bad = await ctx.as.coordinator.post(`/api/projects/${ctx.t.demo.projectId}/forecasts/fetch`).send({});
    expect(bad.status).toBe(503);
    expect(await datasetCount()).toBe(before);
  });
});

describe('upload leftovers', () => {
  it('removes temporary upload files over a day old when the routes start, and keeps younger ones', () => {
    // The folder multer writes to (server/routes/datasets.ts); a killed upload leaves its file there.
    const dir = path.join(os.tmpdir(), 'lullwatch-uploads');
    fs.mkdirSync(dir, { recursive: true });
    const old = path.join(dir, `leftover-${process.pid}-old`);
    const young = path.join(dir, `leftover-${process.pid}-young`);
    fs.writeFileSync(old, 'x');
    fs.writeFileSync(young, 'x');
    const twoDaysAgo = new Date(Date.now() - 48 * 3_600_000);
    fs.utimesSync(old, twoDaysAgo, twoDaysAgo);
    createApp(ctx.t.deps);
    expect(fs.existsSync(old)).toBe(false);
    expect(fs.existsSync(young)).toBe(true);
    fs.rmSync(young, { force: true });
  });
});
