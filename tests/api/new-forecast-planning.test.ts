/**
 * A new forecast is planned at once (server/services/planning.ts, planNewForecasts, run every
 * minute by jobs/schedule.ts): a latest forecast stored outside the planning job (a coordinator's
 * fetch, an import) is planned and its alerts e-mailed without waiting for the next planning tick,
 * from the stored forecast (the service is not asked again), once.
 */
import { and, desc, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { useSignedInApp } from '../support/app';
import { dataset, planRun } from '../../server/db/schema';
import { planNewForecasts, runPlanningJob } from '../../server/services/planning';

let now = new Date('2026-12-01T06:20:00Z');
const ctx = useSignedInApp({ clock: () => now });

const inbox = () => ctx.t.mailer.fake!.messages;

async function runsOfProject() {
  return ctx.t.database.db
    .select({ trigger: planRun.trigger, status: planRun.status, datasetId: planRun.datasetId })
    .from(planRun)
    .where(eq(planRun.projectId, ctx.t.demo.projectId))
    .orderBy(desc(planRun.startedAt));
}

async function forecastIds(): Promise<string[]> {
  const rows = await ctx.t.database.db
    .select({ id: dataset.id })
    .from(dataset)
    .where(and(eq(dataset.projectId, ctx.t.demo.projectId), eq(dataset.kind, 'forecast')));
  return rows.map((r) => r.id);
}

describe('a new forecast is planned at once', () => {
  let fetchedId = '';

  it('does nothing while a project has no forecast', async () => {
    expect(await forecastIds()).toEqual([]);
    expect(await planNewForecasts(ctx.t.deps)).toEqual([]);
    expect(await runsOfProject()).toEqual([]);
  });

  it("plans a coordinator's fetched forecast and e-mails its alerts, without asking the service again", async () => {
    const fetched = await ctx.as.coordinator.post(`${ctx.base}/forecasts/fetch`).send({});
    expect(fetched.status, fetched.text).toBe(201);
    fetchedId = fetched.body.datasetId;
    expect(inbox()).toHaveLength(0);

    // Six hours on, the fake service has a newer issue: a run that asked it would store that one.
    now = new Date('2026-12-01T12:20:00Z');
    const results = await planNewForecasts(ctx.t.deps);
    expect(results).toHaveLength(1);
    expect(results[0]).toMatchObject({ projectId: ctx.t.demo.projectId, status: 'planned', datasetId: fetchedId, forecast: null });
    expect(results[0].queued).toBeGreaterThan(0);
    expect(await forecastIds()).toEqual([fetchedId]);
    expect(await runsOfProject()).toEqual([{ trigger: 'forecast', status: 'ok', datasetId: fetchedId }]);
    // The run delivers what it queued: the skipper (subscribed by default to the operations
    // assigned to them) hears of the windows of the new forecast.
    expect(inbox()).toHaveLength(results[0].queued!);
    for (const m of inbox()) expect(m.to).toEqual(['skipper@example.com']);
  });

  it('plans a forecast once: the next minute finds nothing new', async () => {
    const mails = inbox().length;
    expect(await planNewForecasts(ctx.t.deps)).toEqual([]);
    expect(await runsOfProject()).toHaveLength(1);
    expect(inbox()).toHaveLength(mails);
  });

  it('leaves a forecast that the scheduled job fetched and planned itself', async () => {
    now = new Date('2026-12-01T12:25:00Z');
    const job = await runPlanningJob(ctx.t.deps, { trigger: 'schedule', tickAt: now });
    expect(job.projects[0]).toMatchObject({ status: 'planned', forecast: { isNew: true } });
    const newest = job.projects[0].datasetId;
    expect(newest).not.toBe(fetchedId);
    expect(await planNewForecasts(ctx.t.deps)).toEqual([]);
    expect((await runsOfProject())[0]).toEqual({ trigger: 'schedule', status: 'ok', datasetId: newest });
  });

  it('does not try again, minute after minute, a forecast whose run failed', async () => {
    now = new Date('2026-12-01T18:20:00Z');
    const fetched = await ctx.as.coordinator.post(`${ctx.base}/forecasts/fetch`).send({});
    expect(fetched.status, fetched.text).toBe(201);
    // As a run for this forecast that failed (the engine or the database gave way) leaves it.
    await ctx.t.database.db.insert(planRun).values({
      projectId: ctx.t.demo.projectId,
      trigger: 'forecast',
      status: 'failed',
      startedAt: now,
      datasetId: fetched.body.datasetId,
      error: 'made to fail by the test',
    });
    const before = (await runsOfProject()).length;
    expect(await planNewForecasts(ctx.t.deps)).toEqual([]);
    expect(await runsOfProject()).toHaveLength(before);
  });
});
