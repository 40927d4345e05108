// The local fake forecast service, reached through the real HTTP client over loopback.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import {
  seaStateExchangeSchema,
  generateSyntheticSea,
  HttpForecastProvider,
  startFakeForecastService,
  truthSeedForPosition,
  type FakeForecastService,
  type ForecastIssue,
} from '../../server/forecast';

const HOUR = 3_600_000;
const POSITION = { latitude: 50.1, longitude: -5.6 };
/** 3 December 2026, 14:25 UTC: the latest 6-hour cycle at or before it is 12:00 UTC. */
const DEC_3_1425 = Date.UTC(2026, 11, 3, 14, 25);

const started: FakeForecastService[] = [];
async function fake(options: Parameters<typeof startFakeForecastService>[0] = {}): Promise<FakeForecastService> {
  const f = await startFakeForecastService(options);
  started.push(f);
  return f;
}
afterEach(async () => {
  await Promise.all(started.splice(0).map((f) => f.close()));
});

/** Up- and down-crossings of a threshold in a series. */
function crossings(values: Float64Array, threshold: number): { up: number; down: number } {
  let up = 0;
  let down = 0;
  for (let i = 1; i < values.length; i++) {
    if (values[i - 1] <= threshold && values[i] > threshold) up++;
    if (values[i - 1] > threshold && values[i] <= threshold) down++;
  }
  return { up, down };
}

describe('fake forecast service through HttpForecastProvider', () => {
  let now = DEC_3_1425;
  let service: FakeForecastService;
  let provider: HttpForecastProvider;
  let issue: ForecastIssue;

  beforeAll(async () => {
    service = await startFakeForecastService({ clock: () => now });
    provider = new HttpForecastProvider(service.url, { timeoutMs: 5000 });
    issue = await provider.fetchLatest(POSITION);
  });
  afterAll(async () => {
    await service.close();
  });

  it('is hourly to +72 h, then 3-hourly to +240 h (a forecast that changes step, as many services issue)', () => {
    const t = issue.records.timeMs;
    const issued = t[0];
    const leads = Array.from(t, (ms) => (ms - issued) / HOUR);
    expect(leads.slice(0, 73)).toEqual(Array.from({ length: 73 }, (_, h) => h));
    expect(leads.slice(73)).toEqual(Array.from({ length: 56 }, (_, k) => 75 + 3 * k));
    expect(leads.at(-1)).toBe(240);
  });

  it('answers JSON that passes the schema', async () => {
    const res = await fetch(`${service.url}/exchange/sea-state?lat=50.1&lon=-5.6`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^application\/json/);
    const body = (await res.json()) as Record<string, unknown>;
    const parsed = seaStateExchangeSchema.safeParse(body);
    expect(parsed.success).toBe(true);
    // The documented top-level members (docs/domain.md#forecast-service), nothing else.
    expect(Object.keys(body).sort()).toEqual(['issuedAt', 'position', 'series']);
  });

  it('gives wind sea and swells whose energies add up to the total (docs/domain.md#partitions)', () => {
    const r = issue.records as Record<string, Float64Array> & { timeMs: Float64Array; hs: Float64Array };
    for (const k of ['windSea', 'swell1', 'swell2'])
      for (const v of ['hs', 'tp', 'dir']) expect(r[`${k}.${v}`]).toBeInstanceOf(Float64Array);
    let swellLong = 0;
    for (let i = 0; i < r.timeMs.length; i++) {
      const parts = [r['windSea.hs'][i], r['swell1.hs'][i], r['swell2.hs'][i]];
      expect(parts.every((h) => h >= 0)).toBe(true);
      // Energies add (common practice, no source); the total is interpolated and rounded on its
      // own, so allow the 5 % the import tolerates before it rescales.
      expect(Math.abs(Math.hypot(...parts) - r.hs[i])).toBeLessThanOrEqual(0.05 * r.hs[i] + 0.02);
      for (const k of ['windSea', 'swell1', 'swell2'] as const) {
        const absent = r[`${k}.hs`][i] === 0;
        expect(Number.isNaN(r[`${k}.tp`][i])).toBe(absent);
      }
      if (r['swell1.hs'][i] > 0 && r['swell1.tp'][i] >= 10) swellLong++;
    }
    expect(swellLong).toBeGreaterThan(r.timeMs.length / 3);
  });

  it('issues on the 00/06/12/18 UTC cycle, hourly then 3-hourly, for 10 days by default', () => {
    expect(new Date(issue.issuedAtMs).toISOString()).toBe('2026-12-03T12:00:00.000Z');
    const t = issue.records.timeMs;
    expect(t.length).toBe(129);
    expect(t[0]).toBe(issue.issuedAtMs);
    for (let i = 1; i < t.length; i++) expect(t[i] - t[i - 1]).toBe(i <= 72 ? HOUR : 3 * HOUR);
    for (const column of [issue.records.hs, issue.records.tp, issue.records.dir, issue.records.wind, issue.records.windDir]) {
      expect(column.length).toBe(129);
      expect(column.every((v) => Number.isFinite(v))).toBe(true);
    }
  });

  it('answers for the nearest node of its 0.25 deg grid', () => {
    expect(issue.latitude).toBe(50);
    expect(issue.longitude).toBe(-5.5);
  });

  it('records what it received', async () => {
    await provider.fetchLatest(POSITION);
    const last = service.received[service.received.length - 1];
    expect(last.latitude).toBe(50.1);
    expect(last.longitude).toBe(-5.6);
    expect(last.accept).toBe('application/json');
    expect(service.requests).toBeGreaterThanOrEqual(2);
  });

  it('moves to the next issue at 18:00 UTC exactly, not before', async () => {
    now = Date.UTC(2026, 11, 3, 17, 59, 59);
    expect(new Date((await provider.fetchLatest(POSITION)).issuedAtMs).toISOString()).toBe('2026-12-03T12:00:00.000Z');
    now = Date.UTC(2026, 11, 3, 18, 0, 0);
    expect(new Date((await provider.fetchLatest(POSITION)).issuedAtMs).toISOString()).toBe('2026-12-03T18:00:00.000Z');
    now = DEC_3_1425;
  });

  it('refuses a request without a valid position with 400', async () => {
    const res = await fetch(`${service.url}/exchange/sea-state?lat=95&lon=0`);
    expect(res.status).toBe(400);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe('bad_position');
    expect((await fetch(`${service.url}/v2/nothing`)).status).toBe(404);
    expect((await fetch(`${service.url}/exchange/sea-state?lat=1&lon=1`, { method: 'POST' })).status).toBe(405);
  });
});

