import request from 'supertest';
import Papa from 'papaparse';
import { quantile } from 'd3-array';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { useSignedInApp, textBody } from '../support/app';
import { calendarIndex, evaluateHours, evaluateStatus, goStarts, monthlyStatistics, STATUS } from '../../shared/engine';
import type {
  CampaignSimulation,
  LedgerEntry,
  LedgerMonthlyAnswer,
  LedgerProposeAnswer,
  WorkabilityEntry,
} from '../../shared/api-types-downtime';
import { readSeries } from '../../server/services/series-store';
import { loadProjectSetup, operationSpec, transformForSite } from '../../server/services/site-context';
import { createDataset } from '../../server/services/datasets';
import { toSeaSeries } from '../../server/services/sea-series';
import type { DemoIds } from '../../seed/demo';
import { ledgerDay, statsCache } from '../../server/db/schema';
import { clearStatsMemo, settleStatsCache } from '../../server/services/workability';

// A fixed clock: the fake forecast is issued 2026-12-01 06:00 UTC and covers the next days; the
// three-year invented hindcast covers 2023-2025.
const NOW = new Date('2026-12-01T07:30:00Z');
// The ledger records days that are over: its tests run on 10 December 2026, 12:00 UTC.
const NOW_LEDGER = new Date('2026-12-10T12:00:00Z');
let now = NOW;
const HOUR = 3_600_000;

const ctx = useSignedInApp({ hindcastYears: 3, forecast: true, clock: () => now });

const inUnit = (x: number | null) => x === null || (x >= 0 && x <= 1);

async function createOperation(body: Record<string, unknown>): Promise<string> {
  const res = await ctx.as.coordinator
    .post(`${ctx.base}/operations`)
    .send({ description: '', weatherRestricted: true, skipperIds: [], tc: 0, ...body });
  expect(res.status, res.text).toBe(201);
  return res.body.id;
}

