import { quantile } from 'd3-array';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signInAll, type TestApp } from '../support/app';
import { evaluateStatus, goStarts, simulateOutlook } from '../../shared/engine';
import type { CampaignOutlookAnswer, CampaignResponse, OutlookHistoryPoint } from '../../shared/api-types-downtime';
import { auditEntry, campaignOutlook, ledgerDay, outbox } from '../../server/db/schema';
import { readSeries } from '../../server/services/series-store';
import { loadProjectSetup, operationSpec, transformForSite } from '../../server/services/site-context';
import { getDatasetRow } from '../../server/services/datasets';
import { runPlanningJob } from '../../server/services/planning';

let t: TestApp;
let as: Awaited<ReturnType<typeof signInAll>>;
let base: string;
// A fixed clock: the fake forecast is issued 2026-12-01 06:00 UTC and covers the next days; the
// three-year invented hindcast covers 2023-2025.
const NOW = new Date('2026-12-01T07:30:00Z');
const HOUR = 3_600_000;
let demo: CampaignResponse;
let fresh: CampaignResponse;

beforeAll(async () => {
  t = await createTestApp({ hindcastYears: 3, forecast: true, clock: () => NOW });
  as = await signInAll(t.app);
  base = `/api/projects/${t.demo.projectId}`;
  demo = ((await as.client.get(`${base}/campaigns`)).body as CampaignResponse[])[0];
  const res = await as.coordinator.post(`${base}/campaigns`).send({ name: 'Outlook test campaign', steps: demo.steps, timeZone: 'UTC' });
  expect(res.status, res.text).toBe(201);
  fresh = res.body;
}, 300_000);
afterAll(async () => {
  await t.close();
});

const outlookOf = async (id: string, agent = as.client) => {
  const res = await agent.get(`${base}/campaigns/${id}/outlook`);
  expect(res.status, res.text).toBe(200);
  return res.body as CampaignOutlookAnswer;
};

describe('the demo campaign (seed)', () => {
  it('is part done: the first step finished last week, and a few weeks of history show at once', async () => {
    expect(demo.progress[0].status).toBe('done');
    expect(Date.parse(demo.progress[0].doneAt!)).toBeLessThan(NOW.getTime() - 6 * 24 * HOUR);
    expect(demo.progress.slice(1).map((p) => p.status)).toEqual(['planned', 'planned']);
    const history = (await as.client.get(`${base}/campaigns/${demo.id}/outlook/history`)).body as OutlookHistoryPoint[];
    expect(history.length).toBeGreaterThanOrEqual(14);
    for (const h of history) expect(Date.parse(h.at)).toBeLessThan(NOW.getTime());
    const o = await outlookOf(demo.id);
    expect(o.steps.map((s) => s.index)).toEqual([1, 2]);
  });
});

