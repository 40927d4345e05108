import request from 'supertest';
import ICAL from 'ical.js';
import { describe, expect, it } from 'vitest';
import { runPlanningJob } from '../../server/services/planning';
import { TEST_ORIGIN, useSignedInApp, textBody } from '../support/app';
import { deliverDueMail } from '../../server/services/outbox';
import { planRun } from '../../server/db/schema';

let now = new Date('2026-12-01T06:20:00Z');
const SKIPPER_OPS = ['Rock berm placement', 'ROV burial survey', 'Crew transfer (CTV Sable Wren)'];

const ctx = useSignedInApp({ clock: () => now });

const inbox = () => ctx.t.mailer.fake!.messages;

/** Stores a demo account's subscription to the demo project (every worksite, active). */
async function subscribe(
  who: 'skipper' | 'client',
  choice: { operationIds: string[]; immediate: boolean; digest: boolean; digestTime: string; digestTimeZone: string },
) {
  const res = await ctx.as[who].put(`/api/projects/${ctx.t.demo.projectId}/subscription`).send({ ...choice, siteIds: [], active: true });
  expect(res.status, res.text).toBe(200);
}

describe('the planning job with the fake forecast service and the fake SMTP server', () => {
  let firstCount = 0;

  it('plans, queues alerts and e-mails the right people', async () => {
    const res = await ctx.as.admin.post('/api/admin/jobs/plan').send({ projectId: ctx.t.demo.projectId });
    expect(res.status, res.text).toBe(200);
    const [p] = res.body.projects;
    expect(p.status).toBe('planned');
    expect(p.forecast.isNew).toBe(true);
    expect(p.queued).toBeGreaterThan(0);
    expect(res.body.mail.sent).toBe(p.queued);
    firstCount = inbox().length;
    expect(firstCount).toBe(p.queued);
    for (const m of inbox()) {
      // Only the skipper is subscribed (by default, to the operations assigned to them).
      expect(m.to).toEqual(['skipper@example.com']);
      expect(SKIPPER_OPS.some((name) => m.subject.startsWith(`Varrow Reach export cable and landfall: ${name} at `))).toBe(true);
      // The subject names the next start still possible (with its date) and what changed.
      expect(m.subject).toMatch(
        /, (may start now|next start \w{3} \d{1,2} \w{3} \d\d:\d\d|no start possible in this forecast) \((new window, starts from|window lost|earliest start now|may start now|may no longer start now|not workable at)/,
      );
      expect(m.text).toMatch(/Decision support only/);
      expect(m.text).toContain(`/projects/${ctx.t.demo.projectId}/board`);
      expect(m.html).toContain('<ul');
    }
    // Window times in the e-mail are in the worksite's zone: Europe/London keeps GMT (UTC+0) in
    // December, so the local clock time equals the UTC one.
    const plan = (await ctx.as.skipper.get(`/api/projects/${ctx.t.demo.projectId}/plan`)).body;
    const berm = plan.plans.find((x: { operationName: string }) => x.operationName === 'Rock berm placement');
    if (berm.windows.length > 0) {
      const mail = inbox().find((m) => m.subject.includes(': Rock berm placement at '))!;
      expect(mail.text).toContain(berm.windows[0].start.slice(11, 16));
    }
  });

  it('sends nothing when run again on the same forecast', async () => {
    const res = await ctx.as.admin.post('/api/admin/jobs/plan').send({ projectId: ctx.t.demo.projectId });
    expect(res.body.projects[0].status).toBe('planned');
    expect(res.body.projects[0].forecast.isNew).toBe(false);
    expect(res.body.projects[0].queued).toBe(0);
    expect(inbox().length).toBe(firstCount);
  });

  it('sends only the changes when a new forecast comes in', async () => {
    now = new Date('2026-12-01T12:20:00Z'); // next forecast cycle of the fake service
    const res = await ctx.as.coordinator.post(`/api/projects/${ctx.t.demo.projectId}/replan`).send({});
    const [p] = res.body.projects;
    expect(p.forecast.isNew).toBe(true);
    const newMessages = inbox().slice(firstCount);
    expect(newMessages.length).toBe(p.queued);
    // Every e-mail is about an operation with an alert in this run.
    const opsWithAlerts = new Set(p.alerts.map((a: { operationId: string }) => a.operationId));
    const ops = (await ctx.as.coordinator.get(`/api/projects/${ctx.t.demo.projectId}/operations`)).body as { id: string; name: string }[];
    for (const m of newMessages) {
      const op = ops.find((o) => m.subject.includes(`: ${o.name} at `))!;
      expect(opsWithAlerts.has(op.id)).toBe(true);
    }
    firstCount = inbox().length;
  });

  it('keeps e-mails in the outbox while SMTP is down and sends each once when it is back', async () => {
    ctx.t.mailer.fake!.setDown(true);
    now = new Date('2026-12-01T18:20:00Z');
    // Make sure this run has something to say: the skipper now hears about every operation.
    await subscribe('skipper', { operationIds: [], immediate: true, digest: false, digestTime: '06:00', digestTimeZone: 'Europe/London' });
    const res = await ctx.as.admin.post('/api/admin/jobs/plan').send({ projectId: ctx.t.demo.projectId });
    const [p] = res.body.projects;
    expect(p.status).toBe('planned');
    expect(inbox().length).toBe(firstCount);
    const outbox = (await ctx.as.coordinator.get(`/api/projects/${ctx.t.demo.projectId}/outbox`)).body as {
      status: string;
      attempts: number;
    }[];
    const waiting = outbox.filter((m) => m.status === 'pending');
    expect(waiting.length).toBe(p.queued);
    expect(waiting.every((m) => m.attempts === 1)).toBe(true);

    ctx.t.mailer.fake!.setDown(false);
    // Not due yet: the first retry waits a minute.
    await deliverDueMail(ctx.t.deps.db, ctx.t.deps.mailer, now, { maxAttempts: 3, log: ctx.t.deps.log, links: ctx.t.deps.config });
    expect(inbox().length).toBe(firstCount);
    const later = new Date(now.getTime() + 2 * 60_000);
    const delivered = await deliverDueMail(ctx.t.deps.db, ctx.t.deps.mailer, later, {
      maxAttempts: 3,
      log: ctx.t.deps.log,
      links: ctx.t.deps.config,
    });
    expect(delivered.sent).toBe(p.queued);
    expect(inbox().length).toBe(firstCount + p.queued);
    // Nothing doubled: another delivery round sends nothing more.
    await deliverDueMail(ctx.t.deps.db, ctx.t.deps.mailer, new Date(later.getTime() + 3_600_000), {
      maxAttempts: 3,
      log: ctx.t.deps.log,
      links: ctx.t.deps.config,
    });
    expect(inbox().length).toBe(firstCount + p.queued);
    const keys = inbox().map((m) => `${m.to}|${m.subject}|${m.text}`);
    expect(new Set(keys).size).toBe(keys.length);
    firstCount = inbox().length;
  });

  it('lets only one of two instances plan a project at a time', async () => {
    now = new Date('2026-12-02T00:20:00Z');
    const secondInstance = { ...ctx.t.deps }; // another app instance on the same database
    const [a, b] = await Promise.all([
      runPlanningJob(ctx.t.deps, { projectId: ctx.t.demo.projectId, trigger: 'schedule' }),
      runPlanningJob(secondInstance, { projectId: ctx.t.demo.projectId, trigger: 'schedule' }),
    ]);
    const statuses = [a.projects[0].status, b.projects[0].status].sort();
    expect(statuses).toEqual(['planned', 'skipped']);
  });

  it('plans a project once per cron tick across instances, and again when the run of the tick was cut short', async () => {
    // Two instances run the same schedule; one reaches the tick after the other has finished.
    now = new Date('2026-12-02T00:30:00Z');
    const tickAt = new Date('2026-12-02T00:30:00Z');
    const secondInstance = { ...ctx.t.deps };
    const first = await runPlanningJob(ctx.t.deps, { projectId: ctx.t.demo.projectId, trigger: 'schedule', tickAt });
    now = new Date('2026-12-02T00:30:07Z');
    const late = await runPlanningJob(secondInstance, { projectId: ctx.t.demo.projectId, trigger: 'schedule', tickAt });
    expect(first.projects[0].status).toBe('planned');
    expect(late.projects[0]).toMatchObject({
      status: 'skipped',
      reason: 'planned on this tick by another instance',
      planRunId: first.projects[0].planRunId,
    });

    // The next tick: an instance killed while planning left its run 'running'; the other plans it.
    const nextTick = new Date('2026-12-02T00:40:00Z');
    now = nextTick;
    await ctx.t.deps.db
      .insert(planRun)
      .values({ projectId: ctx.t.demo.projectId, trigger: 'schedule', status: 'running', startedAt: nextTick });
    now = new Date('2026-12-02T00:40:02Z');
    const after = await runPlanningJob(secondInstance, { projectId: ctx.t.demo.projectId, trigger: 'schedule', tickAt: nextTick });
    expect(after.projects[0].status).toBe('planned');
    // A run asked for by a person (no tick) is never skipped.
    const manual = await runPlanningJob(ctx.t.deps, { projectId: ctx.t.demo.projectId, trigger: 'manual' });
    expect(manual.projects[0].status).toBe('planned');
  });

  it('keeps the last plan when the forecast service fails', async () => {
    const before = (await ctx.as.coordinator.get(`/api/projects/${ctx.t.demo.projectId}/plan`)).body.dataset.id;
    now = new Date('2026-12-02T06:20:00Z');
    ctx.t.forecast.fake!.setFailure('http500', 1);
    const res = await ctx.as.admin.post('/api/admin/jobs/plan').send({ projectId: ctx.t.demo.projectId });
    expect(res.body.projects[0].status).toBe('failed');
    expect(res.body.projects[0].reason).toMatch(/forecast service/i);
    expect((await ctx.as.coordinator.get(`/api/projects/${ctx.t.demo.projectId}/plan`)).body.dataset.id).toBe(before);
  });

  it('unsubscribes by the signed link in the e-mail (one-click POST, RFC 8058), and refuses a forged one', async () => {
    const link = inbox()
      .at(-1)!
      .text.match(/Stop these e-mails: (\S+)/)![1];
    const path = link.replace(TEST_ORIGIN, '');
    const forged = path.replace(/sig=[^&]+/, 'sig=forged');
    expect((await request(ctx.t.app).get(forged)).status).toBe(400);
    expect((await request(ctx.t.app).post(forged)).status).toBe(400);
    // Opening the link shows a confirmation page and changes nothing.
    const shown = await request(ctx.t.app).get(path);
    expect(shown.status).toBe(200);
    expect((await ctx.as.skipper.get(`/api/projects/${ctx.t.demo.projectId}/subscription`)).body.active).toBe(true);
    const ok = await request(ctx.t.app).post(path).type('form').send('List-Unsubscribe=One-Click');
    expect(ok.status).toBe(200);
    expect(ok.text).toContain('Unsubscribed');
    const sub = (await ctx.as.skipper.get(`/api/projects/${ctx.t.demo.projectId}/subscription`)).body;
    expect(sub.active).toBe(false);
  });

  it('shows the caught mail to admins only, as JSON', async () => {
    const res = await ctx.as.admin.get('/api/dev/mailbox');
    expect(res.status).toBe(200);
    expect(res.body[0]).toEqual(
      expect.objectContaining({
        to: expect.any(Array),
        subject: expect.any(String),
        text: expect.any(String),
        html: expect.any(String),
        receivedAt: expect.any(String),
      }),
    );
    expect((await ctx.as.coordinator.get('/api/dev/mailbox')).status).toBe(403);
    expect((await ctx.as.coordinator.post('/api/admin/jobs/plan').send({})).status).toBe(403);
    expect((await ctx.as.skipper.post(`/api/projects/${ctx.t.demo.projectId}/replan`).send({})).status).toBe(403);
  });
});

describe('the calendar feed', () => {
  it('serves windows and recurring occurrences that ical.js parses, and stops when revoked', async () => {
    const ops = (await ctx.as.coordinator.get(`/api/projects/${ctx.t.demo.projectId}/operations`)).body as { id: string; name: string }[];
    const ctv = ops.find((o) => o.name.startsWith('Crew transfer'))!;
    const rec = await ctx.as.coordinator
      .put(`/api/projects/${ctx.t.demo.projectId}/operations/${ctv.id}/recurrence`)
      .send({ start: '2026-11-30T06:00', timeZone: 'Europe/London', rule: 'FREQ=WEEKLY;BYDAY=MO,WE,FR' });
    expect(rec.status, rec.text).toBe(200);
    expect((await ctx.as.client.put(`/api/projects/${ctx.t.demo.projectId}/operations/${ctv.id}/recurrence`).send({})).status).toBe(403);

    await subscribe('skipper', {
      operationIds: [ctv.id],
      immediate: true,
      digest: false,
      digestTime: '06:00',
      digestTimeZone: 'Europe/London',
    });
    const created = await ctx.as.skipper.post('/api/me/calendar').send({});
    expect(created.status).toBe(201);
    const path = new URL(created.body.url).pathname;
    const feed = await request(ctx.t.app).get(path).buffer(true).parse(textBody);
    expect(feed.status).toBe(200);
    const comp = new ICAL.Component(ICAL.parse(feed.body as string));
    const events = comp.getAllSubcomponents('vevent').map((e) => new ICAL.Event(e));
    const plan = (await ctx.as.skipper.get(`/api/projects/${ctx.t.demo.projectId}/plan`)).body;
    const ctvPlan = plan.plans.find((p: { operationId: string }) => p.operationId === ctv.id);
    expect(ctvPlan.occurrences.length).toBeGreaterThan(0);
    expect(events.length).toBe(ctvPlan.windows.length + ctvPlan.occurrences.length);
    const occurrenceStarts = events.filter((e) => !e.summary.startsWith('Window')).map((e) => e.startDate.toJSDate().toISOString());
    expect(occurrenceStarts.sort()).toEqual(ctvPlan.occurrences.map((o: { start: string }) => o.start).sort());
    // Mondays, Wednesdays and Fridays at 06:00 London time (GMT in December).
    for (const s of occurrenceStarts) {
      expect(s.slice(11, 16)).toBe('06:00');
      expect([1, 3, 5]).toContain(new Date(s).getUTCDay());
    }

    expect((await ctx.as.skipper.delete('/api/me/calendar')).status).toBe(204);
    expect((await request(ctx.t.app).get(path)).status).toBe(404);
  });
});

describe('the daily digest', () => {
  it('goes once per local day, at or after the chosen local time', async () => {
    const { queueDigests } = await import('../../server/services/digests');
    await subscribe('client', { operationIds: [], immediate: false, digest: true, digestTime: '07:30', digestTimeZone: 'Europe/Oslo' });
    const clientMails = () => inbox().filter((m) => m.to.includes('client@example.com'));
    const before = clientMails().length;
    // Europe/Oslo is UTC+1 in December: 07:30 local is 06:30 UTC.
    now = new Date('2026-12-03T06:20:00Z');
    expect(await queueDigests(ctx.t.deps)).toBe(0);
    now = new Date('2026-12-03T06:40:00Z');
    expect(await queueDigests(ctx.t.deps)).toBe(1);
    expect(await queueDigests(ctx.t.deps)).toBe(0);
    await deliverDueMail(ctx.t.deps.db, ctx.t.deps.mailer, now, { maxAttempts: 3, log: ctx.t.deps.log, links: ctx.t.deps.config });
    const digest = clientMails().slice(before);
    expect(digest).toHaveLength(1);
    expect(digest[0].subject).toMatch(/windows for Thu 3 Dec/);
    expect(digest[0].text).toMatch(/Decision support only/);
    // Next local day: another one.
    now = new Date('2026-12-04T07:00:00Z');
    expect(await queueDigests(ctx.t.deps)).toBe(1);
  });
});
