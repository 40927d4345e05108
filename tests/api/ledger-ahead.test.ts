/**
 * Ledger days proposed ahead (server/services/ledger-ahead.ts, run every hour by jobs/schedule.ts):
 * the last week's finished days are proposed as the Propose button proposes them, only where they
 * change, never over a confirmed day and never a day not over yet in the worksite's zone.
 */
import { and, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import type { LedgerEntry } from '../../shared/api-types-downtime';
import { ledgerDay } from '../../server/db/schema';
import { LEDGER_AHEAD_DAYS, proposeLedgerAhead } from '../../server/services/ledger-ahead';
import { useSignedInApp } from '../support/app';

// The fake forecast service's issues cover the three days before 2026-12-03 (pastForecastDays).
let now = new Date('2026-12-03T10:00:00Z');
const ctx = useSignedInApp({ hindcastYears: 3, forecast: true, pastForecastDays: 3, clock: () => now }, { timeoutMs: 120_000 });

const from = new Date(now.getTime() - LEDGER_AHEAD_DAYS * 86_400_000).toISOString().slice(0, 10);
const ledger = async () => (await ctx.as.coordinator.get(`${ctx.base}/ledger?from=${from}&to=2026-12-03`)).body as LedgerEntry[];
const key = (r: LedgerEntry) => `${r.operationId}|${r.siteId}|${r.day}`;
const figures = (rows: LedgerEntry[]) =>
  new Map(rows.map((r) => [key(r), [r.status, r.plannedHours, r.proposedLostHours, r.proposedLimiting, r.source, r.datasetId]]));

async function updatedAtOf(): Promise<Map<string, number>> {
  const rows = await ctx.t.database.db
    .select({ operationId: ledgerDay.operationId, siteId: ledgerDay.siteId, day: ledgerDay.day, updatedAt: ledgerDay.updatedAt })
    .from(ledgerDay)
    .where(eq(ledgerDay.projectId, ctx.t.demo.projectId));
  return new Map(rows.map((r) => [`${r.operationId}|${r.siteId}|${r.day}`, r.updatedAt.getTime()]));
}

describe('ledger days proposed ahead', () => {
  it('proposes the finished days of the last week, as the Propose button does', async () => {
    expect(await ledger()).toEqual([]);
    const result = await proposeLedgerAhead(ctx.t.deps);
    expect(result.failed).toBe(0);
    const mine = result.written.find((w) => w.projectId === ctx.t.demo.projectId);
    expect(mine?.days).toBeGreaterThan(0);
    const auto = await ledger();
    expect(auto).toHaveLength(mine!.days);
    expect(auto.every((r) => r.status === 'proposed')).toBe(true);
    // Only days over in the worksite's zone (Europe/London, UTC in December): 3 December is not.
    expect(auto.some((r) => r.day === '2026-12-03')).toBe(false);
    expect(auto.some((r) => r.day === '2026-12-02')).toBe(true);

    // The button over the same days writes the same figures.
    const button = await ctx.as.coordinator.post(`${ctx.base}/ledger/propose?from=${from}&to=2026-12-03`);
    expect(button.status, button.text).toBe(200);
    expect(button.body.written).toBe(auto.length);
    expect(figures(await ledger())).toEqual(figures(auto));
  });

  it('writes nothing when nothing changed, so a day keeps its update time', async () => {
    const before = await updatedAtOf();
    now = new Date('2026-12-03T11:25:00Z');
    const result = await proposeLedgerAhead(ctx.t.deps);
    expect(result.written.find((w) => w.projectId === ctx.t.demo.projectId)).toBeUndefined();
    expect(await updatedAtOf()).toEqual(before);
  });

  it('writes a proposed day again where the data changed, and never touches a confirmed day', async () => {
    const rows = await ledger();
    const [confirmedDay, changedDay] = rows.filter((r) => r.day === '2026-12-02');
    expect(changedDay).toBeDefined();
    const confirmed = await ctx.as.coordinator
      .post(`${ctx.base}/ledger/${confirmedDay.id}/confirm`)
      .send({ lostHours: 7, note: 'Skipper’s log' });
    expect(confirmed.status, confirmed.text).toBe(200);
    // A stored proposal off from what the data give (as an older source would have left it).
    await ctx.t.database.db
      .update(ledgerDay)
      .set({ proposedLostHours: 99 })
      .where(and(eq(ledgerDay.id, changedDay.id), eq(ledgerDay.status, 'proposed')));
    await ctx.t.database.db.update(ledgerDay).set({ proposedLostHours: 98 }).where(eq(ledgerDay.id, confirmedDay.id));

    const result = await proposeLedgerAhead(ctx.t.deps);
    expect(result.written.find((w) => w.projectId === ctx.t.demo.projectId)?.days).toBe(1);
    const after = new Map((await ledger()).map((r) => [r.id, r]));
    expect(after.get(changedDay.id)!.proposedLostHours).toBe(changedDay.proposedLostHours);
    const kept = after.get(confirmedDay.id)!;
    expect(kept).toMatchObject({ status: 'confirmed', lostHours: 7, proposedLostHours: 98 });
  });
});