describe('GET .../outlook', () => {
  it('answers the fields of the issue, percentiles in order, and the forecast and hindcast parts apart', async () => {
    const o = await outlookOf(fresh.id);
    expect(o.asOf).toBe(NOW.toISOString());
    const fcRow = await getDatasetRow(t.database.db, t.demo.projectId, t.demo.forecastId!);
    expect(o.forecastIssuedAt).toBe(fcRow.issuedAt!.toISOString());
    expect(o.forecast?.datasetId).toBe(t.demo.forecastId);
    // The demo forecast is an ensemble (control + 20 members, as the fake sends it): each run gives
    // one sample per hindcast year (2023-2025), 21 x 3.
    expect(o.forecast?.members).toBe(21);
    expect(o.forecast?.ensemble).toBe(true);
    expect(o.samples).toBe(21 * 3);
    expect(o.hindcast.samples).toBe(3);
    expect(o.steps.map((s) => s.index)).toEqual([0, 1, 2]);
    const sumTpop = 36 + 10 + 18; // seed/scenario-sites.ts
    expect(o.finish.p50, 'three years of hindcast finish the campaign').not.toBeNull();
    {
      const [p10, p50, p90] = [o.finish.p10!, o.finish.p50!, o.finish.p90!].map(Date.parse);
      expect(p10).toBeLessThanOrEqual(p50);
      expect(p50).toBeLessThanOrEqual(p90);
      expect(p10).toBeGreaterThanOrEqual(NOW.getTime() + sumTpop * HOUR);
      expect(o.remainingWowHours.p50).toBeCloseTo((p50 - NOW.getTime()) / HOUR - sumTpop, 1);
    }
    if (o.finish.p50 && o.hindcast.finish.p50)
      expect(o.forecastShiftHours.p50).toBeCloseTo((Date.parse(o.finish.p50) - Date.parse(o.hindcast.finish.p50)) / HOUR, 1);
  });

  it('equals the engine run on the stored series transformed here (hindcast part), with d3-array quantile (reference library)', async () => {
    const setup = await loadProjectSetup(t.database.db, t.demo.projectId);
    const row = await getDatasetRow(t.database.db, t.demo.projectId, t.demo.hindcastId!);
    const series = await readSeries(t.database.db, row.id);
    const flags = fresh.steps.map((s) => {
      const op = setup.operations.find((o) => o.id === s.operationId)!;
      const site = setup.sites.find((x) => x.id === s.siteId)!;
      const spec = operationSpec(op, setup.vessels);
      const engine = transformForSite(series, row.dataPointDepthM, site).engine;
      return goStarts(
        engine.timeMs,
        evaluateStatus(engine, spec, { alpha: true, alphaTable: setup.alphaTable }),
        HOUR,
        spec.tpopH + spec.tcH,
      );
    });
    const tpop = fresh.steps.map((s) => setup.operations.find((o) => o.id === s.operationId)!.tpopH);
    const samples = simulateOutlook({
      startMs: NOW.getTime(),
      tpopH: tpop,
      members: [],
      hindcast: { timeMs: series.timeMs, stepMs: HOUR, goStart: flags },
    });
    const finished = samples.filter((s) => !s.censored).map((s) => s.finishMs!);
    const o = await outlookOf(fresh.id);
    expect(o.hindcast.censored).toBe(samples.length - finished.length);
    expect(finished.length).toBeGreaterThan(0);
    {
      expect(Date.parse(o.hindcast.finish.p50!)).toBeCloseTo(quantile(finished, 0.5)!, -1);
      expect(Date.parse(o.hindcast.finish.p90!)).toBeCloseTo(quantile(finished, 0.9)!, -1);
    }
  });

  it('refuses a bad alpha with the field named', async () => {
    const res = await as.client.get(`${base}/campaigns/${fresh.id}/outlook?alpha=maybe`);
    expect(res.status).toBe(400);
    expect(res.text).toContain('alpha');
  });
});