describe('workability statistics', () => {
  it('answers every operation at each of its worksites, per month and year-month, shares in [0, 1]', async () => {
    const res = await ctx.as.client.get(`${ctx.base}/workability`);
    expect(res.status, res.text).toBe(200);
    expect(res.headers['x-dataset-id']).toBe(ctx.t.demo.hindcastId);
    const entries = res.body as WorkabilityEntry[];
    // seed/scenario-sites.ts: 2 + 1 + 2 + 1 + 2 + 1 operation-worksite pairs.
    expect(entries).toHaveLength(9);
    for (const e of entries) {
      expect(e.months.map((m) => m.month)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
      // Three whole years, hourly, in Europe/London: 36 year-months (2023-01 to 2025-12).
      expect(e.yearMonths).toHaveLength(36);
      for (const m of [...e.months, ...e.yearMonths]) {
        expect(inUnit(m.workability) && inUnit(m.goStartShare)).toBe(true);
        // A go-start is a workable record: the share can not exceed workability.
        if (m.workability !== null && m.goStartShare !== null) expect(m.goStartShare).toBeLessThanOrEqual(m.workability + 1e-9);
        for (const k of ['wowMeanHours', 'wowP90Hours', 'windowsPerMonth', 'meanWindowHours'] as const) {
          const v = m[k];
          expect(v === null || (Number.isFinite(v) && v >= 0)).toBe(true);
        }
        if (m.meanWindowHours !== null) expect(m.meanWindowHours).toBeGreaterThanOrEqual(e.tpopHours + e.tcHours);
        expect(m.censored).toBeGreaterThanOrEqual(0);
      }
      for (const m of e.months) expect(m.years).toBe(3);
    }
  });

  it('equals the engine run step by step on the same transformed series (one operation)', async () => {
    const entries = (await ctx.as.skipper.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    const setup = await loadProjectSetup(ctx.t.database.db, ctx.t.demo.projectId);
    const e = entries.find((x) => x.operationName === 'Rock berm placement')!;
    const op = setup.operations.find((o) => o.id === e.operationId)!;
    const site = setup.sites.find((s) => s.id === e.siteId)!;
    const series = await readSeries(ctx.t.database.db, ctx.t.demo.hindcastId!);
    // Transformed with the hindcast's own data point depth, as the service does.
    const engineWithDepth = transformForSite(series, await datasetDepth(), site).engine;
    const spec = operationSpec(op, setup.vessels);
    const status = evaluateStatus(engineWithDepth, spec, { alpha: true, alphaTable: setup.alphaTable });
    const flags = goStarts(engineWithDepth.timeMs, status, HOUR, spec.tpopH + spec.tcH);
    const stats = monthlyStatistics(
      engineWithDepth.timeMs,
      status,
      flags,
      HOUR,
      calendarIndex(engineWithDepth.timeMs, site.timeZone),
      spec.tpopH + spec.tcH,
    );
    for (let k = 0; k < 12; k++) {
      const a = e.months[k];
      const b = stats.months[k];
      expect(a.records).toBe(b.records);
      expect(a.workability).toBeCloseTo(b.workability!, 5);
      expect(a.goStartShare).toBeCloseTo(b.goStartShare!, 5);
      expect(a.censored).toBe(b.censored);
      if (b.wowMeanHours === null) expect(a.wowMeanHours).toBeNull();
      else expect(a.wowMeanHours).toBeCloseTo(b.wowMeanHours, 3);
      if (b.wowP90Hours === null) expect(a.wowP90Hours).toBeNull();
      else expect(a.wowP90Hours).toBeCloseTo(b.wowP90Hours, 3);
      expect(a.windows).toBe(b.windows);
    }
  });

  it('never shows less workability without alpha (docs/domain.md#convention-14)', async () => {
    const withAlpha = (await ctx.as.client.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    const without = (await ctx.as.client.get(`${ctx.base}/workability?alpha=false`)).body as WorkabilityEntry[];
    expect(without).toHaveLength(withAlpha.length);
    let larger = 0;
    withAlpha.forEach((e, i) => {
      e.months.forEach((m, k) => {
        const w = without[i].months[k].workability!;
        expect(w).toBeGreaterThanOrEqual(m.workability! - 1e-9);
        if (w > m.workability! + 1e-6) larger++;
      });
    });
    expect(larger, 'alpha < 1 should cost some hours somewhere').toBeGreaterThan(0);
  });

  it('caches by dataset and limits version: a repeat answers the same, a limit change recomputes', async () => {
    const first = await ctx.as.coordinator.get(`${ctx.base}/workability`);
    const again = await ctx.as.coordinator.get(`${ctx.base}/workability`);
    expect(again.body).toEqual(first.body);
    const keys = async () => {
      await settleStatsCache();
      return (
        await ctx.t.database.db.select({ key: statsCache.key }).from(statsCache).where(eq(statsCache.projectId, ctx.t.demo.projectId))
      ).map((r) => r.key);
    };
    const before = (await keys()).filter((k) => k.startsWith(`${ctx.t.demo.hindcastId}:`) && k.endsWith(':true'));
    expect(before).toHaveLength(1);

    const entries = first.body as WorkabilityEntry[];
    const pull = entries.find((e) => e.operationName === 'Cable pull-in at landfall')!;
    const patch = await ctx.as.coordinator
      .patch(`${ctx.base}/operations/${pull.operationId}`)
      .send({ limits: { hsMax: 0.5, windMax: 12, bedVelocityMax: 0.6, bedVelocityMethod: 'linear' } });
    expect(patch.status, patch.text).toBe(200);
    const after = (await ctx.as.coordinator.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    const changed = after.find((e) => e.operationId === pull.operationId && e.siteId === pull.siteId)!;
    // A lower Hs limit: never more workable, and less in some month.
    let lower = 0;
    changed.months.forEach((m, k) => {
      expect(m.workability!).toBeLessThanOrEqual(pull.months[k].workability! + 1e-9);
      if (m.workability! < pull.months[k].workability! - 1e-6) lower++;
    });
    expect(lower).toBeGreaterThan(0);
    // Other operations keep their numbers.
    const other = after.find((e) => e.operationName === 'Rock berm placement')!;
    expect(other.months).toEqual(entries.find((e) => e.operationName === 'Rock berm placement')!.months);
    // One entry per dataset and variant: the old version is gone.
    const now = (await keys()).filter((k) => k.startsWith(`${ctx.t.demo.hindcastId}:`) && k.endsWith(':true'));
    expect(now).toHaveLength(1);
    expect(now[0]).not.toBe(before[0]);
    // Back as seeded.
    await ctx.as.coordinator
      .patch(`${ctx.base}/operations/${pull.operationId}`)
      .send({ limits: { hsMax: 1.0, windMax: 12, bedVelocityMax: 0.6, bedVelocityMethod: 'linear' } });
    const restored = (await ctx.as.coordinator.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    expect(restored).toEqual(entries);
  }, 240_000);

  it('answers a repeat from the stats_cache table when the process has not seen it', async () => {
    const first = (await ctx.as.client.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    await settleStatsCache();
    // Mark the stored answer, forget the in-process memo: the marked value comes back.
    const db = ctx.t.database.db;
    const [row] = (await db.select().from(statsCache).where(eq(statsCache.projectId, ctx.t.demo.projectId))).filter(
      (r) => r.key.startsWith(`${ctx.t.demo.hindcastId}:`) && r.key.endsWith(':true'),
    );
    const stored = row.value as WorkabilityEntry[];
    const mark = stored.find((e) => e.operationId === first[0].operationId && e.siteId === first[0].siteId)!;
    mark.months[0].workability = 0.123456;
    await db.update(statsCache).set({ value: stored }).where(eq(statsCache.key, row.key));
    clearStatsMemo(db);
    const again = (await ctx.as.client.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    expect(again[0].months[0].workability).toBe(0.123456);
    // Put it back as computed.
    mark.months[0].workability = first[0].months[0].workability;
    await db.update(statsCache).set({ value: stored }).where(eq(statsCache.key, row.key));
    clearStatsMemo(db);
    expect((await ctx.as.client.get(`${ctx.base}/workability`)).body).toEqual(first);
  });

  it('shows a renamed operation at once (answers kept encoded are keyed by the whole setup)', async () => {
    const before = (await ctx.as.client.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    const { operationId, operationName } = before[0];
    const renamed = await ctx.as.coordinator.patch(`${ctx.base}/operations/${operationId}`).send({ name: `${operationName} (renamed)` });
    expect(renamed.status, renamed.text).toBe(200);
    const after = (await ctx.as.client.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    expect(after.filter((e) => e.operationId === operationId).map((e) => e.operationName)).toEqual(
      before.filter((e) => e.operationId === operationId).map(() => `${operationName} (renamed)`),
    );
    expect((await ctx.as.coordinator.patch(`${ctx.base}/operations/${operationId}`).send({ name: operationName })).status).toBe(200);
    expect((await ctx.as.client.get(`${ctx.base}/workability`)).body).toEqual(before);
  });

  it('downloads the same numbers as CSV', async () => {
    const json = (await ctx.as.client.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    const res = await ctx.as.client.get(`${ctx.base}/workability.csv`).buffer(true).parse(textBody);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    // papaparse (a general-purpose CSV parser from npm) reads it back.
    const parsed = Papa.parse<Record<string, string>>(res.body as string, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const monthRows = parsed.data.filter((r) => r.scope === 'month');
    expect(monthRows).toHaveLength(json.length * 12);
    expect(parsed.data.length).toBe(json.length * 12 + json.reduce((a, e) => a + e.yearMonths.length, 0));
    const first = monthRows[0];
    expect(first.operation).toBe(json[0].operationName);
    expect(Number(first.workability)).toBeCloseTo(json[0].months[0].workability!, 6);
  });

  it('refuses a forecast as the statistics dataset and unknown datasets', async () => {
    expect((await ctx.as.client.get(`${ctx.base}/workability?dataset=${ctx.t.demo.forecastId}`)).status).toBe(400);
    expect((await ctx.as.client.get(`${ctx.base}/workability?dataset=00000000-0000-4000-8000-000000000000`)).status).toBe(404);
    expect((await ctx.as.client.get(`${ctx.base}/workability?alpha=maybe`)).status).toBe(400);
  });
});

async function datasetDepth(): Promise<number | null> {
  const res = await ctx.as.coordinator.get(`${ctx.base}/datasets/${ctx.t.demo.hindcastId}`);
  return res.body.dataPoint.depthM;
}

describe('campaigns', () => {
  let calmA: string;
  let calmB: string;
  let never: string;

  beforeAll(async () => {
    // Limits so loose that every hour of the invented hindcast is workable.
    const { route, substation } = ctx.t.demo.siteIds;
    const step = (name: string, tpop: number, tc: number, limits: Record<string, number>, siteId: string) =>
      createOperation({ name, tpop, tc, limits, siteIds: [siteId] });
    calmA = await step('Calm step A', 10, 2, { hsMax: 20, windMax: 60 }, route);
    calmB = await step('Calm step B', 6, 0, { hsMax: 20, windMax: 60 }, substation);
    // A Tp window no sea of the invented climate reaches.
    never = await step('Never goes', 4, 0, { tpMin: 39, tpMax: 40 }, route);
  });

  /**
   * Creates a campaign as the coordinator, its steps each an operation at one of the demo sites, and
   * answers its simulation as the client sees it.
   */
  async function createAndSimulate(name: string, steps: [string, keyof DemoIds['siteIds']][], plannedStart?: string) {
    const c = await ctx.as.coordinator
      .post(`${ctx.base}/campaigns`)
      .send({ name, steps: steps.map(([operationId, site]) => ({ operationId, siteId: ctx.t.demo.siteIds[site] })), plannedStart });
    expect(c.status, c.text).toBe(201);
    return (await ctx.as.client.post(`${ctx.base}/campaigns/${c.body.id}/simulate`)).body as CampaignSimulation;
  }

  it('creates, lists, reorders and deletes a campaign; validates its steps', async () => {
    const steps = [
      { operationId: calmA, siteId: ctx.t.demo.siteIds.route },
      { operationId: calmB, siteId: ctx.t.demo.siteIds.substation },
    ];
    const created = await ctx.as.coordinator.post(`${ctx.base}/campaigns`).send({ name: 'Export cable nearshore', steps });
    expect(created.status, created.text).toBe(201);
    expect(created.body.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(created.body.timeZone).toBe('UTC');
    const id = created.body.id;
    const list = await ctx.as.client.get(`${ctx.base}/campaigns`);
    expect(list.body.map((c: { id: string }) => c.id)).toContain(id);

    const reordered = await ctx.as.coordinator
      .patch(`${ctx.base}/campaigns/${id}`)
      .send({ steps: [steps[1], steps[0], steps[1]], timeZone: 'europe/london' });
    expect(reordered.status, reordered.text).toBe(200);
    expect(reordered.body.steps).toEqual([steps[1], steps[0], steps[1]]);
    expect(reordered.body.timeZone).toBe('Europe/London');
    expect((await ctx.as.client.get(`${ctx.base}/campaigns/${id}`)).body.steps).toEqual([steps[1], steps[0], steps[1]]);

    // An operation at a worksite where it does not happen, an unknown one, no steps, too many.
    const wrongSite = await ctx.as.coordinator
      .post(`${ctx.base}/campaigns`)
      .send({ name: 'x', steps: [{ operationId: calmA, siteId: ctx.t.demo.siteIds.cofferdam }] });
    expect(wrongSite.status).toBe(400);
    expect(wrongSite.body.error.details[0].field).toBe('steps.0.siteId');
    const unknown = await ctx.as.coordinator
      .post(`${ctx.base}/campaigns`)
      .send({ name: 'x', steps: [{ operationId: '00000000-0000-4000-8000-000000000000', siteId: ctx.t.demo.siteIds.route }] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details[0].field).toBe('steps.0.operationId');
    expect((await ctx.as.coordinator.post(`${ctx.base}/campaigns`).send({ name: 'x', steps: [] })).status).toBe(400);
    expect((await ctx.as.coordinator.post(`${ctx.base}/campaigns`).send({ name: 'x', steps: Array(51).fill(steps[0]) })).status).toBe(400);
    expect((await ctx.as.coordinator.post(`${ctx.base}/campaigns`).send({ name: 'x', steps, timeZone: 'Mars/Olympus' })).status).toBe(400);
    expect((await ctx.as.coordinator.patch(`${ctx.base}/campaigns/${id}`).send({})).status).toBe(400);

    expect((await ctx.as.coordinator.delete(`${ctx.base}/campaigns/${id}`)).status).toBe(204);
    expect((await ctx.as.client.get(`${ctx.base}/campaigns/${id}`)).status).toBe(404);
  });

  it('simulates: shape per start month, P50 <= P90, WoW = duration - sum of TPOP', async () => {
    const setup = await loadProjectSetup(ctx.t.database.db, ctx.t.demo.projectId);
    const lay = setup.operations.find((o) => o.name === 'Cable lay, nearshore section')!;
    const berm = setup.operations.find((o) => o.name === 'Rock berm placement')!;
    const c = await ctx.as.coordinator.post(`${ctx.base}/campaigns`).send({
      name: 'Lay and protect',
      steps: [
        { operationId: lay.id, siteId: ctx.t.demo.siteIds.route },
        { operationId: berm.id, siteId: ctx.t.demo.siteIds.route },
      ],
    });
    const res = await ctx.as.client.post(`${ctx.base}/campaigns/${c.body.id}/simulate`);
    expect(res.status, res.text).toBe(200);
    const sim = res.body as CampaignSimulation;
    expect(sim.dataset.id).toBe(ctx.t.demo.hindcastId);
    expect(sim.sumTpopHours).toBe(lay.tpopH + berm.tpopH);
    expect(sim.months.map((m) => m.startMonth)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
    for (const m of sim.months) {
      expect(m.years).toBe(3);
      if (m.p50Hours === null) {
        expect(m.censoredYears).toHaveLength(3);
        continue;
      }
      expect(m.p50Hours).toBeGreaterThanOrEqual(sim.sumTpopHours);
      expect(m.p90Hours!).toBeGreaterThanOrEqual(m.p50Hours);
      expect(m.wowP50Hours!).toBeCloseTo(m.p50Hours - sim.sumTpopHours, 9);
      expect(m.wowP90Hours!).toBeCloseTo(m.p90Hours! - sim.sumTpopHours, 9);
      // Finish dates: the next 1st of the month at 00:00 UTC on or after now, plus the duration.
      const start = Date.parse(m.startDate);
      expect(new Date(start).getUTCDate()).toBe(1);
      expect(new Date(start).getUTCMonth() + 1).toBe(m.startMonth);
      expect(start).toBeGreaterThanOrEqual(NOW.getTime());
      expect(start - NOW.getTime()).toBeLessThan(366 * 24 * HOUR);
      expect(Date.parse(m.p50Finish!) - start).toBeCloseTo(m.p50Hours * HOUR, -1);
    }
    // Without alpha the lay is no slower (OPLIM >= OPWF).
    const without = (await ctx.as.client.post(`${ctx.base}/campaigns/${c.body.id}/simulate?alpha=false`)).body as CampaignSimulation;
    sim.months.forEach((m, k) => {
      if (m.p50Hours !== null && without.months[k].p50Hours !== null)
        expect(without.months[k].p50Hours!).toBeLessThanOrEqual(m.p50Hours + 1e-9);
    });
  });

  it('caches a simulation by campaign, steps and limits: a repeat answers the same, a step change recomputes', async () => {
    const db = ctx.t.database.db;
    const setup = await loadProjectSetup(db, ctx.t.demo.projectId);
    const lay = setup.operations.find((o) => o.name === 'Cable lay, nearshore section')!;
    const berm = setup.operations.find((o) => o.name === 'Rock berm placement')!;
    const layStep = { operationId: lay.id, siteId: ctx.t.demo.siteIds.route };
    const bermStep = { operationId: berm.id, siteId: ctx.t.demo.siteIds.route };
    const c = await ctx.as.coordinator.post(`${ctx.base}/campaigns`).send({ name: 'Cached campaign', steps: [layStep, bermStep] });
    const simulate = async (id: string) => {
      const res = await ctx.as.client.post(`${ctx.base}/campaigns/${id}/simulate`);
      expect(res.status, res.text).toBe(200);
      return res.body as CampaignSimulation;
    };
    const storedKeys = async () =>
      (await db.select({ key: statsCache.key }).from(statsCache).where(eq(statsCache.projectId, ctx.t.demo.projectId)))
        .map((r) => r.key)
        .filter((k) => k.endsWith(`:campaign-${c.body.id}-true`));

    const first = await simulate(c.body.id);
    await settleStatsCache();
    expect(await storedKeys()).toHaveLength(1);
    expect(await simulate(c.body.id)).toEqual(first);
    clearStatsMemo(db);
    expect(await simulate(c.body.id)).toEqual(first);

    // Another step list is another version: recomputed (as a new campaign with those steps), and
    // the older stored version is replaced.
    expect((await ctx.as.coordinator.patch(`${ctx.base}/campaigns/${c.body.id}`).send({ steps: [bermStep] })).status).toBe(200);
    const changed = await simulate(c.body.id);
    const fresh = await ctx.as.coordinator.post(`${ctx.base}/campaigns`).send({ name: 'Berm only', steps: [bermStep] });
    const expected = await simulate(fresh.body.id);
    expect(changed.sumTpopHours).toBe(berm.tpopH);
    expect(changed.months).toEqual(expected.months);
    await settleStatsCache();
    expect(await storedKeys()).toHaveLength(1);

    for (const id of [c.body.id, fresh.body.id]) expect((await ctx.as.coordinator.delete(`${ctx.base}/campaigns/${id}`)).status).toBe(204);
  });

  it('hand case: in a sea where every hour is workable the campaign takes the sum of TPOP, WoW 0', async () => {
    const sim = await createAndSimulate(
      'Calm campaign',
      [
        [calmA, 'route'],
        [calmB, 'substation'],
        [calmA, 'route'],
      ],
      '2027-04-15T00:00:00Z',
    );
    // Hand sum: 10 + 6 + 10 = 26 h.
    expect(sim.sumTpopHours).toBe(26);
    for (const m of sim.months) {
      expect(m.censoredYears).toEqual([]);
      expect(m.p50Hours).toBe(26);
      expect(m.p90Hours).toBe(26);
      expect(m.wowP50Hours).toBe(0);
      expect(m.wowP90Hours).toBe(0);
    }
    // With a planned start the finish dates count from the 1st of its month: April 2027 onwards.
    const april = sim.months[3];
    expect(april.startDate).toBe('2027-04-01T00:00:00.000Z');
    expect(april.p50Finish).toBe('2027-04-02T02:00:00.000Z');
    expect(sim.months[2].startDate).toBe('2028-03-01T00:00:00.000Z');
  });

  it('hand case: a step that never gets a go-start censors every year', async () => {
    const sim = await createAndSimulate('Hopeless', [
      [calmA, 'route'],
      [never, 'route'],
    ]);
    for (const m of sim.months) {
      expect(m.years).toBe(3);
      expect(m.censoredYears).toEqual([2023, 2024, 2025]);
      expect(m.p50Hours).toBeNull();
      expect(m.p90Hours).toBeNull();
      expect(m.p50Finish).toBeNull();
      // Issue 22: the answer names the step every year stopped at (the second, index 1).
      expect(m.stuckSteps).toEqual([{ step: 1, years: 3 }]);
    }
    // "Never goes" asks for Tp 39-40 s, which the invented sea never has: no go-start at all.
    expect(sim.steps.map((st) => [st.operationName, st.goStartHours === 0])).toEqual([
      [sim.steps[0].operationName, false],
      ['Never goes', true],
    ]);
    expect(sim.neverStarts).toMatch(/^Step 2, Never goes at .+, never finds a window in .+: no 4 h \(TR\) in a row meet all its limits/);
  });

  it('answers 409 when a stored step no longer fits the project', async () => {
    const c = await ctx.as.coordinator
      .post(`${ctx.base}/campaigns`)
      .send({ name: 'Moves', steps: [{ operationId: calmB, siteId: ctx.t.demo.siteIds.substation }] });
    await ctx.as.coordinator.patch(`${ctx.base}/operations/${calmB}`).send({ siteIds: [ctx.t.demo.siteIds.route] });
    const res = await ctx.as.client.post(`${ctx.base}/campaigns/${c.body.id}/simulate`);
    expect(res.status).toBe(409);
    expect(res.body.error.details[0].field).toBe('steps.0.siteId');
    await ctx.as.coordinator.patch(`${ctx.base}/operations/${calmB}`).send({ siteIds: [ctx.t.demo.siteIds.substation] });
  });
});

/**
 * Stores a sea of Tp 6 s from 250° in the demo project, all of it one wind-sea partition and no
 * swell (Hs 0 = absent, docs/domain.md#partitions), so limits on the swell find their value.
 */
async function storeWindSeaOnly(
  meta: { name: string; kind: 'observation' | 'forecast'; dataPointName: string; issuedAt?: Date },
  timeMs: Float64Array,
  hs: Float64Array,
  wind: Float64Array,
) {
  const n = timeMs.length;
  return createDataset(
    ctx.t.database.db,
    {
      projectId: ctx.t.demo.projectId,
      createdBy: ctx.t.demo.users.coordinator,
      dataPointLatitude: null,
      dataPointLongitude: null,
      dataPointDepthM: null,
      sourceKind: 'upload',
      ...meta,
    },
    toSeaSeries({
      timeMs,
      hs,
      tp: new Float64Array(n).fill(6),
      dir: new Float64Array(n).fill(250),
      wind,
      extra: {
        'windSea.hs': hs.slice(),
        'windSea.tp': new Float64Array(n).fill(6),
        'windSea.dir': new Float64Array(n).fill(250),
        'swell1.hs': new Float64Array(n).fill(0),
        'swell1.tp': new Float64Array(n).fill(NaN),
        'swell1.dir': new Float64Array(n).fill(NaN),
      },
    }),
    {},
  );
}

describe('the downtime ledger', () => {
  let proposed: LedgerProposeAnswer;
  let obsId: string;
  let earlierIssueId: string;

  beforeAll(async () => {
    // A short calm observation record over 3 December 2026 (UTC = London time in winter): every
    // operation is workable, and it must win over the forecast for that day.
    const start = Date.UTC(2026, 11, 3);
    const n = 24;
    const timeMs = Float64Array.from({ length: n }, (_, i) => start + i * HOUR);
    const obs = await storeWindSeaOnly(
      { name: 'Calm buoy day (test)', kind: 'observation', dataPointName: 'test buoy' },
      timeMs,
      new Float64Array(n).fill(0.2),
      new Float64Array(n).fill(3),
    );
    obsId = obs.id;
    // An earlier forecast issue (30 November 18:00 UTC, 18 hours): calm until 06:00 on
    // 1 December, stormy after; the fake issue of 06:00 must decide from 06:00 on.
    const fStart = Date.UTC(2026, 10, 30, 18);
    const fn = 18;
    const fTime = Float64Array.from({ length: fn }, (_, i) => fStart + i * HOUR);
    const calm = (i: number) => fTime[i] < Date.UTC(2026, 11, 1, 6);
    const earlier = await storeWindSeaOnly(
      { name: 'Forecast issued 2026-11-30 18:00 UTC (test)', kind: 'forecast', dataPointName: 'test', issuedAt: new Date(fStart) },
      fTime,
      Float64Array.from({ length: fn }, (_, i) => (calm(i) ? 0.2 : 9)),
      Float64Array.from({ length: fn }, (_, i) => (calm(i) ? 3 : 30)),
    );
    earlierIssueId = earlier.id;
    now = NOW_LEDGER;
  });

  it('proposes days from the data, observation first, then the forecast', async () => {
    const res = await ctx.as.coordinator.post(`${ctx.base}/ledger/propose?from=2026-12-01&to=2026-12-31`);
    expect(res.status, res.text).toBe(200);
    proposed = res.body;
    // The observation, the fake forecast issue and the earlier test issue (for 1 December).
    expect(proposed.sources.map((s) => s.kind).sort()).toEqual(['forecast', 'forecast', 'observation']);
    const rows = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-01&to=2026-12-31`)).body as LedgerEntry[];
    expect(rows.length).toBe(proposed.written);
    expect(rows.length).toBeGreaterThan(0);
    for (const r of rows) {
      expect(r.status).toBe('proposed');
      expect(r.plannedHours).toBe(24);
      expect(r.proposedLostHours).toBeGreaterThanOrEqual(0);
      expect(r.proposedLostHours).toBeLessThanOrEqual(24);
      if (r.proposedLostHours === 0) expect(r.proposedLimiting).toBeNull();
      else expect(r.proposedLimiting).not.toBeNull();
    }
    const dec3 = rows.filter((r) => r.day === '2026-12-03');
    expect(dec3.length).toBe(await pairCount());
    for (const r of dec3) {
      expect(r.source).toBe('observation');
      expect(r.datasetId).toBe(obsId);
      // Hs 0.2 m, Tp 6 s, wind 3 m/s meet every seeded limit; the Tp 39-40 s operation never goes.
      if (r.operationName === 'Never goes') expect(r).toMatchObject({ proposedLostHours: 24, proposedLimiting: 'tpMin' });
      // The winching stage needs high water (a 3 h tide window either side, docs/domain.md#tide): calm seas or not,
      // it loses the hours away from high water, and the tide is what limits it.
      else if (r.operationName === 'Pull-in winching at high water') {
        expect(r.proposedLostHours).toBeGreaterThan(0);
        expect(r.proposedLostHours).toBeLessThan(24);
        expect(['tideWindow', 'minDepth']).toContain(r.proposedLimiting);
      } else expect(r).toMatchObject({ proposedLostHours: 0, proposedLimiting: null });
    }
  });

  // Issue 22, item 4: the ledger let a coordinator confirm and lock a day that had not happened.
  it('proposes only days that are over in the worksite zone; a finished day without observation comes from the forecast issues that covered it', async () => {
    // At NOW_LEDGER (10 December 12:00 UTC; London = UTC in December) 1-9 December are over.
    for (const n of proposed.notOver)
      expect(n.days).toEqual(Array.from({ length: 22 }, (_, k) => `2026-12-${String(10 + k).padStart(2, '0')}`));
    expect(proposed.uncovered).toEqual([]);
    const rows = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-01&to=2026-12-01`)).body as LedgerEntry[];
    expect(rows.length).toBe(await pairCount());
    // 1 December: 00:00-06:00 only the earlier issue covers; from 06:00 the newer one decides,
    // also where the earlier one still runs (06:00-12:00, where it is stormy). Hand-built: the
    // earlier issue is calm before 06:00, so only the newer issue's hours can be lost after it.
    const setup = await loadProjectSetup(ctx.t.database.db, ctx.t.demo.projectId);
    const series = await readSeries(ctx.t.database.db, ctx.t.demo.forecastId!);
    const depth = (await ctx.as.coordinator.get(`${ctx.base}/datasets/${ctx.t.demo.forecastId}`)).body.dataPoint.depthM;
    const from = Date.UTC(2026, 11, 1, 6);
    for (const r of rows) {
      expect(r.source).toBe('forecast');
      const site = setup.sites.find((s) => s.id === r.siteId)!;
      const op = setup.operations.find((o) => o.id === r.operationId)!;
      if (r.operationName === 'Never goes') {
        expect(r.proposedLostHours).toBe(24);
        continue;
      }
      const ev = evaluateHours(transformForSite(series, depth, site).engine, operationSpec(op, setup.vessels), {
        alpha: false,
        alphaTable: setup.alphaTable,
      });
      let workable = 0;
      for (let i = 0; i < series.timeMs.length; i++)
        if (series.timeMs[i] >= from && series.timeMs[i] < from + 18 * HOUR && ev.status[i] === STATUS.WORKABLE) workable++;
      // The tidal winching stage also loses hours before 06:00 (away from high water), whatever the sea.
      if (r.operationName === 'Pull-in winching at high water') expect(r.proposedLostHours).toBeGreaterThanOrEqual(18 - workable);
      else expect(r.proposedLostHours).toBe(18 - workable);
      expect(r.datasetId).toBe(ctx.t.demo.forecastId);
    }
    expect(proposed.sources.map((s) => s.id)).toContain(earlierIssueId);
  });

  it('refuses to confirm a day that is not over in the worksite’s time zone', async () => {
    // Second project: a worksite in Pacific/Auckland (UTC+13 in December) and one in London.
    const B = `/api/projects/${ctx.t.demo.secondProjectId}`;
    const site = async (name: string, timeZone: string) => {
      const res = await ctx.as.coordinator.post(`${B}/sites`).send({ name, depth: 10, timeZone });
      expect(res.status, res.text).toBe(201);
      return res.body.id as string;
    };
    const auckland = await site('Ledger quay, Auckland', 'Pacific/Auckland');
    const london = await site('Ledger quay, London', 'Europe/London');
    const op = await ctx.as.coordinator
      .post(`${B}/operations`)
      .send({ name: 'Ledger lift', tpop: 4, tc: 0, weatherRestricted: true, limits: { hsMax: 1 }, siteIds: [auckland, london] });
    expect(op.status, op.text).toBe(201);
    const row = async (siteId: string, day: string) =>
      (
        await ctx.t.database.db
          .insert(ledgerDay)
          .values({
            projectId: ctx.t.demo.secondProjectId,
            operationId: op.body.id,
            siteId,
            day,
            plannedHours: 24,
            proposedLostHours: 3,
            source: 'forecast',
          })
          .returning()
      )[0].id;
    // 10 December ends at 11:00 UTC in Auckland (00:00 on the 11th, UTC+13) and at 24:00 UTC in London.
    const tooEarly = await ctx.as.coordinator.post(`${B}/ledger/${await row(london, '2026-12-10')}/confirm`).send({});
    expect(tooEarly.status).toBe(409);
    expect(tooEarly.body.error.message).toMatch(/2026-12-10 is not over yet at Ledger quay, London \(Europe\/London\)/);
    const later = await ctx.as.coordinator.post(`${B}/ledger/${await row(london, '2026-12-20')}/confirm`).send({});
    expect(later.status).toBe(409);
    const over = await ctx.as.coordinator.post(`${B}/ledger/${await row(auckland, '2026-12-10')}/confirm`).send({});
    expect(over.status, over.text).toBe(200);
    expect(over.body.status).toBe('confirmed');
  });

  it('counts a forecast day as planned hours minus workable hours at OPLIM (checked hour by hour)', async () => {
    const rows = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-04&to=2026-12-04`)).body as LedgerEntry[];
    const setup = await loadProjectSetup(ctx.t.database.db, ctx.t.demo.projectId);
    const series = await readSeries(ctx.t.database.db, ctx.t.demo.forecastId!);
    const depth = (await ctx.as.coordinator.get(`${ctx.base}/datasets/${ctx.t.demo.forecastId}`)).body.dataPoint.depthM;
    for (const r of rows) {
      expect(r.source).toBe('forecast');
      const site = setup.sites.find((s) => s.id === r.siteId)!;
      const op = setup.operations.find((o) => o.id === r.operationId)!;
      const ev = evaluateHours(transformForSite(series, depth, site).engine, operationSpec(op, setup.vessels), {
        alpha: false,
        alphaTable: setup.alphaTable,
      });
      // 4 December 2026 in Europe/London (GMT): 00:00Z to 24:00Z. The fake forecast turns 3-hourly
      // after +72 h: each record counts its duration (until the next record; the last one 3 h),
      // clipped to the day (docs/domain.md#weather-windows: lengths are sums of durations).
      let workable = 0;
      const from = Date.UTC(2026, 11, 4);
      const t = series.timeMs;
      for (let i = 0; i < t.length; i++) {
        const end = i + 1 < t.length ? t[i + 1] : t[i] + 3 * HOUR;
        if (t[i] >= from && t[i] < from + 24 * HOUR && ev.status[i] === STATUS.WORKABLE)
          workable += (Math.min(end, from + 24 * HOUR) - t[i]) / HOUR;
      }
      expect(r.proposedLostHours).toBeCloseTo(24 - workable, 2);
    }
  });

  it('confirms a day as proposed or corrected with a note, locks it and audits it', async () => {
    const rows = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-04&to=2026-12-05`)).body as LedgerEntry[];
    const [a, b] = rows;
    // A correction without a note is refused; so are hours above the planned ones.
    const noNote = await ctx.as.coordinator
      .post(`${ctx.base}/ledger/${a.id}/confirm`)
      .send({ lostHours: ((a.proposedLostHours ?? 0) + 3) % 24 });
    expect(noNote.status).toBe(400);
    expect(noNote.body.error.details[0].field).toBe('note');
    expect((await ctx.as.coordinator.post(`${ctx.base}/ledger/${a.id}/confirm`).send({ lostHours: 25, note: 'x' })).status).toBe(400);
    expect((await ctx.as.coordinator.post(`${ctx.base}/ledger/${a.id}/confirm`).send({ lostHours: -1, note: 'x' })).status).toBe(400);

    const corrected = await ctx.as.coordinator
      .post(`${ctx.base}/ledger/${a.id}/confirm`)
      .send({ lostHours: 6, limiting: 'wind', note: 'Crew change, spread stood down at noon' });
    expect(corrected.status, corrected.text).toBe(200);
    expect(corrected.body).toMatchObject({
      status: 'confirmed',
      lostHours: 6,
      limiting: 'wind',
      note: 'Crew change, spread stood down at noon',
      confirmedBy: expect.any(String),
    });
    const asIs = await ctx.as.coordinator.post(`${ctx.base}/ledger/${b.id}/confirm`).send({});
    expect(asIs.status, asIs.text).toBe(200);
    expect(asIs.body.lostHours).toBe(b.proposedLostHours);
    expect(asIs.body.limiting).toBe(b.proposedLimiting);

    // Locked: a second confirmation is refused.
    expect((await ctx.as.coordinator.post(`${ctx.base}/ledger/${a.id}/confirm`).send({ note: 'again' })).status).toBe(409);
    // A new proposal leaves confirmed rows as they are.
    const again = (await ctx.as.coordinator.post(`${ctx.base}/ledger/propose?from=2026-12-04&to=2026-12-05`)).body as LedgerProposeAnswer;
    expect(again.keptConfirmed).toBe(2);
    const still = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-04&to=2026-12-04`)).body as LedgerEntry[];
    expect(still.find((r) => r.id === a.id)).toMatchObject({ status: 'confirmed', lostHours: 6 });

    const audit = await ctx.as.coordinator.get(`${ctx.base}/audit?entity=project`);
    expect(audit.status).toBe(200);
    const entry = audit.body.find((e: { entityId: string }) => e.entityId === a.id);
    expect(entry).toMatchObject({
      action: 'update',
      before: { status: 'proposed', lostHours: a.proposedLostHours },
      after: { status: 'confirmed', lostHours: 6, corrected: true },
    });
  });

  it('shows clients the confirmed days only', async () => {
    const rows = (await ctx.as.client.get(`${ctx.base}/ledger?from=2026-12-01&to=2026-12-31`)).body as LedgerEntry[];
    expect(rows).toHaveLength(2);
    for (const r of rows) expect(r.status).toBe('confirmed');
    const monthly = (await ctx.as.client.get(`${ctx.base}/ledger/monthly`)).body as LedgerMonthlyAnswer;
    for (const r of monthly.rows) expect(r.proposedLostHours).toBeNull();
  });

  it('totals each month against the hindcast expectation: P50/P90 as d3-array quantile (R-7)', async () => {
    const res = await ctx.as.coordinator.get(`${ctx.base}/ledger/monthly?from=2026-12-01&to=2026-12-31`);
    expect(res.status, res.text).toBe(200);
    const answer = res.body as LedgerMonthlyAnswer;
    expect(answer.hindcast?.id).toBe(ctx.t.demo.hindcastId);
    expect(answer.rows).toHaveLength(await pairCount());
    const setup = await loadProjectSetup(ctx.t.database.db, ctx.t.demo.projectId);
    const series = await readSeries(ctx.t.database.db, ctx.t.demo.hindcastId!);
    const depth = await datasetDepth();
    let confirmedTotal = 0;
    for (const r of answer.rows) {
      expect(r.month).toBe('2026-12');
      expect(r.monthHours).toBe(744);
      confirmedTotal += r.confirmedLostHours;
      // Independent expectation: December lost hours in 2023, 2024, 2025 (London = UTC in
      // December), 744 h minus the workable hours at OPLIM, then d3-array's quantile, which uses
      // the R-7 method (a general-purpose reference library).
      const site = setup.sites.find((s) => s.id === r.siteId)!;
      const op = setup.operations.find((o) => o.id === r.operationId)!;
      const ev = evaluateHours(transformForSite(series, depth, site).engine, operationSpec(op, setup.vessels), {
        alpha: false,
        alphaTable: setup.alphaTable,
      });
      const lost = [2023, 2024, 2025].map((y) => {
        const a = Date.UTC(y, 11, 1);
        const b = Date.UTC(y + 1, 0, 1);
        let workable = 0;
        for (let i = 0; i < series.timeMs.length; i++)
          if (series.timeMs[i] >= a && series.timeMs[i] < b && ev.status[i] === STATUS.WORKABLE) workable++;
        return 744 - workable;
      });
      expect(r.hindcastYears).toBe(3);
      expect(Math.abs(r.expectedP50Hours! - quantile(lost, 0.5)!)).toBeLessThanOrEqual(0.005);
      expect(Math.abs(r.expectedP90Hours! - quantile(lost, 0.9)!)).toBeLessThanOrEqual(0.005);
    }
    const confirmed = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-01&to=2026-12-31`)).body.filter(
      (r: LedgerEntry) => r.status === 'confirmed',
    );
    expect(confirmedTotal).toBeCloseTo(
      confirmed.reduce((s: number, r: LedgerEntry) => s + r.lostHours!, 0),
      6,
    );
  }, 240_000);

  // Issue 22: one basis per page. The ledger's expectation follows the page's forecast-limit
  // switch; OPWF = alpha x OPLIM with alpha <= 1 (DOMAIN "Operations and limits") can only make
  // more hours unworkable, so every expected figure is at least the OPLIM one.
  it('computes the expectation on the page’s basis when asked (alpha=true)', async () => {
    const plain = (await ctx.as.coordinator.get(`${ctx.base}/ledger/monthly?from=2026-12-01&to=2026-12-31`)).body as LedgerMonthlyAnswer;
    const withAlpha = (await ctx.as.coordinator.get(`${ctx.base}/ledger/monthly?from=2026-12-01&to=2026-12-31&alpha=true`))
      .body as LedgerMonthlyAnswer;
    expect([plain.alpha, withAlpha.alpha]).toEqual([false, true]);
    let stricter = 0;
    for (const r of withAlpha.rows) {
      const p = plain.rows.find((x) => x.operationId === r.operationId && x.siteId === r.siteId)!;
      expect(r.expectedP50Hours!).toBeGreaterThanOrEqual(p.expectedP50Hours!);
      if (r.expectedP50Hours! > p.expectedP50Hours!) stricter++;
      // The days themselves are what happened: the same on either basis.
      expect(r.confirmedLostHours).toBe(p.confirmedLostHours);
    }
    expect(stricter).toBeGreaterThan(0);
    expect((await ctx.as.coordinator.get(`${ctx.base}/ledger/monthly?alpha=yes`)).status).toBe(400);
  });
});

/** Operation-worksite pairs of the project now (the campaign tests add three operations). */
async function pairCount(): Promise<number> {
  const setup = await loadProjectSetup(ctx.t.database.db, ctx.t.demo.projectId);
  return setup.operations.reduce((a, o) => a + (o.siteIds.length === 0 ? setup.sites.length : o.siteIds.length), 0);
}

describe('who may do what', () => {
  it('lets clients read workability, campaigns and the ledger, and nothing more', async () => {
    const c = await ctx.as.coordinator
      .post(`${ctx.base}/campaigns`)
      .send({ name: 'Role check', steps: [{ operationId: ctx.t.demo.operationIds[0], siteId: ctx.t.demo.siteIds.cofferdam }] });
    expect(c.status, c.text).toBe(201);
    const id = c.body.id;
    for (const who of [ctx.as.client, ctx.as.skipper]) {
      expect((await who.get(`${ctx.base}/workability`)).status).toBe(200);
      expect((await who.get(`${ctx.base}/campaigns`)).status).toBe(200);
      expect((await who.get(`${ctx.base}/campaigns/${id}`)).status).toBe(200);
      expect((await who.post(`${ctx.base}/campaigns/${id}/simulate`)).status).toBe(200);
      expect((await who.get(`${ctx.base}/ledger?from=2026-12-01&to=2026-12-31`)).status).toBe(200);
      expect((await who.get(`${ctx.base}/ledger/monthly`)).status).toBe(200);
      expect((await who.post(`${ctx.base}/campaigns`).send({ name: 'No', steps: c.body.steps })).status).toBe(403);
      expect((await who.patch(`${ctx.base}/campaigns/${id}`).send({ name: 'No' })).status).toBe(403);
      expect((await who.delete(`${ctx.base}/campaigns/${id}`)).status).toBe(403);
      expect((await who.post(`${ctx.base}/ledger/propose?from=2026-12-01&to=2026-12-02`)).status).toBe(403);
    }
    const rows = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-06&to=2026-12-06`)).body as LedgerEntry[];
    expect((await ctx.as.client.post(`${ctx.base}/ledger/${rows[0].id}/confirm`).send({})).status).toBe(403);
    expect((await ctx.as.skipper.post(`${ctx.base}/ledger/${rows[0].id}/confirm`).send({})).status).toBe(403);
    // Administrators act as coordinators.
    expect((await ctx.as.admin.post(`${ctx.base}/ledger/${rows[0].id}/confirm`).send({})).status).toBe(200);
  });

  it('answers 401 to anonymous callers', async () => {
    const anon = request(ctx.t.app);
    expect((await anon.get(`${ctx.base}/workability`)).status).toBe(401);
    expect((await anon.get(`${ctx.base}/workability.csv`)).status).toBe(401);
    expect((await anon.get(`${ctx.base}/campaigns`)).status).toBe(401);
    expect((await anon.post(`${ctx.base}/campaigns`).send({})).status).toBe(401);
    expect((await anon.get(`${ctx.base}/ledger?from=2026-12-01&to=2026-12-02`)).status).toBe(401);
    expect((await anon.post(`${ctx.base}/ledger/propose?from=2026-12-01&to=2026-12-02`)).status).toBe(401);
  });

  it('answers 404 for another project and for ids of this project asked through another', async () => {
    const other = `/api/projects/${ctx.t.demo.secondProjectId}`;
    // The client is not a member of the second project.
    expect((await ctx.as.client.get(`${other}/workability`)).status).toBe(404);
    expect((await ctx.as.client.get(`${other}/campaigns`)).status).toBe(404);
    expect((await ctx.as.client.get(`${other}/ledger?from=2026-12-01&to=2026-12-02`)).status).toBe(404);
    // The coordinator is, but this project's campaign and ledger entry are not the second's.
    const list = (await ctx.as.coordinator.get(`${ctx.base}/campaigns`)).body;
    expect((await ctx.as.coordinator.get(`${other}/campaigns/${list[0].id}`)).status).toBe(404);
    expect((await ctx.as.coordinator.post(`${other}/campaigns/${list[0].id}/simulate`)).status).toBe(404);
    const rows = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-07&to=2026-12-07`)).body as LedgerEntry[];
    expect((await ctx.as.coordinator.post(`${other}/ledger/${rows[0].id}/confirm`).send({})).status).toBe(404);
    expect((await ctx.as.coordinator.post(`${ctx.base}/ledger/not-an-id/confirm`).send({})).status).toBe(404);
    // Ranges are checked.
    expect((await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-05&to=2026-12-01`)).status).toBe(400);
    expect((await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-01-01&to=2026-12-31`)).status).toBe(400);
    expect((await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-02-30&to=2026-03-01`)).status).toBe(400);
  });
});
