/**
 * Statistics worked out ahead (server/services/statistics-ahead.ts, run every 2 minutes by
 * jobs/schedule.ts): a run stores what the Downtime page opens on (the workability statistics, the
 * first campaign's simulation and the ledger's hindcast expectation, default hindcast, forecast
 * limits on) for every project with a hindcast, once per data and limits, and the page then
 * answers from what it stored.
 */
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { useSignedInApp } from '../support/app';
import type { CampaignResponse, CampaignSimulation, WorkabilityEntry } from '../../shared/api-types-downtime';
import { statsCache } from '../../server/db/schema';
import { statisticsLockKey, workStatisticsAhead } from '../../server/services/statistics-ahead';
import { clearStatsMemo } from '../../server/services/workability';

const ctx = useSignedInApp({ hindcastYears: 1 });

/** The stored `stats_cache` keys of the demo hindcast whose variant is `variant`. */
async function storedKeysOf(variant: string): Promise<string[]> {
  const rows = await ctx.t.database.db
    .select({ key: statsCache.key })
    .from(statsCache)
    .where(eq(statsCache.projectId, ctx.t.demo.projectId));
  return rows.map((r) => r.key).filter((k) => k.startsWith(`${ctx.t.demo.hindcastId}:`) && k.endsWith(`:${variant}`));
}

/** The workability statistics with forecast limits on. */
const storedKeys = () => storedKeysOf('true');
/** The ledger's hindcast expectation, forecast limits on. */
const storedLedgerKeys = () => storedKeysOf('ledger-alpha');

/** The first campaign's simulation, forecast limits on. */
async function storedSimulationKeys(): Promise<string[]> {
  const [first] = (await ctx.as.client.get(`${ctx.base}/campaigns`)).body as CampaignResponse[];
  return storedKeysOf(`campaign-${first.id}-true`);
}

describe('statistics worked out ahead', () => {
  it('stores the Downtime page statistics of each project with a hindcast, and only when they are not stored yet', async () => {
    expect(await storedKeys()).toEqual([]);
    expect(await storedSimulationKeys()).toEqual([]);
    expect(await storedLedgerKeys()).toEqual([]);
    const first = await workStatisticsAhead(ctx.t.deps);
    // The seeded cable project has the hindcast; the pontoon project has none (nothing to do).
    expect(first).toEqual({ worked: [ctx.t.demo.projectId], unchanged: 1, busy: 0, failed: 0 });
    const keys = await storedKeys();
    expect(keys).toHaveLength(1);
    const simulationKeys = await storedSimulationKeys();
    expect(simulationKeys).toHaveLength(1);
    const ledgerKeys = await storedLedgerKeys();
    expect(ledgerKeys).toHaveLength(1);

    const second = await workStatisticsAhead(ctx.t.deps);
    expect(second).toEqual({ worked: [], unchanged: 2, busy: 0, failed: 0 });
    expect(await storedKeys()).toEqual(keys);
    expect(await storedSimulationKeys()).toEqual(simulationKeys);
    expect(await storedLedgerKeys()).toEqual(ledgerKeys);
  });

  it('stores the campaign simulation the page then answers from', async () => {
    const db = ctx.t.database.db;
    const [first] = (await ctx.as.client.get(`${ctx.base}/campaigns`)).body as CampaignResponse[];
    const [row] = await db
      .select()
      .from(statsCache)
      .where(eq(statsCache.key, (await storedSimulationKeys())[0]));
    const stored = row.value as { months: { p50Hours: number | null }[] };
    const before = stored.months[0].p50Hours;
    stored.months[0].p50Hours = 123.5;
    await db.update(statsCache).set({ value: stored }).where(eq(statsCache.key, row.key));
    clearStatsMemo(db);
    const res = await ctx.as.client.post(`${ctx.base}/campaigns/${first.id}/simulate`);
    expect(res.status, res.text).toBe(200);
    expect((res.body as CampaignSimulation).months[0].p50Hours).toBe(123.5);
    stored.months[0].p50Hours = before;
    await db.update(statsCache).set({ value: stored }).where(eq(statsCache.key, row.key));
    clearStatsMemo(db);
  });

  it('is what the Downtime page answers from', async () => {
    const db = ctx.t.database.db;
    const [row] = await db
      .select()
      .from(statsCache)
      .where(eq(statsCache.key, (await storedKeys())[0]));
    const stored = row.value as WorkabilityEntry[];
    // Mark the stored row and forget the process's memos: the page's answer carries the mark.
    const before = stored[0].months[0].workability;
    stored[0].months[0].workability = 0.654321;
    await db.update(statsCache).set({ value: stored }).where(eq(statsCache.key, row.key));
    clearStatsMemo(db);
    const res = await ctx.as.client.get(`${ctx.base}/workability`);
    expect(res.status, res.text).toBe(200);
    const entry = (res.body as WorkabilityEntry[]).find((e) => e.operationId === stored[0].operationId && e.siteId === stored[0].siteId)!;
    expect(entry.months[0].workability).toBe(0.654321);
    stored[0].months[0].workability = before;
    await db.update(statsCache).set({ value: stored }).where(eq(statsCache.key, row.key));
    clearStatsMemo(db);
  });

  it('works them out again after a limit changes, and leaves a project another instance holds', async () => {
    const before = await storedKeys();
    const entries = (await ctx.as.coordinator.get(`${ctx.base}/workability`)).body as WorkabilityEntry[];
    const pull = entries.find((e) => e.operationName === 'Cable pull-in at landfall')!;
    const patch = await ctx.as.coordinator
      .patch(`${ctx.base}/operations/${pull.operationId}`)
      .send({ limits: { hsMax: 0.5, windMax: 12, bedVelocityMax: 0.6, bedVelocityMethod: 'linear' } });
    expect(patch.status, patch.text).toBe(200);

    // Another instance holds the project: this run leaves it.
    const held = await ctx.t.database.withAdvisoryLock(statisticsLockKey(ctx.t.demo.projectId), () => workStatisticsAhead(ctx.t.deps));
    expect(held.acquired).toBe(true);
    if (held.acquired) expect(held.value).toEqual({ worked: [], unchanged: 1, busy: 1, failed: 0 });
    expect(await storedKeys()).toEqual(before);
    const simulationBefore = await storedSimulationKeys();

    const run = await workStatisticsAhead(ctx.t.deps);
    expect(run.worked).toEqual([ctx.t.demo.projectId]);
    const after = await storedKeys();
    // One row per dataset and variant: the new limits' row in place of the old one.
    expect(after).toHaveLength(1);
    expect(after[0]).not.toBe(before[0]);
    // The simulation's version covers every limit (and the pull-in is its last step): worked out again too.
    const simulationAfter = await storedSimulationKeys();
    expect(simulationAfter).toHaveLength(1);
    expect(simulationAfter[0]).not.toBe(simulationBefore[0]);
  });
});