describe('PATCH .../steps/:index (progress)', () => {
  it('lets only coordinators mark progress; clients and skippers read it', async () => {
    for (const who of [as.client, as.skipper]) {
      const res = await who.patch(`${base}/campaigns/${fresh.id}/steps/0`).send({ status: 'started' });
      expect(res.status).toBe(403);
    }
    expect((await as.client.get(`${base}/campaigns/${fresh.id}`)).body.progress[0].status).toBe('planned');
    expect((await as.skipper.get(`${base}/campaigns/${fresh.id}/outlook/history`)).status).toBe(200);
  });

  it('refuses out-of-order steps, future times and a done step the ledger does not show, naming the field', async () => {
    const later = await as.coordinator.patch(`${base}/campaigns/${fresh.id}/steps/1`).send({ status: 'started' });
    expect(later.status).toBe(409);
    expect(later.text).toContain('Step 1 is not done yet');
    const future = await as.coordinator
      .patch(`${base}/campaigns/${fresh.id}/steps/0`)
      .send({ status: 'done', doneAt: '2026-12-02T00:00:00Z' });
    expect(future.status).toBe(400);
    expect(future.body.error.details[0].field).toBe('doneAt');
    const noLedger = await as.coordinator.patch(`${base}/campaigns/${fresh.id}/steps/0`).send({ status: 'done' });
    expect(noLedger.status).toBe(400);
    expect(noLedger.body.error.details[0].field).toBe('doneAt');
    expect(noLedger.text).toContain('ledger');
    expect((await as.coordinator.patch(`${base}/campaigns/${fresh.id}/steps/7`).send({ status: 'done' })).status).toBe(404);
  });

  it('marking step 1 done moves every sample to step 2, started at its actual end; the change is audited', async () => {
    const res = await as.coordinator
      .patch(`${base}/campaigns/${fresh.id}/steps/0`)
      .send({ status: 'done', startedAt: new Date(NOW.getTime() - 40 * HOUR).toISOString(), doneAt: NOW.toISOString() });
    expect(res.status, res.text).toBe(200);
    expect(res.body.progress[0]).toMatchObject({ status: 'done', doneAt: NOW.toISOString(), source: 'hand' });
    const o = await outlookOf(fresh.id);
    expect(o.startFrom).toBe(NOW.toISOString());
    expect(o.steps.map((s) => s.index)).toEqual([1, 2]);
    for (const s of o.steps) if (s.p50Start) expect(Date.parse(s.p50Start)).toBeGreaterThanOrEqual(NOW.getTime());
    const sumRemaining = 10 + 18;
    if (o.finish.p10) expect(Date.parse(o.finish.p10)).toBeGreaterThanOrEqual(NOW.getTime() + sumRemaining * HOUR);

    const [entry] = await t.database.db
      .select()
      .from(auditEntry)
      .where(and(eq(auditEntry.entity, 'campaign'), eq(auditEntry.entityId, fresh.id)));
    expect(entry.userId).toBe(t.demo.users.coordinator);
    expect(entry.before).toMatchObject({ step: 0, status: 'planned' });
    expect(entry.after).toMatchObject({ step: 0, status: 'done', doneAt: NOW.toISOString() });
  });

  it('takes the end of a done step from the confirmed ledger days when they show its TPOP worked', async () => {
    // Step 2 (rock berm, TPOP 10 h): two confirmed days, 6 h and then 5 h worked.
    const step = fresh.steps[1];
    await t.database.db.insert(ledgerDay).values([
      {
        projectId: t.demo.projectId,
        operationId: step.operationId,
        siteId: step.siteId,
        day: '2026-11-28',
        plannedHours: 24,
        proposedLostHours: 18,
        lostHours: 18,
        source: 'forecast',
        status: 'confirmed',
      },
      {
        projectId: t.demo.projectId,
        operationId: step.operationId,
        siteId: step.siteId,
        day: '2026-11-29',
        plannedHours: 24,
        proposedLostHours: 19,
        lostHours: 19,
        source: 'forecast',
        status: 'confirmed',
      },
    ]);
    // Its start is after step 1's end (now), so the ledger days before it do not count.
    const started = await as.coordinator.patch(`${base}/campaigns/${fresh.id}/steps/1`).send({ status: 'started' });
    expect(started.status, started.text).toBe(200);
    expect(started.body.progress[1]).toMatchObject({ status: 'started', startedAt: NOW.toISOString() });
    const tooEarly = await as.coordinator.patch(`${base}/campaigns/${fresh.id}/steps/1`).send({ status: 'done' });
    expect(tooEarly.status).toBe(400);
    // Back to planned, step 1 back to started with its real start before those days: now the ledger says done.
    expect((await as.coordinator.patch(`${base}/campaigns/${fresh.id}/steps/1`).send({ status: 'planned' })).status).toBe(200);
    expect(
      (
        await as.coordinator
          .patch(`${base}/campaigns/${fresh.id}/steps/0`)
          .send({ status: 'done', startedAt: '2026-11-25T00:00:00Z', doneAt: '2026-11-27T12:00:00Z' })
      ).status,
    ).toBe(200);
    const done = await as.coordinator.patch(`${base}/campaigns/${fresh.id}/steps/1`).send({ status: 'done' });
    expect(done.status, done.text).toBe(200);
    // Europe/London is UTC in November: the end of 29 November.
    expect(done.body.progress[1]).toMatchObject({
      status: 'done',
      doneAt: '2026-11-30T00:00:00.000Z',
      source: 'ledger',
      startedAt: '2026-11-28T00:00:00.000Z',
    });
    const o = await outlookOf(fresh.id);
    expect(o.steps.map((s) => s.index)).toEqual([2]);
  });
});

