// The fake's ensembles (docs/domain.md#forecast-uncertainty), through the real HTTP client: a
// control that is today's forecast plus N members, deterministic per (issue, member), whose spread
// grows with lead time. The error model is the fake's own invention (its header: Hs multiplied by
// exp(e), |e| <= 0.03 + 0.035 per day of lead, plus a timing error of 1 h + 1.2 h per day).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildFakeForecast, HttpForecastProvider, startFakeForecastService, type FakeForecastService } from '../../server/forecast';

const POSITION = { latitude: 50.1, longitude: -5.6 };
const DEC_3_1425 = Date.UTC(2026, 11, 3, 14, 25);
let fake: FakeForecastService;
let client: HttpForecastProvider;

beforeAll(async () => {
  fake = await startFakeForecastService({ clock: () => DEC_3_1425 });
  client = new HttpForecastProvider(fake.url);
});
afterAll(async () => {
  await fake.close();
});

/** Sample standard deviation. */
function sd(xs: number[]): number {
  const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
  return Math.sqrt(xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (xs.length - 1));
}

describe('ensemble forecasts from the fake', () => {
  it('answers a control equal to the single forecast plus 20 numbered members on request', async () => {
    const single = await client.fetchLatest(POSITION);
    const ens = await client.fetchLatest({ ...POSITION, members: 20 });
    expect(single.members).toEqual([]);
    expect(Array.from(ens.records.hs)).toEqual(Array.from(single.records.hs));
    expect(ens.members!.map((m) => m.member)).toEqual(Array.from({ length: 20 }, (_, k) => k + 1));
    for (const m of ens.members!) {
      expect(m.records.timeMs).toBe(ens.records.timeMs);
      expect(m.records.hs.length).toBe(ens.records.hs.length);
    }
    // Members differ from the control and from each other.
    expect(Array.from(ens.members![0].records.hs)).not.toEqual(Array.from(ens.records.hs));
    expect(Array.from(ens.members![0].records.hs)).not.toEqual(Array.from(ens.members![1].records.hs));
    expect(fake.received.at(-1)).toMatchObject({ latitude: 50.1, longitude: -5.6 });
  });

  it('is deterministic per (issue, member), and a member does not depend on how many were asked for', () => {
    const req = { seed: 7, ...POSITION, issuedAtMs: Date.UTC(2026, 11, 3, 12), horizonDays: 10 };
    const a = buildFakeForecast({ ...req, members: 20 });
    const b = buildFakeForecast({ ...req, members: 20 });
    const c = buildFakeForecast({ ...req, members: 5 });
    expect(b).toEqual(a);
    expect(c.members![4]).toEqual(a.members![4]);
  });

  it('spreads more with lead time: the members ln(Hs) spread at +9-10 days exceeds that of the first day', () => {
    let early = 0;
    let late = 0;
    // Eight issues two days apart, so the comparison does not rest on one weather situation.
    for (let d = 0; d < 8; d++) {
      const f = buildFakeForecast({ seed: 20261201, ...POSITION, issuedAtMs: Date.UTC(2026, 10, 1 + 2 * d), horizonDays: 10, members: 20 });
      const leads = f.series.time.map((t) => (Date.parse(t) - Date.parse(f.issuedAt)) / 3_600_000);
      const spreadAt = (r: number) => sd(f.members!.map((m) => Math.log(m.series.hs[r]!)));
      const mean = (rows: number[]) => rows.reduce((s, r) => s + spreadAt(r), 0) / rows.length;
      early += mean(leads.flatMap((h, r) => (h < 24 ? [r] : [])));
      late += mean(leads.flatMap((h, r) => (h >= 216 ? [r] : [])));
    }
    // The amplitude bound alone grows from 0.03-0.065 on day one to 0.34-0.38 at nine days (the
    // fake's header), so the spread should grow several times over; at least twice is asked here.
    expect(late).toBeGreaterThan(2 * early);
  });

  it('refuses a member count outside 0-50 with a 400', async () => {
    const res = await fetch(`${fake.url}/exchange/sea-state?lat=50&lon=-5&members=51`);
    expect(res.status).toBe(400);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe('bad_members');
  });
});
