// Vessels, RAO import, operations with response limits and the response calculator: API round
// trips, all-or-nothing import with line and column, fuzzed files, roles. Expected values come from
// the tables written here and from docs/domain.md#vessel-response (R_s = Hs/2 for a heave RAO of 1).
import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { readRaoCsv } from '../../shared/schemas/vessel';
import { type SignedIn, useSignedInApp } from '../support/app';

let A: string;
let B: string;

const ctx = useSignedInApp();
beforeAll(async () => {
  A = ctx.t.demo.projectId;
  B = ctx.t.demo.secondProjectId;
});

let seq = 0;
const newVessel = async (project = A) => {
  const res = await ctx.as.coordinator.post(`/api/projects/${project}/vessels`).send({ name: `Test vessel ${++seq}` });
  expect(res.status, res.text).toBe(201);
  return res.body.id as string;
};
const upload = (project: string, vesselId: string, csv: string, who: keyof SignedIn = 'coordinator') =>
  ctx.as[who].post(`/api/projects/${project}/vessels/${vesselId}/raos`).attach('file', Buffer.from(csv), 'raos.csv');

const HEAVE_ONE = ['period_s,heading_deg,heave_m_per_m', '4,0,1', '20,0,1', '4,180,1', '20,180,1'].join('\n');