describe('fake forecasts: deterministic, realistic, changing between issues', () => {
  it('gives identical answers for the same clock, also from another instance', async () => {
    const a = await fake({ clock: () => DEC_3_1425 });
    const b = await fake({ clock: () => DEC_3_1425 + 2 * HOUR }); // same 12:00 issue
    const url = '/exchange/sea-state?lat=50.1&lon=-5.6';
    const [ta, tb, ta2] = await Promise.all(
      [fetch(a.url + url), fetch(b.url + url), fetch(a.url + url)].map(async (p) => (await p).text()),
    );
    expect(tb).toBe(ta);
    expect(ta2).toBe(ta);
  });

  it('differs between positions and seeds, but not within one grid cell', async () => {
    const f = await fake({ clock: () => DEC_3_1425 });
    const other = await fake({ clock: () => DEC_3_1425, seed: 1 });
    const p = new HttpForecastProvider(f.url);
    const a = await p.fetchLatest(POSITION);
    const sameCell = await p.fetchLatest({ latitude: 50.05, longitude: -5.45 });
    const far = await p.fetchLatest({ latitude: 43.3, longitude: -9.2 });
    const otherSeed = await new HttpForecastProvider(other.url).fetchLatest(POSITION);
    expect(Array.from(sameCell.records.hs)).toEqual(Array.from(a.records.hs));
    expect(Array.from(far.records.hs)).not.toEqual(Array.from(a.records.hs));
    expect(Array.from(otherSeed.records.hs)).not.toEqual(Array.from(a.records.hs));
  });

  it('serves 7 to 16 days as configured and refuses other horizons', async () => {
    for (const days of [7, 16]) {
      const f = await fake({ clock: () => DEC_3_1425, horizonDays: days });
      const r = await new HttpForecastProvider(f.url).fetchLatest(POSITION);
      // Hourly 0..72 h (73 records), then 3-hourly from 75 h to the horizon.
      expect(r.records.timeMs.length).toBe(73 + (days * 24 - 72) / 3);
    }
    await expect(startFakeForecastService({ horizonDays: 17 })).rejects.toThrow(RangeError);
  });

  it('publishes an issue only after its delay', async () => {
    const f = await fake({ clock: () => DEC_3_1425, publishDelayHours: 3 });
    // 14:25 - 3 h = 11:25, so the 06:00 issue is the latest available.
    const r = await new HttpForecastProvider(f.url).fetchLatest(POSITION);
    expect(new Date(r.issuedAtMs).toISOString()).toBe('2026-12-03T06:00:00.000Z');
  });

  it('changes a little from one issue to the next: close near the start, further apart later', async () => {
    let now = DEC_3_1425;
    const f = await fake({ clock: () => now });
    const p = new HttpForecastProvider(f.url);
    const first = await p.fetchLatest(POSITION);
    now += 6 * HOUR;
    const second = await p.fetchLatest(POSITION);
    expect(second.issuedAtMs - first.issuedAtMs).toBe(6 * HOUR);
    const near: number[] = [];
    const far: number[] = [];
    const firstAt = new Map(Array.from(first.records.timeMs, (t, i) => [t, i]));
    for (let j = 0; j < second.records.timeMs.length; j++) {
      const i = firstAt.get(second.records.timeMs[j]); // the same valid time in the earlier issue
      if (i === undefined) continue;
      const lead = (second.records.timeMs[j] - second.issuedAtMs) / HOUR;
      const rel = Math.abs(first.records.hs[i] - second.records.hs[j]) / second.records.hs[j];
      if (lead < 24) near.push(rel);
      if (lead >= 144) far.push(rel);
    }
    expect(near.length).toBeGreaterThan(20);
    expect(far.length).toBeGreaterThan(10);
    const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
    // Within the first day the two issues agree to a few percent.
    expect(Math.max(...near)).toBeLessThan(0.1);
    // They are not copies: they differ, and more so 6-10 days ahead.
    expect(far.some((r) => r > 0)).toBe(true);
    expect(mean(far)).toBeGreaterThan(mean(near));
  });

  it('drifts from the invented truth as the lead time grows', async () => {
    const f = await fake({ clock: () => DEC_3_1425 });
    const r = await new HttpForecastProvider(f.url).fetchLatest(POSITION);
    const truth = generateSyntheticSea({
      startMs: r.issuedAtMs,
      hours: 240,
      seed: truthSeedForPosition(20261201, r.latitude, r.longitude),
    });
    const err = (from: number, to: number) => {
      let s = 0;
      let count = 0;
      r.records.timeMs.forEach((t, i) => {
        const h = (t - r.issuedAtMs) / HOUR;
        if (h < from || h >= to) return;
        s += Math.abs(r.records.hs[i] - truth.hsM[h]) / truth.hsM[h];
        count++;
      });
      return s / count;
    };
    expect(err(0, 24)).toBeLessThan(0.05);
    expect(err(168, 240)).toBeGreaterThan(err(0, 24));
  });

  it('lets weather windows open and close: over 10 days Hs crosses 1.5 m both ways (winter)', async () => {
    const clocks = [Date.UTC(2026, 11, 3, 14), Date.UTC(2027, 0, 15, 2), Date.UTC(2027, 1, 20, 20)];
    const positions = [POSITION, { latitude: 57.5, longitude: 1.5 }, { latitude: 44, longitude: -8.75 }];
    for (const clock of clocks) {
      const f = await fake({ clock: () => clock });
      const p = new HttpForecastProvider(f.url);
      for (const position of positions) {
        const r = await p.fetchLatest(position);
        const c = crossings(r.records.hs, 1.5);
        expect(c.up, `${new Date(clock).toISOString()} ${position.latitude}`).toBeGreaterThanOrEqual(1);
        expect(c.down, `${new Date(clock).toISOString()} ${position.latitude}`).toBeGreaterThanOrEqual(1);
      }
    }
  });

  it('keeps forecasts within the steepness limit Hs/L0 <= 1/15', async () => {
    // DNV-RP-C205 limiting steepness 1/15 (from memory); L0 = g Tp^2 / (2 pi).
    const f = await fake({ clock: () => Date.UTC(2027, 0, 10) });
    const r = await new HttpForecastProvider(f.url).fetchLatest(POSITION);
    for (let i = 0; i < r.records.hs.length; i++) {
      expect(r.records.hs[i] / ((9.81 / (2 * Math.PI)) * r.records.tp[i] ** 2)).toBeLessThanOrEqual(1 / 15);
    }
  });

  it('asks for its key when one is set', async () => {
    const f = await fake({ clock: () => DEC_3_1425, apiKey: 'k-123' });
    const withKey = await new HttpForecastProvider(f.url, { apiKey: 'k-123' }).fetchLatest(POSITION);
    expect(withKey.records.hs.length).toBe(129);
    expect(f.received[0].authorization).toBe('Bearer k-123');
    await expect(new HttpForecastProvider(f.url).fetchLatest(POSITION)).rejects.toMatchObject({ code: 'http', status: 401 });
  });
});
