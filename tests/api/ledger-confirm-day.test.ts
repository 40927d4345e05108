/**
 * POST /api/projects/:projectId/ledger/confirm-day: a coordinator confirms a whole day's proposals
 * as proposed, in one go, all or none, each entry audited as a single confirmation is; confirmed
 * entries stay as they were; only a day that is over in each worksite's zone.
 */
import { and, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import type { LedgerEntry } from '../../shared/api-types-downtime';
import { ledgerDay, worksite } from '../../server/db/schema';
import { useSignedInApp } from '../support/app';

// The fake forecast service's issues cover the three days before 2026-12-03 (pastForecastDays).
const now = new Date('2026-12-03T10:00:00Z');
const ctx = useSignedInApp({ hindcastYears: 3, forecast: true, pastForecastDays: 3, clock: () => now }, { timeoutMs: 120_000 });

const ledger = async (day: string) => (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=${day}&to=${day}`)).body as LedgerEntry[];
const confirmDay = (body: object, who: 'coordinator' | 'skipper' | 'client' = 'coordinator') =>
  ctx.as[who].post(`${ctx.base}/ledger/confirm-day`).send(body);

describe('confirming a whole ledger day', () => {
  it('is for coordinators, with a valid day that has proposals', async () => {
    const proposed = await ctx.as.coordinator.post(`${ctx.base}/ledger/propose?from=2026-11-30&to=2026-12-02`);
    expect(proposed.status, proposed.text).toBe(200);
    expect(proposed.body.written).toBeGreaterThan(0);
    expect((await confirmDay({ day: '2026-12-01' }, 'skipper')).status).toBe(403);
    expect((await confirmDay({ day: '2026-12-01' }, 'client')).status).toBe(403);
    const bad = await confirmDay({ day: '2026-02-30' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('day');
    const none = await confirmDay({ day: '2026-11-01' });
    expect(none.status).toBe(409);
    expect(none.body.error.message).toContain('2026-11-01 has no proposed entry');
    expect((await confirmDay({ day: '2026-12-01', siteId: '00000000-0000-4000-8000-000000000000' })).status).toBe(404);
    expect((await ledger('2026-12-01')).every((r) => r.status === 'proposed')).toBe(true);
  });

  it('confirms every proposal of the day as proposed, leaves a confirmed one as it was, and audits each', async () => {
    const before = await ledger('2026-12-01');
    expect(before.length).toBeGreaterThan(1);
    // One entry confirmed by hand first, corrected with a note.
    const [first, ...rest] = before;
    const corrected = Math.min(first.plannedHours, first.proposedLostHours! + 1);
    const one = await ctx.as.coordinator
      .post(`${ctx.base}/ledger/${first.id}/confirm`)
      .send({ lostHours: corrected, note: 'From the log' });
    expect(one.status, one.text).toBe(200);
    const auditBefore = (await ctx.as.coordinator.get(`${ctx.base}/audit?entity=project&limit=500`)).body as unknown[];

    const res = await confirmDay({ day: '2026-12-01', note: 'Checked against the daily reports' });
    expect(res.status, res.text).toBe(200);
    const answer = res.body as LedgerEntry[];
    expect(answer.map((r) => r.id).sort()).toEqual(rest.map((r) => r.id).sort());
    const after = new Map((await ledger('2026-12-01')).map((r) => [r.id, r]));
    for (const r of rest)
      expect(after.get(r.id)).toMatchObject({
        status: 'confirmed',
        lostHours: r.proposedLostHours,
        limiting: r.proposedLimiting,
        note: 'Checked against the daily reports',
      });
    expect(after.get(first.id)).toMatchObject({ status: 'confirmed', lostHours: corrected, note: 'From the log' });
    const auditAfter = (await ctx.as.coordinator.get(`${ctx.base}/audit?entity=project&limit=500`)).body as { entityId: string }[];
    expect(auditAfter.length - auditBefore.length).toBe(rest.length);
    for (const r of rest) expect(auditAfter.some((e) => e.entityId === r.id)).toBe(true);
    // Nothing left to confirm that day.
    expect((await confirmDay({ day: '2026-12-01' })).status).toBe(409);
  });

  it('confirms one worksite only when asked', async () => {
    const day = await ledger('2026-12-02');
    const siteId = day[0].siteId;
    const res = await confirmDay({ day: '2026-12-02', siteId });
    expect(res.status, res.text).toBe(200);
    const after = await ledger('2026-12-02');
    for (const r of after) expect(r.status).toBe(r.siteId === siteId ? 'confirmed' : 'proposed');
    expect(after.some((r) => r.status === 'proposed')).toBe(true);
  });

  it('confirms nothing of a day that is not over at one of its worksites', async () => {
    // 2026-12-03 at 10:00 UTC: over at a worksite on UTC+14 (Pacific/Kiritimati), not in London.
    const db = ctx.t.database.db;
    const sites = await db.select().from(worksite).where(eq(worksite.projectId, ctx.t.demo.projectId));
    const [east, west] = [...sites].sort((a, b) => (a.id < b.id ? -1 : 1));
    await db.update(worksite).set({ timeZone: 'Pacific/Kiritimati' }).where(eq(worksite.id, east.id));
    const template = (await db.select().from(ledgerDay).where(eq(ledgerDay.projectId, ctx.t.demo.projectId)))[0];
    const row = (siteId: string) => ({
      projectId: ctx.t.demo.projectId,
      operationId: template.operationId,
      siteId,
      day: '2026-12-03',
      plannedHours: 24,
      proposedLostHours: 3,
      source: 'observation' as const,
      status: 'proposed' as const,
    });
    // Confirmed in the order of the worksites' ids: the one where the day is over comes first.
    await db.insert(ledgerDay).values([row(east.id), row(west.id)]);
    const res = await confirmDay({ day: '2026-12-03' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain('not over yet');
    const rows = await db
      .select({ status: ledgerDay.status })
      .from(ledgerDay)
      .where(and(eq(ledgerDay.projectId, ctx.t.demo.projectId), eq(ledgerDay.day, '2026-12-03')));
    expect(rows.map((r) => r.status)).toEqual(['proposed', 'proposed']);
    // The day at the worksite where it is over can be confirmed alone.
    expect((await confirmDay({ day: '2026-12-03', siteId: east.id })).status).toBe(200);
  });
});