describe('vessels and RAO import', () => {
  it('a coordinator adds a vessel and imports a table; members read it back', async () => {
    const id = await newVessel();
    const csv = [
      'period_s,heading_deg,heave_m_per_m,roll_deg_per_m,acc_z_m_s2_per_m@crane_tip',
      '6,0,0.5,0,0.3',
      '10,0,0.9,0,0.2',
      '6,90,0.6,2,0.4',
      '10,90,1.0,6,0.3',
    ].join('\r\n');
    const res = await upload(A, id, csv);
    expect(res.status, res.text).toBe(200);
    expect(res.body.periods).toEqual([6, 10]);
    expect(res.body.headings).toEqual([0, 90]);
    expect(res.body.responses.map((r: { response: string }) => r.response)).toEqual([
      'heave_m_per_m',
      'roll_deg_per_m',
      'acc_z_m_s2_per_m@crane_tip',
    ]);
    const read = await ctx.as.client.get(`/api/projects/${A}/vessels/${id}/raos`);
    expect(read.status).toBe(200);
    expect(read.body.responses[1].values).toEqual([
      [0, 0],
      [2, 6],
    ]);
    const list = await ctx.as.skipper.get(`/api/projects/${A}/vessels`);
    expect(list.body.find((v: { id: string }) => v.id === id).responses).toHaveLength(3);
  });

  it('frequency_rad_s is turned into periods (T = 2 pi / omega)', async () => {
    const r = readRaoCsv(['frequency_rad_s,heading_deg,heave_m_per_m', '0.5,0,1', '1,0,0.5'].join('\n'));
    expect(r.ok && r.table.periodsS).toEqual([2 * Math.PI, 4 * Math.PI]);
  });

  it.each([
    ['non-numeric', 'period_s,heading_deg,heave_m_per_m\n6,0,abc\n10,0,1', 2, 'heave_m_per_m', /Not a number/],
    ['negative amplitude', 'period_s,heading_deg,heave_m_per_m\n6,0,1\n10,0,-0.5', 3, 'heave_m_per_m', /negative/],
    ['heading outside 0-360', 'period_s,heading_deg,heave_m_per_m\n6,0,1\n6,400,1', 3, 'heading_deg', /between 0 and 360/],
    ['duplicate row', 'period_s,heading_deg,heave_m_per_m\n6,0,1\n10,0,1\n6,0,1', 4, null, /Duplicate row.*line 2/],
  ])('refuses a table with a %s, naming line and column, and stores nothing', async (_what, csv, line, column, message) => {
    const id = await newVessel();
    const res = await upload(A, id, csv);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({ line, column });
    expect(res.body.error.details[0].message).toMatch(message);
    const read = await ctx.as.coordinator.get(`/api/projects/${A}/vessels/${id}/raos`);
    expect(read.body.responses).toEqual([]);
  });

  it('fuzzed RAO files fail only with validation problems (never a throw)', () => {
    const cell = fc.oneof(fc.constantFrom('0', '1.5', '-1', '361', 'x', '', '1e3', 'NaN', '"7"'), fc.string({ maxLength: 6 }));
    const header = fc.constantFrom(
      'period_s,heading_deg,roll_deg_per_m',
      'frequency_rad_s;heading_deg;heave_m_per_m',
      'period_s,heading_deg,vel_z_m_s_per_m@a',
    );
    fc.assert(
      fc.property(header, fc.array(fc.array(cell, { minLength: 2, maxLength: 4 }), { maxLength: 8 }), (h, rows) => {
        const d = h.includes(';') ? ';' : ',';
        const r = readRaoCsv([h, ...rows.map((c) => c.join(d))].join('\n'));
        if (!r.ok) {
          expect(r.problems.length).toBeGreaterThan(0);
          for (const p of r.problems) expect(typeof p.message).toBe('string');
        } else {
          for (const row of Object.values(r.table.responses)) for (const hs of row) for (const v of hs) expect(v).toBeGreaterThanOrEqual(0);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('roles: skippers and clients cannot add vessels or import; another project answers 404', async () => {
    const id = await newVessel();
    expect((await ctx.as.skipper.post(`/api/projects/${A}/vessels`).send({ name: 'No' })).status).toBe(403);
    expect((await upload(A, id, HEAVE_ONE, 'client')).status).toBe(403);
    expect((await ctx.as.coordinator.get(`/api/projects/${B}/vessels/${id}/raos`)).status).toBe(404);
  });
});

describe('operations with response limits and the response calculator', () => {
  it('a response limit needs a vessel and a heading; with them it is stored and answered', async () => {
    const vesselId = await newVessel();
    const sites = await ctx.as.coordinator.get(`/api/projects/${A}/sites`);
    const base = {
      name: `Response op ${++seq}`,
      tpop: 6,
      tc: 2,
      weatherRestricted: true,
      siteIds: [sites.body[0].id],
      limits: { responses: [{ response: 'roll_deg_per_m', statistic: 'mpm', max: 4 }] },
    };
    const refused = await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(base);
    expect(refused.status).toBe(400);
    expect(JSON.stringify(refused.body.error.details)).toMatch(/need a vessel/);
    const ok = await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send({ ...base, vesselId, heading: 45 });
    expect(ok.status, ok.text).toBe(201);
    expect(ok.body.vesselId).toBe(vesselId);
    expect(ok.body.heading).toBe(45);
    // The default duration of an mpm limit is 3 h (docs/domain.md#vessel-response).
    expect(ok.body.limits.responses).toEqual([{ response: 'roll_deg_per_m', statistic: 'mpm', durationH: 3, max: 4 }]);
    const foreign = await ctx.as.coordinator.post(`/api/projects/${B}/operations`).send({ ...base, siteIds: [], vesselId, heading: 45 });
    expect(foreign.status).toBe(400);
  });

  it('GET /api/wave/response: a heave RAO of 1 gives R_s = Hs/2 (docs/domain.md#vessel-response)', async () => {
    const id = await newVessel();
    expect((await upload(A, id, HEAVE_ONE)).status).toBe(200);
    const res = await ctx.as.skipper.get('/api/wave/response').query({ vesselId: id, heading: 30, hs: 2.6, tp: 8, dir: 200 });
    expect(res.status, res.text).toBe(200);
    expect(res.body.responses[0].significant).toBeCloseTo(1.3, 10);
    expect(res.body.responses[0].spectrum).toHaveLength(res.body.omega.length);
    const parts = JSON.stringify([
      { kind: 'windSea', hs: 1.2, tp: 6, dir: 10 },
      { kind: 'swell', hs: 1.6, tp: 14, dir: 250 },
    ]);
    const p = await ctx.as.skipper.get('/api/wave/response').query({ vesselId: id, heading: 0, partitions: parts });
    // Energies add: sqrt(1.2^2 + 1.6^2)/2 = 1.0 (by hand).
    expect(p.body.responses[0].significant).toBeCloseTo(1, 10);
    // The client is not a member of project B: its vessels are not found.
    const other = await newVessel(B);
    expect((await ctx.as.client.get('/api/wave/response').query({ vesselId: other, heading: 0, hs: 1, tp: 8, dir: 0 })).status).toBe(404);
  });
});
