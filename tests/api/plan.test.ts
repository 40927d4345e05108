import request from 'supertest';
import ICAL from 'ical.js';
import { describe, expect, it } from 'vitest';
import { useSignedInApp, textBody } from '../support/app';
import type { ConditionsAnswer } from '../../shared/api-types-plan';
import { formatInstant } from '../../shared/dates';

// A fixed clock in a winter month, so the invented forecast has passing weather systems.
const NOW = new Date('2026-12-01T07:30:00Z');

const ctx = useSignedInApp({ clock: () => NOW, forecast: true });

const HOUR = 3_600_000;

describe('the forecast plan', () => {
  it('answers per operation and worksite with statuses, windows and go-starts', async () => {
    const res = await ctx.as.skipper.get(`${ctx.base}/plan`);
    expect(res.status, res.text).toBe(200);
    expect(res.body.dataset.kind).toBe('forecast');
    // Every operation at each of its worksites: seed/scenario-sites.ts gives 2 + 1 + 2 + 1 + 2 + 1 pairs.
    expect(res.body.plans).toHaveLength(9);
    for (const p of res.body.plans) {
      expect(p.status).toHaveLength(p.times.length);
      // The fake forecast: hourly to +72 h, then 3-hourly to +240 h (129 records).
      expect(p.times.length).toBe(129);
      for (const s of p.status) expect(['workable', 'marginal', 'not_workable', 'no_data']).toContain(s);
      const ms = p.times.map((x: string) => Date.parse(x));
      // Each record lasts until the next one (no gaps in the fake forecast); the last one 3 h.
      const end = (i: number) => (i + 1 < ms.length ? ms[i + 1] : ms[i] + 3 * HOUR);
      // Brute force of the local step rule (docs/domain.md#weather-windows): runs continue across
      // the change of step, lengths are sums of durations, a window is a run at least TR long.
      const want: { start: string; end: string; hours: number }[] = [];
      for (let i = 0; i < ms.length;) {
        if (p.status[i] !== 'workable') {
          i++;
          continue;
        }
        let j = i;
        while (j + 1 < ms.length && p.status[j + 1] === 'workable') j++;
        const hours = (end(j) - ms[i]) / HOUR;
        if (hours >= p.tr && end(j) > Date.parse(res.body.generatedAt))
          want.push({ start: p.times[i], end: new Date(end(j)).toISOString(), hours });
        i = j + 1;
      }
      if (p.informationOnly) expect(p.windows).toEqual([]);
      else
        expect(
          p.windows.map((w: { start: string; end: string; hours: number }) => ({ start: w.start, end: w.end, hours: w.hours })),
        ).toEqual(want);
      if (p.earliestStart) {
        // The earliest go-start has TR of workable time from it.
        const i0 = p.times.indexOf(p.earliestStart);
        let covered = 0;
        for (let i = i0; covered < p.tr * HOUR; i++) {
          expect(p.status[i]).toBe('workable');
          covered += end(i) - ms[i];
        }
      }
    }
  });

  it('reuses a plan within the clock minute but never across a limit change', async () => {
    const before = (await ctx.as.coordinator.get(`${ctx.base}/plan`)).body;
    const p = before.plans.find((x: { status: string[] }) => x.status.includes('workable'));
    expect(p, 'some operation has workable hours in the invented forecast').toBeDefined();
    // A limit no sea meets (Hs at most 0.1 m, the smallest allowed) makes every hour with data not workable at once.
    const op = (await ctx.as.coordinator.get(`${ctx.base}/operations/${p.operationId}`)).body;
    const changed = await ctx.as.coordinator
      .patch(`${ctx.base}/operations/${p.operationId}`)
      .send({ limits: { ...op.limits, hsMax: 0.1 } });
    expect(changed.status, changed.text).toBe(200);
    const after = (await ctx.as.coordinator.get(`${ctx.base}/plan`)).body;
    const q = after.plans.find((x: { operationId: string; siteId: string }) => x.operationId === p.operationId && x.siteId === p.siteId);
    expect(q.status).not.toContain('workable');
    expect(q.windows).toHaveLength(0);
    const restored = await ctx.as.coordinator.patch(`${ctx.base}/operations/${p.operationId}`).send({ limits: op.limits });
    expect(restored.status, restored.text).toBe(200);
    expect((await ctx.as.coordinator.get(`${ctx.base}/plan`)).body.plans).toEqual(before.plans);
  });

  it('plans on OPLIM with alpha=false: never fewer workable hours', async () => {
    const withAlpha = (await ctx.as.coordinator.get(`${ctx.base}/plan`)).body;
    const without = (await ctx.as.coordinator.get(`${ctx.base}/plan?alpha=false`)).body;
    for (let k = 0; k < withAlpha.plans.length; k++) {
      const a = withAlpha.plans[k].status.filter((s: string) => s === 'workable').length;
      const b = without.plans[k].status.filter((s: string) => s === 'workable').length;
      expect(b).toBeGreaterThanOrEqual(a);
      expect(without.plans[k].status).not.toContain('marginal');
    }
  });

  it('explains an hour: data point → Ks, Kr → worksite → each limit', async () => {
    const plan = (await ctx.as.client.get(`${ctx.base}/plan`)).body;
    const p = plan.plans[0];
    const hour = p.times[5];
    const res = await ctx.as.client.get(`${ctx.base}/plan/chain`).query({ operationId: p.operationId, siteId: p.siteId, time: hour });
    expect(res.status, res.text).toBe(200);
    expect(res.body.time).toBe(hour);
    expect(res.body.status).toBe(p.status[5]);
    const { transform, site, dataPoint } = res.body;
    // Hs at the site = Hs at the data point × Ks × Kr, unless capped by the depth limit; an hour
    // the forecast gives in partitions combines them: sqrt(sum Hs_i,site^2) (docs/domain.md#partitions).
    const parts = res.body.partitions as { site: { hs: number } }[] | undefined;
    if (parts) expect(site.hs).toBeCloseTo(Math.hypot(...parts.map((x) => x.site.hs)), 6);
    else if (!(transform.flags & 2)) expect(site.hs).toBeCloseTo(dataPoint.hs * transform.ks * transform.kr, 6);
    expect(res.body.checks.length).toBeGreaterThan(0);
  });

  it('exports the usable windows as iCalendar that a general-purpose parser reads', async () => {
    const plan = (await ctx.as.coordinator.get(`${ctx.base}/plan?alpha=false`)).body;
    const withWindows = plan.plans.find((p: { windows: unknown[] }) => p.windows.length > 0);
    expect(withWindows, 'the invented forecast should open at least one window').toBeTruthy();
    const res = await ctx.as.coordinator
      .get(`${ctx.base}/plan/windows.ics`)
      .query({ operationId: withWindows.operationId, siteId: withWindows.siteId, alpha: 'false' })
      .buffer(true)
      .parse(textBody);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/calendar/);
    // ical.js (an RFC 5545 parser from npm) reads it back.
    const comp = new ICAL.Component(ICAL.parse(res.body as string));
    const events = comp.getAllSubcomponents('vevent').map((e) => new ICAL.Event(e));
    expect(events).toHaveLength(withWindows.windows.length);
    expect(events[0].startDate.toJSDate().toISOString()).toBe(withWindows.windows[0].start);
    expect(events[0].endDate.toJSDate().toISOString()).toBe(withWindows.windows[0].end);
    // Work begun at the window's start: planned to finish at + TPOP, contingency to + TR, in the
    // worksite's zone (the demo's worksites are on Europe/London, GMT in winter).
    const startMs = Date.parse(withWindows.windows[0].start);
    const when = (ms: number) => formatInstant(ms, withWindows.timeZone, 'dateTime');
    expect(events[0].description).toContain(
      `If started at ${when(startMs)}: planned finish ${when(startMs + withWindows.tpop * 3_600_000)}, contingency to ${when(startMs + withWindows.tr * 3_600_000)} (${withWindows.timeZone}).`,
    );
  });

  it('draws worksite conditions with each operation’s limits', async () => {
    const res = await ctx.as.client.get(`${ctx.base}/conditions/${ctx.t.demo.siteIds.route}`);
    expect(res.status).toBe(200);
    expect(res.body.hs.length).toBe(res.body.times.length);
    expect(res.body.operations.map((o: { name: string }) => o.name)).toContain('Rock berm placement');
  });

  it('gives the governing response per hour for an operation with response limits, as the hour chain computes it', async () => {
    const res = await ctx.as.client.get(`${ctx.base}/conditions/${ctx.t.demo.siteIds.route}`);
    expect(res.status, res.text).toBe(200);
    type Op = ConditionsAnswer['operations'][number];
    const ops = res.body.operations as Op[];
    // Operations without response limits carry none (seed/scenario-sites.ts: the rock berm has Hs, Tp and wind limits only).
    expect(ops.find((o) => o.name === 'Rock berm placement')!.responses).toBeUndefined();
    const lay = ops.find((o) => o.name === 'Cable lay, nearshore section')!;
    const r = lay.responses!;
    // The demo's limit on the lay barge: roll, most probable maximum over 3 h, at most 4 deg (seed/scenario-sites.ts).
    expect(r.limits).toEqual([{ response: 'roll_deg_per_m', label: 'Roll', unit: 'deg', statistic: 'mpm', durationH: 3, max: 4 }]);
    for (const k of ['governing', 'ratio', 'value', 'forecastRatio'] as const) expect(r[k]).toHaveLength(res.body.times.length);
    const hours = r.governing.flatMap((g, i) => (g === null ? [] : [i]));
    expect(hours.length, 'the invented forecast gives the worksite partitions at most hours').toBeGreaterThan(res.body.times.length / 2);
    for (const i of hours) {
      // R / R_lim, and the forecast limit is alpha x R_lim with alpha of the table (at most 1).
      expect(r.ratio[i]).toBeCloseTo(r.value[i]! / 4, 2);
      expect(r.forecastRatio[i]).toBeGreaterThan(0);
      expect(r.forecastRatio[i]).toBeLessThanOrEqual(1);
    }
    // The hour chain works the same hour on its own path (explain-hour.ts, per hour), with alpha.
    for (const i of [hours[0], hours[Math.floor(hours.length / 2)]]) {
      const chain = await ctx.as.client
        .get(`${ctx.base}/plan/chain`)
        .query({ operationId: lay.id, siteId: ctx.t.demo.siteIds.route, time: res.body.times[i] });
      expect(chain.status, chain.text).toBe(200);
      const check = (chain.body.checks as { limit: string; value: number; opwf: number }[]).find((c) => c.limit === 'response')!;
      expect(r.value[i]).toBeCloseTo(check.value, 2);
      expect(r.forecastRatio[i]! * 4).toBeCloseTo(check.opwf, 2);
    }
  });

  it('keeps the plan to members', async () => {
    expect((await request(ctx.t.app).get(`${ctx.base}/plan`)).status).toBe(401);
    const other = await ctx.as.client.get(`/api/projects/${ctx.t.demo.secondProjectId}/plan`);
    expect(other.status).toBe(404);
    expect((await ctx.as.client.get(`${ctx.base}/plan?dataset=nope`)).status).toBe(400);
    expect((await ctx.as.client.get(`${ctx.base}/plan?dataset=00000000-0000-4000-8000-000000000000`)).status).toBe(404);
  });
});
