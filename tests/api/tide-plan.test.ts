/**
 * The demo's tide at work (docs/domain.md#tide): the winching stage of the pull-in at the landfall
 * cofferdam has a tide window and a minimum depth; its forecast windows stay inside the windows
 * around the predicted high waters, and the chain behind an hour shows the water level and the
 * depth h = chart depth + water level.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signInAll, type TestApp } from '../support/app';

let t: TestApp;
let as: Awaited<ReturnType<typeof signInAll>>;
let base: string;
const NOW = new Date('2026-12-01T07:30:00Z');
const HOUR = 3_600_000;

beforeAll(async () => {
  t = await createTestApp({ clock: () => NOW, forecast: true });
  as = await signInAll(t.app);
  base = `/api/projects/${t.demo.projectId}`;
});
afterAll(async () => {
  await t.close();
});

describe('tide-bounded windows of the demo', () => {
  it('keeps every workable hour of the winching stage within 3 h of a predicted high water', async () => {
    const plan = (await as.coordinator.get(`${base}/plan`)).body;
    const p = plan.plans.find((x: { operationName: string }) => x.operationName === 'Pull-in winching at high water');
    expect(p).toBeTruthy();
    const siteId = p.siteId;
    expect(siteId).toBe(t.demo.siteIds.cofferdam);
    const from = p.times[0];
    const to = new Date(Date.parse(p.times[p.times.length - 1]) + 16 * HOUR).toISOString();
    const tide = (
      await as.coordinator.get(`${base}/sites/${siteId}/tide`).query({ from: new Date(Date.parse(from) - 13 * HOUR).toISOString(), to })
    ).body;
    const highs: number[] = tide.extremes
      .filter((e: { kind: string }) => e.kind === 'high')
      .map((e: { time: string }) => Date.parse(e.time));
    expect(highs.length).toBeGreaterThan(4);
    // Brute force over the forecast: workable needs a high water within [t - 3 h, t + 3 h].
    let workable = 0;
    let outside = 0;
    for (let i = 0; i < p.times.length; i++) {
      const tMs = Date.parse(p.times[i]);
      if (tMs >= Date.parse(to) - 13 * HOUR) break;
      const near = highs.some((h) => tMs >= h - 3 * HOUR && tMs <= h + 3 * HOUR);
      if (p.status[i] === 'workable') {
        workable++;
        expect(near, p.times[i]).toBe(true);
      }
      if (!near && p.status[i] !== 'no_data') {
        outside++;
        expect(p.status[i]).toBe('not_workable');
      }
    }
    expect(outside).toBeGreaterThan(10);
    // The invented forecast of early December has calm spells: some hours near high water are workable somewhere in its 10 days.
    expect(workable).toBeGreaterThan(0);
    expect(p.windows.length).toBeGreaterThan(0);
    for (const w of p.windows) expect(w.hours).toBeLessThanOrEqual(7);

    // The chain of the first hour: water level and depth, the depth limits and the tide window in its checks.
    const hour = p.times[2];
    const chain = (await as.client.get(`${base}/plan/chain`).query({ operationId: p.operationId, siteId, time: hour })).body;
    const k = tide.times.indexOf(hour);
    expect(k).toBeGreaterThanOrEqual(0);
    // The fake forecast carries a surge: the water level is the predicted tide plus the forecast's
    // residual at that hour, read back from the forecast's CSV download (docs/domain.md#tide).
    expect(chain.site.waterLevelSource).toBe('predicted+residual');
    const csv: string = (await as.coordinator.get(`${base}/datasets/${plan.dataset.id}/csv`)).text;
    const [header, ...rows] = csv.trim().split('\n');
    const col = header.split(',').indexOf('waterLevel_m');
    expect(col).toBeGreaterThan(0);
    const row = rows.find((r) => r.startsWith(hour))!.split(',');
    expect(chain.site.waterLevel).toBeCloseTo(tide.waterLevel[k] + Number(row[col]), 3);
    expect(chain.site.depth).toBeCloseTo(3.5 + chain.site.waterLevel, 9); // chart depth 3.5 m (seed/scenario-sites.ts)
    expect(chain.transform.depthM).toBeCloseTo(chain.site.depth, 9);
    const kinds = chain.checks.map((c: { limit: string }) => c.limit);
    expect(kinds).toEqual(expect.arrayContaining(['minDepth', 'tideWindow']));
    const min = chain.checks.find((c: { limit: string }) => c.limit === 'minDepth');
    expect(min.value).toBeCloseTo(chain.site.depth, 9);
    expect(min.alpha).toBeNull();

    // Conditions add water level and depth.
    const cond = (await as.client.get(`${base}/conditions/${siteId}`)).body;
    expect(cond.waterLevel.length).toBe(cond.times.length);
    const j = cond.times.indexOf(hour);
    expect(cond.depth[j]).toBeCloseTo(3.5 + cond.waterLevel[j], 3);
  });
});
