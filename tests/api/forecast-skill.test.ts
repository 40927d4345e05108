// GET forecast-skill, GET alpha/calibrated and POST alpha/adopt-calibrated on the demo's forecast
// archive (issue 15, skill and calibrated alpha; docs/domain.md#forecast-uncertainty and
// docs/domain.md#calibrated-alpha). The figures are checked against a brute-force pairing written
// here from the records API, and the alpha values against the formula with the quantile of
// @stdlib/stats-base-dists-normal-quantile (a general-purpose reference library).
import { beforeAll, describe, expect, it } from 'vitest';
import quantile from '@stdlib/stats-base-dists-normal-quantile';
import type { CalibratedAlphaAnswer, ForecastSkillAnswer } from '../../shared/api-types-skill';
import type { DatasetSummary, RecordsAnswer } from '../../shared/api-types-datasets';
import { useSignedInApp } from '../support/app';

let observationId: string;
const now = new Date('2026-12-03T09:30:00Z');
const HOUR = 3_600_000;

const ctx = useSignedInApp({ forecast: true, skillArchiveDays: 60, clock: () => now }, { timeoutMs: 180_000 });
beforeAll(async () => {
  observationId = ctx.t.demo.observationId!;
}, 180_000);

/** Brute force: every forecast record with an observation at exactly the same time (both hourly on the hour). */
async function bruteForcePairs(): Promise<{ issue: string; leadH: number; fc: number; obs: number }[]> {
  const list = (await ctx.as.coordinator.get(`${ctx.base}/datasets`)).body as DatasetSummary[];
  const obs = (await ctx.as.coordinator.get(`${ctx.base}/datasets/${observationId}/records`)).body as RecordsAnswer;
  const obsAt = new Map(obs.time.map((time, i) => [Date.parse(time), obs.hs[i]]));
  const out: { issue: string; leadH: number; fc: number; obs: number }[] = [];
  for (const d of list.filter((x) => x.kind === 'forecast' && x.source.issuedAt)) {
    const r = (await ctx.as.coordinator.get(`${ctx.base}/datasets/${d.id}/records`)).body as RecordsAnswer;
    const issued = Date.parse(d.source.issuedAt!);
    r.time.forEach((time, i) => {
      const leadH = (Date.parse(time) - issued) / HOUR;
      const fc = r.hs[i];
      const o = obsAt.get(Date.parse(time));
      if (fc !== null && fc >= 0.5 && leadH >= 0 && leadH < 96 && o != null) out.push({ issue: d.id, leadH, fc, obs: o });
    });
  }
  return out;
}

const meanSd = (xs: number[]) => {
  const m = xs.reduce((s, x) => s + x, 0) / xs.length;
  return { m, sd: Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1)) };
};

