// GET /api/projects/:projectId/overview: the Overview's answer against the routes it is composed
// from (the plan, the ledger and its monthly expectation, the outbox), for each role. What each
// role must get is the list (issue 17, "Overview = today's picture, per role").
import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import type { OverviewAnswer } from '../../shared/api-types-overview';
import type { PlanAnswer } from '../../shared/api-types-plan';
import type { LedgerEntry, LedgerMonthlyAnswer } from '../../shared/api-types-downtime';
import { alert, outbox, planRun } from '../../server/db/schema';
import { useSignedInApp } from '../support/app';

// A fixed clock: the fake forecast is issued 2026-12-01 06:00 UTC; the ledger needs finished days,
// so the second half of the tests moves the clock on (the earlier issues cover those days).
let now = new Date('2026-12-01T07:30:00Z');
const HOUR = 3_600_000;

const ctx = useSignedInApp({ hindcastYears: 3, forecast: true, pastForecastDays: 3, clock: () => now }, { timeoutMs: 120_000 });

describe('the project Overview', () => {
  it('gives one line per operation and worksite with the plan’s own go-start', async () => {
    const [res, planRes] = await Promise.all([
      ctx.as.coordinator.get(`${ctx.base}/overview`),
      ctx.as.coordinator.get(`${ctx.base}/plan?alpha=true`),
    ]);
    expect(res.status, res.text).toBe(200);
    const o = res.body as OverviewAnswer;
    const plan = planRes.body as PlanAnswer;
    expect(o.role).toBe('coordinator');
    expect(o.forecast?.id).toBe(plan.dataset?.id);
    expect(o.lines).toHaveLength(plan.plans.length);
    for (const p of plan.plans) {
      const l = o.lines.find((x) => x.operationId === p.operationId && x.siteId === p.siteId)!;
      expect(l).toBeDefined();
      expect(l.earliestStart).toBe(p.earliestStart);
      expect(l.startNow).toBe(p.startNow);
      expect(l.informationOnly).toBe(p.informationOnly);
      // The window is the one that holds the go-start (windows end exclusive, docs/domain.md#convention-10).
      const go = p.startNow ? now.getTime() : p.earliestStart ? Date.parse(p.earliestStart) : null;
      const w = go === null ? undefined : p.windows.find((x) => Date.parse(x.start) <= go && go < Date.parse(x.end));
      expect(l.windowHours).toBe(w ? w.hours : null);
      // The demo's forecast is an ensemble (docs/domain.md#forecast-uncertainty): the chance is the
      // plan's start chance at the go-start, none without a go-start.
      const goIndex = p.earliestStart ? p.times.indexOf(p.earliestStart) : -1;
      expect(l.chance).toBe(goIndex >= 0 && p.startChance ? p.startChance[goIndex] : null);
      if (goIndex >= 0 && !p.informationOnly) expect(l.chance).toBeGreaterThan(0);
      // The strip: the hours from the one covering now, at most 48 h ahead, with the plan's statuses.
      expect(l.next.times.length).toBeGreaterThan(0);
      const first = Date.parse(l.next.times[0]);
      expect(first).toBe(Math.floor(now.getTime() / HOUR) * HOUR);
      for (const [i, time] of l.next.times.entries()) {
        expect(Date.parse(time) - first).toBeLessThan(48 * HOUR);
        expect(l.next.status[i]).toBe(p.status[p.times.indexOf(time)]);
      }
      // A limiting factor only when the operation cannot start now, and only a limit the plan named.
      if (p.startNow) expect(l.limiting).toBeNull();
      if (l.limiting) expect(p.limiting).toContain(l.limiting);
    }
    // The forecast at the data point now: a direction "coming from" in [0, 360).
    expect(o.dataPointNow).not.toBeNull();
    expect(Date.parse(o.dataPointNow!.time)).toBeLessThanOrEqual(now.getTime());
    expect(o.dataPointNow!.dir).toBeGreaterThanOrEqual(0);
    expect(o.dataPointNow!.dir).toBeLessThan(360);
  });

  it('gives each role its own parts', async () => {
    const skipper = (await ctx.as.skipper.get(`${ctx.base}/overview`)).body as OverviewAnswer;
    expect(skipper.coordinator).toBeNull();
    expect(skipper.month).toBeNull();
    const me = (await ctx.as.skipper.get('/api/me')).body as { id: string };
    const plan = (await ctx.as.skipper.get(`${ctx.base}/plan?alpha=true`)).body as PlanAnswer;
    for (const l of skipper.lines)
      expect(l.mine).toBe(plan.plans.find((p) => p.operationId === l.operationId && p.siteId === l.siteId)!.skipperIds.includes(me.id));
    expect(skipper.lines.some((l) => l.mine)).toBe(true);

    const client = (await ctx.as.client.get(`${ctx.base}/overview`)).body as OverviewAnswer;
    expect(client.coordinator).toBeNull();
    expect(client.month?.rows.length).toBe(plan.plans.length);

    const coordinator = (await ctx.as.coordinator.get(`${ctx.base}/overview`)).body as OverviewAnswer;
    expect(coordinator.coordinator).toMatchObject({ ledgerDaysWaiting: 0, oldestWaitingDay: null, failedEmails: 0 });
    // The set-up steps' counts are those of the routes that list each part.
    const [sites, operations, datasets, project] = await Promise.all(
      ['/sites', '/operations', '/datasets', ''].map(async (path) => (await ctx.as.coordinator.get(`${ctx.base}${path}`)).body),
    );
    const kinds = (datasets as { kind: string }[]).map((d) => d.kind);
    expect(coordinator.coordinator!.setup).toEqual({
      worksites: (sites as unknown[]).length,
      operations: (operations as unknown[]).length,
      dataPointPlaced: project.dataPointLatitude != null && project.dataPointLongitude != null,
      statisticsDatasets: kinds.filter((k) => k === 'hindcast' || k === 'observation').length,
      forecasts: kinds.filter((k) => k === 'forecast').length,
      forecastSource: project.forecastSource,
    });
    expect(coordinator.coordinator!.setup.worksites).toBeGreaterThan(0);
    expect(coordinator.coordinator!.setup.forecasts).toBeGreaterThan(0);
  });

  it('counts a new project’s set-up steps from nothing, and each part as it is added', async () => {
    const created = await ctx.as.coordinator.post('/api/projects').send({ name: 'Empty quay works' });
    expect(created.status, created.text).toBe(201);
    const base = `/api/projects/${created.body.id as string}`;
    const setupOf = async () => ((await ctx.as.coordinator.get(`${base}/overview`)).body as OverviewAnswer).coordinator!.setup;
    expect(await setupOf()).toMatchObject({ worksites: 0, operations: 0, dataPointPlaced: false, statisticsDatasets: 0, forecasts: 0 });
    const site = await ctx.as.coordinator.post(`${base}/sites`).send({ name: 'Quay head', depth: 6, timeZone: 'Europe/London' });
    expect(site.status, site.text).toBe(201);
    expect((await setupOf()).worksites).toBe(1);
  });

  it('says what the last planning run changed, counted by kind per operation and worksite', async () => {
    expect(((await ctx.as.coordinator.get(`${ctx.base}/overview`)).body as OverviewAnswer).lastPlan).toBeNull();
    const job = await ctx.as.coordinator.post(`${ctx.base}/replan`).send({});
    expect(job.status, job.text).toBe(200);
    const runId = job.body.projects[0].planRunId as string;
    const stored = await ctx.t.database.db.select().from(alert).where(eq(alert.planRunId, runId));
    // The first run against no plan before: every usable window is new, so there are changes.
    expect(stored.length).toBeGreaterThan(0);
    const o = (await ctx.as.client.get(`${ctx.base}/overview`)).body as OverviewAnswer;
    const plan = (await ctx.as.client.get(`${ctx.base}/plan?alpha=true`)).body as PlanAnswer;
    expect(o.lastPlan).not.toBeNull();
    const groups = o.lastPlan!.changes;
    // One entry per operation and worksite with a change, each change counted once under its kind.
    expect(new Set(groups.map((g) => `${g.operationId}|${g.siteId}`)).size).toBe(groups.length);
    expect(new Set(groups.map((g) => `${g.operationId}|${g.siteId}`))).toEqual(new Set(stored.map((a) => `${a.operationId}|${a.siteId}`)));
    for (const g of groups) {
      const own = stored.filter((a) => a.operationId === g.operationId && a.siteId === g.siteId);
      const byKind: Record<string, number> = {};
      for (const a of own) byKind[a.kind] = (byKind[a.kind] ?? 0) + 1;
      expect(g.counts).toEqual(byKind);
      const p = plan.plans.find((x) => x.operationId === g.operationId && x.siteId === g.siteId)!;
      expect([g.operationName, g.siteName]).toEqual([p.operationName, p.siteName]);
    }
  });

  it('says when the planning job failed after its last good run, the error to coordinators only', async () => {
    const good = ((await ctx.as.client.get(`${ctx.base}/overview`)).body as OverviewAnswer).lastPlan!;
    expect(((await ctx.as.client.get(`${ctx.base}/overview`)).body as OverviewAnswer).failedPlan).toBeNull();
    // A failed run before the good one says nothing; one after it does.
    const before = new Date(Date.parse(good.at) - 60_000);
    const after = new Date(Date.parse(good.at) + 60_000);
    await ctx.t.database.db.insert(planRun).values([
      { projectId: ctx.t.demo.projectId, trigger: 'schedule', status: 'failed', startedAt: before, error: 'an older failure' },
      {
        projectId: ctx.t.demo.projectId,
        trigger: 'schedule',
        status: 'failed',
        startedAt: after,
        error: 'The forecast service did not answer',
      },
    ]);
    const coordinator = (await ctx.as.coordinator.get(`${ctx.base}/overview`)).body as OverviewAnswer;
    expect(coordinator.failedPlan).toEqual({ at: after.toISOString(), error: 'The forecast service did not answer' });
    expect(coordinator.lastPlan!.at).toBe(good.at);
    const client = (await ctx.as.client.get(`${ctx.base}/overview`)).body as OverviewAnswer;
    expect(client.failedPlan).toEqual({ at: after.toISOString(), error: null });
    // A good run after the failure clears it.
    now = new Date(Date.parse(good.at) + 5 * 60_000);
    expect((await ctx.as.coordinator.post(`${ctx.base}/replan`).send({})).status).toBe(200);
    expect(((await ctx.as.coordinator.get(`${ctx.base}/overview`)).body as OverviewAnswer).failedPlan).toBeNull();
  });

  it('counts the ledger days waiting and the failed e-mails for the coordinator', async () => {
    now = new Date('2026-12-03T10:00:00Z');
    const proposed = await ctx.as.coordinator.post(`${ctx.base}/ledger/propose?from=2026-11-30&to=2026-12-02`);
    expect(proposed.status, proposed.text).toBe(200);
    const rows = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-11-30&to=2026-12-02`)).body as LedgerEntry[];
    expect(rows.length).toBeGreaterThan(0);
    // A failed alert e-mail, as the delivery leaves one after its last attempt.
    await ctx.t.database.db.insert(outbox).values({
      idempotencyKey: 'overview-test-failed',
      projectId: ctx.t.demo.projectId,
      toEmail: 'nobody@example.com',
      subject: 'Test',
      text: 'Test',
      html: '<p>Test</p>',
      status: 'failed',
    });
    const o = (await ctx.as.coordinator.get(`${ctx.base}/overview`)).body as OverviewAnswer;
    expect(o.coordinator?.ledgerDaysWaiting).toBe(rows.filter((r) => r.status === 'proposed').length);
    expect(o.coordinator?.oldestWaitingDay).toBe(rows.map((r) => r.day).sort()[0]);
    expect(o.coordinator?.failedEmails).toBe(1);
    await ctx.t.database.db.delete(outbox).where(eq(outbox.idempotencyKey, 'overview-test-failed'));
  });

  it('gives the client this month’s confirmed downtime with the ledger’s own expectation', async () => {
    const rows = (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=2026-12-01&to=2026-12-02`)).body as LedgerEntry[];
    const day = rows.find((r) => r.status === 'proposed')!;
    expect((await ctx.as.coordinator.post(`${ctx.base}/ledger/${day.id}/confirm`).send({})).status).toBe(200);
    const o = (await ctx.as.client.get(`${ctx.base}/overview`)).body as OverviewAnswer;
    const monthly = (await ctx.as.client.get(`${ctx.base}/ledger/monthly?from=2026-12-01&to=2026-12-31`)).body as LedgerMonthlyAnswer;
    const want = monthly.rows.find((r) => r.operationId === day.operationId && r.siteId === day.siteId)!;
    const got = o.month!.rows.find((r) => r.operationId === day.operationId && r.siteId === day.siteId)!;
    expect(got.month).toBe('2026-12');
    expect(got.confirmedDays).toBe(1);
    expect(got.confirmedLostHours).toBe(want.confirmedLostHours);
    expect(got.expectedP50Hours).toBe(want.expectedP50Hours);
    expect(got.expectedP90Hours).toBe(want.expectedP90Hours);
    expect(got.expectedP50Hours).not.toBeNull();
    // 3 December: 1 and 2 December are over in the worksite's zone.
    expect(got.daysOver).toBe(2);
  });

  it('refuses a bad query with the field named', async () => {
    const res = await ctx.as.client.get(`${ctx.base}/overview?alpha=maybe`);
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error.details)).toContain('alpha');
  });
});
