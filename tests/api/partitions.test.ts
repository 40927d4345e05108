// A partitioned CSV through the API (docs/domain.md#partitions): imported with its partitions and
// report, then the chain behind an hour lists each partition at the worksite and judges a swell
// limit on the swell alone. Worksite values are checked against a hand calculation: deep-water
// source to 15 m, shoaling only, Ks = sqrt(Cg0/Cg_site) from an independent bisection solver
// (tests/waves/reference-dispersion.ts); total = sqrt(sum Hs_i^2) (common practice, no source).
import { describe, expect, it } from 'vitest';
import { useSignedInApp } from '../support/app';
import { refCg } from '../waves/reference-dispersion';

const ctx = useSignedInApp();

const ks = (tp: number, d: number) => Math.sqrt((9.81 * tp) / (4 * Math.PI) / refCg(tp, d, 9.81));

describe('a partitioned CSV through import, plan and the chain behind an hour', () => {
  it('imports partitions, reports them, and explains an hour per partition', async () => {
    const csv = [
      'time,hs,tp,dir,wind,hs_windsea,tp_windsea,dir_windsea,hs_swell,tp_swell,dir_swell',
      '2026-12-01T00:00Z,,,,8,0.8,5,240,1.1,14,260',
      '2026-12-01T01:00Z,2.0,14,260,8,0.9,5,240,1.2,14,260', // 25 % apart: scaled to 2.0, flagged
      '2026-12-01T02:00Z,1.4,14,260,8,0.8,5,240,1.15,14,260',
      '2026-12-01T03:00Z,1.4,14,260,8,0.8,5,240,-999,14,260', // swell missing
    ].join('\n');
    const imp = await ctx.as.coordinator
      .post(`${ctx.base}/datasets`)
      .field('name', 'Partitioned forecast')
      .field('kind', 'forecast')
      .field('dataPointDepth', 'deep')
      .attach('file', Buffer.from(csv), 'partitions.csv');
    expect(imp.status, imp.text).toBe(201);
    expect(imp.body.variables).toEqual(expect.arrayContaining(['windSea.hs', 'swell1.hs', 'swell1.tp']));
    const detail = await ctx.as.coordinator.get(`${ctx.base}/datasets/${imp.body.id}`);
    expect(detail.body.importReport.partitions).toEqual({
      came: ['windSea', 'swell1'],
      flagged: 1,
      flaggedLines: [3],
      totalsFromPartitions: 1,
    });

    const site = await ctx.as.coordinator.post(`${ctx.base}/sites`).send({ name: 'Partition test site', depth: 15, timeZone: 'UTC' });
    expect(site.status, site.text).toBe(201);
    const op = await ctx.as.coordinator.post(`${ctx.base}/operations`).send({
      name: 'Swell-limited lift',
      tpop: 6,
      tc: 0,
      weatherRestricted: false,
      limits: { hsMax: 3, hsTargets: [{ target: 'swell', max: 1.2 }], tpExcluded: [[4.5, 5.5]], tpExcludedMinHs: 1 },
      siteIds: [site.body.id],
    });
    expect(op.status, op.text).toBe(201);

    const chainAt = async (time: string) => {
      const res = await ctx.as.client
        .get(`${ctx.base}/plan/chain`)
        .query({ dataset: imp.body.id, operationId: op.body.id, siteId: site.body.id, time, alpha: 'false' });
      expect(res.status, res.text).toBe(200);
      return res.body;
    };

    // 02:00: wind sea 0.8 m 5 s and swell 1.15 m 14 s (total 1.4 m, within 5 %), each shoaled alone.
    const c = await chainAt('2026-12-01T02:00:00Z');
    const w = 0.8 * ks(5, 15);
    const s = 1.15 * ks(14, 15);
    expect(c.partitions.map((p: { name: string }) => p.name)).toEqual(['windSea', 'swell1']);
    expect(c.partitions[0].site.hs).toBeCloseTo(w, 6);
    expect(c.partitions[1].site.hs).toBeCloseTo(s, 6);
    expect(c.partitions[1].site.tp).toBe(14);
    expect(c.site.hs).toBeCloseTo(Math.hypot(w, s), 6);
    expect(c.site.tp).toBe(14);
    expect(c.checks.map((k: { limit: string }) => k.limit)).toEqual(['hs', 'hsTarget', 'tpBand']);
    const swell = c.checks.find((k: { limit: string }) => k.limit === 'hsTarget');
    expect(swell.value).toBeCloseTo(s, 6);
    expect(swell.drivenBy).toBe('swell1');
    expect(swell.met).toBe(s <= 1.2);
    // The 5 s wind sea is inside the 4.5-5.5 s band but below the 1 m threshold: the band is met.
    expect(c.checks.find((k: { limit: string }) => k.limit === 'tpBand').met).toBe(true);

    // 01:00: partitions scaled to the 2.0 m total: swell 1.2*4/3 = 1.6 m at the data point.
    const scaled = await chainAt('2026-12-01T01:00:00Z');
    expect(scaled.partitions[1].dataPoint.hs).toBeCloseTo(1.6, 9);
    expect(scaled.checks.find((k: { limit: string }) => k.limit === 'hsTarget').met).toBe(false);

    // 03:00: the swell is missing: the swell limit has no data, the total chain stands.
    const missing = await chainAt('2026-12-01T03:00:00Z');
    expect(missing.partitions).toBeUndefined();
    expect(missing.status).toBe('no_data');
    expect(missing.site.hs).toBeCloseTo(1.4 * ks(14, 15), 6);
  });
});