describe('editing the steps of a campaign with progress', () => {
  it('keeps the progress of steps that stay at their index, and drops it from the first step that changes', async () => {
    const before = (await as.coordinator.get(`${base}/campaigns/${fresh.id}`)).body as CampaignResponse;
    expect(before.progress.map((p) => p.status)).toEqual(['done', 'done', 'planned']);
    const shorter = await as.coordinator.patch(`${base}/campaigns/${fresh.id}`).send({ steps: before.steps.slice(0, 2) });
    expect(shorter.status, shorter.text).toBe(200);
    expect(shorter.body.progress.map((p: { status: string }) => p.status)).toEqual(['done', 'done']);
    const swapped = await as.coordinator.patch(`${base}/campaigns/${fresh.id}`).send({ steps: [before.steps[1], before.steps[0]] });
    expect(swapped.body.progress.map((p: { status: string }) => p.status)).toEqual(['planned', 'planned']);
  });
});

describe('history and alerts', () => {
  it('each planning run stores the outlook; an e-mail goes to a client who asked when the P50 moved more than N days', async () => {
    const before = ((await as.client.get(`${base}/campaigns/${demo.id}/outlook/history`)).body as OutlookHistoryPoint[]).length;
    // The client asks to hear about moves of more than 2 days.
    const sub = await as.client.put(`${base}/subscription`).send({
      operationIds: [],
      siteIds: [],
      immediate: false,
      digest: false,
      digestTime: '06:00',
      digestTimeZone: 'UTC',
      active: true,
      outlookMoveDays: 2,
    });
    expect(sub.status, sub.text).toBe(200);
    expect(sub.body.outlookMoveDays).toBe(2);
    // A stored outlook whose P50 is far from anything this run can give (60 days before now).
    await t.database.db.insert(campaignOutlook).values({
      projectId: t.demo.projectId,
      campaignId: demo.id,
      at: new Date(NOW.getTime() - HOUR),
      p50: new Date(NOW.getTime() - 60 * 24 * HOUR),
      p90: null,
      samples: 3,
      censored: 0,
    });
    const job = await runPlanningJob(t.deps, { projectId: t.demo.projectId, trigger: 'manual' });
    expect(job.projects[0].status).toBe('planned');
    const history = (await as.client.get(`${base}/campaigns/${demo.id}/outlook/history`)).body as OutlookHistoryPoint[];
    expect(history.length).toBe(before + 2);
    const last = history[history.length - 1];
    expect(last.at).toBe(NOW.toISOString());
    expect(last.forecastIssuedAt).toBe((await getDatasetRow(t.database.db, t.demo.projectId, t.demo.forecastId!)).issuedAt!.toISOString());
    const [row] = await t.database.db
      .select()
      .from(campaignOutlook)
      .where(and(eq(campaignOutlook.campaignId, demo.id), eq(campaignOutlook.at, NOW)));
    expect(row.planRunId).toBe(job.projects[0].planRunId);

    const mails = await t.database.db.select().from(outbox).where(eq(outbox.userId, t.demo.users.client));
    const moved = mails.filter((m) => m.idempotencyKey.startsWith(`outlook:${demo.id}:`));
    expect(last.p50).not.toBeNull();
    {
      expect(moved).toHaveLength(1);
      expect(moved[0].subject).toContain('P50 finish moved');
      expect(moved[0].toEmail).toBe('client@example.com');
      // The same run again: the P50 is unchanged, so nothing more is sent.
      await runPlanningJob(t.deps, { projectId: t.demo.projectId, trigger: 'manual' });
      const again = (await t.database.db.select().from(outbox).where(eq(outbox.userId, t.demo.users.client))).filter((m) =>
        m.idempotencyKey.startsWith(`outlook:${demo.id}:`),
      );
      expect(again).toHaveLength(1);
    }
    // The skipper asked nothing and is not a client or coordinator here: no outlook e-mail.
    const skipperMails = (await t.database.db.select().from(outbox).where(eq(outbox.userId, t.demo.users.skipper))).filter((m) =>
      m.idempotencyKey.startsWith('outlook:'),
    );
    expect(skipperMails).toHaveLength(0);
  });

  it('with no forecast, the outlook equals its hindcast-only part', async () => {
    const del = await as.coordinator.delete(`${base}/datasets/${t.demo.forecastId}`);
    expect([200, 204]).toContain(del.status);
    const o = await outlookOf(demo.id);
    expect(o.forecast).toBeNull();
    expect(o.forecastIssuedAt).toBeNull();
    expect(o.finish).toEqual(o.hindcast.finish);
    expect(o.samples).toBe(o.hindcast.samples);
    expect(o.forecastShiftHours.p50 === null || o.forecastShiftHours.p50 === 0).toBe(true);
  });
});
