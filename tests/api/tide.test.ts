/**
 * The tide route against direct calls of the tide package on one station of its database
 * (docs/domain.md#tide). This catches wiring mistakes (datum, time span, nodal corrections,
 * units), not the package's own.
 */
import { useStation } from '@neaps/tide-predictor';
import { near } from '@neaps/tide-database';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type Agent, type TestApp } from '../support/app';

let t: TestApp;
let coordinator: Agent;
let client: Agent;

beforeAll(async () => {
  t = await createTestApp();
  coordinator = await signIn(t.app, 'coordinator@example.com');
  client = await signIn(t.app, 'client@example.com');
});
afterAll(async () => {
  await t.close();
});

const base = () => `/api/projects/${t.demo.projectId}/sites`;

/** A worksite 6 m deep (UTC) at the position, its tide from the station on LAT; 201 expected. */
async function createStationSite(name: string, latitude: number, longitude: number, stationId: string) {
  const created = await coordinator.post(base()).send({
    name,
    depth: 6,
    timeZone: 'UTC',
    latitude,
    longitude,
    tide: { source: 'station', stationId, datum: 'LAT' },
  });
  expect(created.status, created.text).toBe(201);
  return created;
}

describe('tide route', () => {
  it('answers the same levels and extremes as the package called directly for one database station', async () => {
    // A station of the database near a position in the German Bight (the first one the package finds).
    const [[station, km]] = near({ lat: 53.5, lon: 8.1, maxResults: 1 });
    expect(km).toBeLessThan(20);
    const created = await createStationSite('Tide check', 53.5, 8.1, station.id);

    const from = '2026-12-01T00:00:00.000Z';
    const to = '2026-12-02T00:00:00.000Z';
    const res = await client.get(`${base()}/${created.body.id}/tide`).query({ from, to });
    expect(res.status, res.text).toBe(200);
    const direct = useStation(station as never);
    const line = direct.getTimelinePrediction({
      start: new Date(from),
      end: new Date(to),
      timeFidelity: 900,
      nodeCorrections: 'schureman',
    });
    expect(res.body.datum).toBe(line.datum);
    expect(res.body.stepMinutes).toBe(15);
    expect(res.body.times).toHaveLength(line.timeline.length);
    res.body.times.forEach((time: string, k: number) => {
      expect(time).toBe(line.timeline[k].time.toISOString());
      expect(res.body.waterLevel[k]).toBeCloseTo(line.timeline[k].level, 9);
    });
    const ex = direct.getExtremesPrediction({ start: new Date(from), end: new Date(to), nodeCorrections: 'schureman' }).extremes;
    expect(res.body.extremes).toEqual(ex.map((e) => ({ time: e.time.toISOString(), level: e.level, kind: e.high ? 'high' : 'low' })));
    // The station shown with its name, distance, datum, source and the database's attribution.
    expect(res.body.station).toMatchObject({ id: station.id, name: station.name, datum: station.chart_datum, source: station.source.name });
    expect(res.body.station.distanceKm).toBeCloseTo(km, 1);
    expect(res.body.station.attribution).toMatch(/tide-database/);
    expect(res.body.cautions.join(' ')).toMatch(/surge/);
    expect(res.body.cautions.join(' ')).toMatch(/Not for navigation/);

    const stations = await client.get(`${base()}/${created.body.id}/tide-stations`);
    expect(stations.status).toBe(200);
    expect(stations.body.stations[0].id).toBe(station.id);
  });

  it('warns about a far station (over 20 km, docs/domain.md#tide)', async () => {
    const [[station]] = near({ lat: 53.5, lon: 8.1, maxResults: 1 });
    const created = await createStationSite('Tide far', 54.2, 7.0, station.id);
    const res = await client.get(`${base()}/${created.body.id}/tide`).query({ from: '2026-12-01T00:00:00Z', to: '2026-12-01T06:00:00Z' });
    expect(res.body.station.distanceKm).toBeGreaterThan(20);
    expect(res.body.station.warnings.join(' ')).toMatch(/over 20 km/);
  });

  it('refuses an unknown constituent or station naming the field, and answers 404 without a tide', async () => {
    const bad = await coordinator.post(base()).send({
      name: 'Tide bad',
      depth: 6,
      timeZone: 'UTC',
      tide: {
        source: 'constants',
        z0: 1,
        constituents: [
          { name: 'M2', amplitude: 1, phase: 0 },
          { name: 'QQ7', amplitude: 1, phase: 0 },
        ],
      },
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('tide.constituents.1.name');
    const noStation = await coordinator
      .post(base())
      .send({ name: 'Tide bad 2', depth: 6, timeZone: 'UTC', tide: { source: 'station', stationId: 'nowhere/0' } });
    expect(noStation.status).toBe(400);
    expect(noStation.body.error.details[0].field).toBe('tide.stationId');
    const noZ0 = await coordinator.post(base()).send({
      name: 'Tide bad 3',
      depth: 6,
      timeZone: 'UTC',
      tide: { source: 'constants', constituents: [{ name: 'M2', amplitude: 1, phase: 0 }] },
    });
    expect(noZ0.status).toBe(400);
    expect(noZ0.body.error.details[0].field).toBe('tide.z0');
    const plain = await coordinator.post(base()).send({ name: 'No tide', depth: 6, timeZone: 'UTC' });
    const none = await client.get(`${base()}/${plain.body.id}/tide`);
    expect(none.status).toBe(404);
    const long = await client.get(`${base()}/${plain.body.id}/tide`).query({ from: '2026-01-01T00:00:00Z', to: '2026-03-01T00:00:00Z' });
    expect(long.status).toBe(400);
  });

  it('previews an unsaved tide for 3 days: M2 alone gives highs at Z0 + f·H and lows at Z0 - f·H, 12.42 h apart', async () => {
    const from = '2026-12-01T00:00:00.000Z';
    const res = await coordinator.post(`/api/projects/${t.demo.projectId}/tide-preview`).send({
      tide: { source: 'constants', constituents: [{ name: 'M2', amplitude: 1.5, phase: 120 }], z0: 2, datum: 'LAT' },
      from,
    });
    expect(res.status, res.text).toBe(200);
    // 3 days at 15 minutes, both ends included.
    expect(res.body.times[0]).toBe(from);
    expect(res.body.times).toHaveLength(3 * 96 + 1);
    expect(res.body.datum).toBe('LAT');
    const highs = res.body.extremes.filter((e: { kind: string }) => e.kind === 'high');
    const lows = res.body.extremes.filter((e: { kind: string }) => e.kind === 'low');
    // About 5.8 highs in 3 days at one per 12.4206 h (M2 speed 28.9841042 deg/h, Schureman 1958).
    expect(highs.length).toBeGreaterThanOrEqual(5);
    expect(highs.length).toBeLessThanOrEqual(6);
    // f(M2) within 0.96-1.04 (from memory): highs 3.44-3.56 m, lows 0.44-0.56 m above chart datum.
    for (const h of highs) expect(h.level >= 3.44 && h.level <= 3.56, `high ${h.level}`).toBe(true);
    for (const l of lows) expect(l.level >= 0.44 && l.level <= 0.56, `low ${l.level}`).toBe(true);
    const gapH = (Date.parse(highs[1].time) - Date.parse(highs[0].time)) / 3_600_000;
    expect(gapH).toBeCloseTo(360 / 28.9841042, 1);
    expect(res.body.cautions.join(' ')).toMatch(/Not for navigation/);
  });

  it('previews a station with its distance from the typed position, and names the field of a bad preview', async () => {
    const [[station, km]] = near({ lat: 53.5, lon: 8.1, maxResults: 1 });
    const url = `/api/projects/${t.demo.projectId}/tide-preview`;
    const res = await coordinator.post(url).send({ tide: { source: 'station', stationId: station.id }, latitude: 53.5, longitude: 8.1 });
    expect(res.status, res.text).toBe(200);
    expect(res.body.station.id).toBe(station.id);
    expect(res.body.station.distanceKm).toBeCloseTo(km, 1);
    const unknown = await coordinator
      .post(url)
      .send({ tide: { source: 'constants', z0: 1, constituents: [{ name: 'QQ7', amplitude: 1, phase: 0 }] } });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details[0].field).toBe('tide.constituents.0.name');
    const none = await coordinator.post(url).send({ tide: { source: 'none' } });
    expect(none.status).toBe(400);
    expect(none.body.error.details[0].field).toBe('tide.source');
    expect((await client.post(url).send({ tide: { source: 'none' } })).status).toBe(403);
  });

  it('lists the stations nearest a typed position, nearest first, and refuses a position off the globe', async () => {
    const url = `/api/projects/${t.demo.projectId}/tide-stations`;
    const res = await client.get(url).query({ latitude: 53.5, longitude: 8.1 });
    expect(res.status, res.text).toBe(200);
    const direct = near({ lat: 53.5, lon: 8.1, maxResults: 5, maxDistance: 200, filter: (s) => s.kind === 'tide' });
    expect(res.body.stations.map((s: { id: string }) => s.id)).toEqual(direct.map(([s]) => s.id));
    const bad = await client.get(url).query({ latitude: 91, longitude: 8.1 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('latitude');
  });
});