describe('GET forecast-skill', () => {
  it('answers the bins of docs/domain.md#forecast-uncertainty with the figures of a brute-force pairing', async () => {
    const res = await ctx.as.client.get(`${ctx.base}/forecast-skill?observation=${observationId}`);
    expect(res.status, res.text).toBe(200);
    const a = res.body as ForecastSkillAnswer;
    expect(a.bins.map((b) => [b.fromH, b.toH])).toEqual([0, 12, 24, 48, 72].flatMap((f, i) => Array(4).fill([f, [12, 24, 48, 72, 96][i]])));
    expect(a.bins.slice(0, 4).map((b) => [b.hsFrom, b.hsTo])).toEqual([
      [0.5, 1.5],
      [1.5, 3],
      [3, 5],
      [5, null],
    ]);
    const brute = await bruteForcePairs();
    expect(a.pairs).toBe(brute.length);
    for (const b of a.bins) {
      const inBin = brute.filter((p) => p.leadH >= b.fromH && p.leadH < b.toH && p.fc >= b.hsFrom && p.fc < (b.hsTo ?? Infinity));
      expect(b.pairs, `${b.fromH}-${b.toH} h, ${b.hsFrom} m`).toBe(inBin.length);
      expect(b.issues).toBe(new Set(inBin.map((p) => p.issue)).size);
      if (inBin.length > 1) {
        const { m, sd } = meanSd(inBin.map((p) => Math.log(p.obs / p.fc)));
        expect(b.mean).toBeCloseTo(m, 9);
        expect(b.sd).toBeCloseTo(sd, 9);
      }
    }
    // The archive holds 60 daily issues, 4 days long (seed/skill-archive.ts), and the current issue
    // (06:00 today) pairs with the observation's last hours: 61.
    expect(a.issuesPaired).toBe(new Set(brute.map((p) => p.issue)).size);
    expect(a.issuesPaired).toBe(61);
    expect(a.points.length).toBe(Math.min(a.pairs, a.pointsCap));
  });

  it("matches the fake service's documented error model at short lead", async () => {
    const a = (await ctx.as.client.get(`${ctx.base}/forecast-skill?observation=${observationId}`)).body as ForecastSkillAnswer;
    // server/forecast/fake-forecast.ts: |e| <= 0.03 + 0.035 per day of lead on Hs, plus a timing error of
    // about 1 h at analysis time, and the demo buoy's +-2 %: at lead [0, 12) h the log error stays small.
    const first = a.byLead[0];
    expect(first.pairs).toBeGreaterThan(500);
    expect(Math.abs(first.mean!)).toBeLessThan(0.05);
    expect(first.sd!).toBeGreaterThan(0.005);
    expect(first.sd!).toBeLessThan(0.12);
    // ... and the error grows with lead (the fake's amplitude and timing errors both grow).
    expect(a.byLead[4].sd!).toBeGreaterThan(first.sd!);
  });

  it('refuses a forecast as the observation, and a missing one, naming the field', async () => {
    const forecastId = ctx.t.demo.forecastId!;
    const bad = await ctx.as.coordinator.get(`${ctx.base}/forecast-skill?observation=${forecastId}`);
    expect(bad.status).toBe(400);
    expect(bad.text).toMatch(/observation/);
    const missing = await ctx.as.coordinator.get(`${ctx.base}/forecast-skill`);
    expect(missing.status).toBe(400);
    expect(missing.text).toMatch(/observation/);
  });
});

describe('GET alpha/calibrated', () => {
  it('gives alpha = min(1, exp(-(mu + z sigma))) per cell at the project p (1e-4), with the bin behind it', async () => {
    const res = await ctx.as.skipper.get(`${ctx.base}/alpha/calibrated`);
    expect(res.status, res.text).toBe(200);
    const a = res.body as CalibratedAlphaAnswer;
    expect(a.p).toBe(1e-4);
    expect(a.projectP).toBe(1e-4);
    expect(a.observation?.id).toBe(observationId);
    expect(a.z).toBeCloseTo(quantile(1 - 1e-4, 0, 1), 9);
    // Default table: docs/domain.md#weather-restricted (from memory of DNV-ST-N001).
    expect(a.defaultTable.values[0]).toEqual([0.65, 0.76, 0.79, 0.8]);
    let calibrated = 0;
    a.cells.forEach((row, r) =>
      row.forEach((cell, c) => {
        expect(a.table.values[r][c]).toBe(cell.alpha);
        if (cell.fallback) {
          expect(cell.alpha).toBe(a.defaultTable.values[r][c]);
          return;
        }
        calibrated++;
        const alpha = Math.min(1, Math.exp(-(cell.mean! + quantile(1 - 1e-4, 0, 1) * cell.sd!)));
        expect(cell.alpha).toBeCloseTo(alpha, 2);
        expect(cell.alpha).toBeLessThanOrEqual(alpha);
        expect(cell.fewIssues).toBe(cell.issues < 30);
      }),
    );
    expect(calibrated).toBeGreaterThan(0);
    // Row 12 h uses the lead bin [12, 24) h; row 72 h [72, 96) h (docs/domain.md#calibrated-alpha).
    expect(a.cells[0][0]).toMatchObject({ fromH: 12, toH: 24, hsFrom: 0.5 });
    expect(a.cells[4][3]).toMatchObject({ fromH: 72, toH: 96, hsFrom: 5, hsTo: null });
  });

  it('takes p from the query or the project setting, and refuses a p outside 1e-9 - 0.2', async () => {
    const q = (await ctx.as.coordinator.get(`${ctx.base}/alpha/calibrated?p=0.01`)).body as CalibratedAlphaAnswer;
    expect(q.p).toBe(0.01);
    // z at p = 0.01 is 2.326 (normal tables, from memory).
    expect(q.z).toBeCloseTo(2.326, 3);
    const bad = await ctx.as.coordinator.get(`${ctx.base}/alpha/calibrated?p=0.5`);
    expect(bad.status).toBe(400);
    expect(bad.text).toMatch(/\bp\b/);
    const project = (await ctx.as.coordinator.get(ctx.base)).body;
    const settings = {
      name: project.name,
      description: project.description,
      dataPointName: project.dataPointName,
      dataPointLatitude: project.dataPointLatitude,
      dataPointLongitude: project.dataPointLongitude,
      dataPointDepthM: project.dataPointDepthM,
      forecastSource: project.forecastSource,
    };
    expect((await ctx.as.coordinator.put(`${ctx.base}/settings`).send({ ...settings, alphaCalibrationP: 1e-3 })).status).toBeLessThan(300);
    expect(((await ctx.as.coordinator.get(`${ctx.base}/alpha/calibrated`)).body as CalibratedAlphaAnswer).p).toBe(1e-3);
    // Left out, the setting stays as it is; then back to the default for the tests below.
    expect((await ctx.as.coordinator.put(`${ctx.base}/settings`).send(settings)).status).toBeLessThan(300);
    expect((await ctx.as.coordinator.get(ctx.base)).body.alphaCalibrationP).toBe(1e-3);
    expect((await ctx.as.coordinator.put(`${ctx.base}/settings`).send({ ...settings, alphaCalibrationP: 1e-4 })).status).toBeLessThan(300);
  });
});

describe('POST alpha/adopt-calibrated', () => {
  it('refuses skippers and clients, and adopts nothing by itself', async () => {
    for (const who of ['skipper', 'client'] as const) {
      const res = await ctx.as[who].post(`${ctx.base}/alpha/adopt-calibrated`).send({ p: 1e-4, observation: observationId });
      expect(res.status, who).toBe(403);
    }
    const alpha = (await ctx.as.coordinator.get(`${ctx.base}/alpha`)).body;
    expect(alpha.isDefault).toBe(true);
  });

  it('makes the calibrated table the project table, audited with p, the observation, the bins and the counts', async () => {
    const shown = (await ctx.as.coordinator.get(`${ctx.base}/alpha/calibrated?observation=${observationId}`)).body as CalibratedAlphaAnswer;
    const res = await ctx.as.coordinator.post(`${ctx.base}/alpha/adopt-calibrated`).send({ p: 1e-4, observation: observationId });
    expect(res.status, res.text).toBe(200);
    const alpha = (await ctx.as.coordinator.get(`${ctx.base}/alpha`)).body;
    expect(alpha.isDefault).toBe(false);
    expect(alpha.table).toEqual(shown.table);
    const audit = (await ctx.as.coordinator.get(`${ctx.base}/audit?entity=alpha`)).body as {
      after: { table: unknown; calibration: { cells: Record<string, unknown>[][] } & Record<string, unknown> };
      before: { isDefault: boolean };
    }[];
    expect(audit[0].after.table).toEqual(shown.table);
    expect(audit[0].before.isDefault).toBe(true);
    expect(audit[0].after.calibration).toMatchObject({ p: 1e-4, observation: { id: observationId }, pairs: shown.pairs, issuesPaired: 61 });
    expect(audit[0].after.calibration.cells[0][0]).toMatchObject({
      pairs: shown.cells[0][0].pairs,
      issues: shown.cells[0][0].issues,
      fromH: 12,
      toH: 24,
    });
  });

  it('refuses with 409 when no bin has data', async () => {
    const other = `/api/projects/${ctx.t.demo.secondProjectId}`;
    const res = await ctx.as.coordinator.post(`${other}/alpha/adopt-calibrated`).send({});
    expect(res.status).toBe(409);
    expect(res.text).toMatch(/no bin/);
  });
});
