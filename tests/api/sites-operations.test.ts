// Worksites, operations, the alpha table, the audit trail and the setup document: API round
// trips, validation, roles and all-or-nothing import. Expected values come from the request
// bodies written here and from docs/domain.md#weather-restricted (alpha table, weather-restricted range); none from the code under test.
import { count, eq } from 'drizzle-orm';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import type { OperationResponse, SiteResponse } from '../../shared/api-types-sites';
import { parseTransferTableCsv, ProjectSetupDocument, TransferTableInput } from '../../shared/schemas/sites';
import { auditEntry, ledgerDay, operation, project, projectAlpha, worksite } from '../../server/db/schema';
import { importSetup } from '../../server/services/project-setup';
import { type Agent, useSignedInApp } from '../support/app';

let A: string; // the demo project: coordinator, skipper and client are members
let B: string; // the second demo project: the client is not a member, the skipper is a client

const ctx = useSignedInApp();
beforeAll(async () => {
  A = ctx.t.demo.projectId;
  B = ctx.t.demo.secondProjectId;
});

let seq = 0;
const unique = (base: string) => `${base} ${++seq}`;

const siteBody = (over: Record<string, unknown> = {}) => ({
  name: unique('Berth'),
  latitude: 52.41,
  longitude: -5.48,
  depth: 12,
  shoreNormal: 270,
  breakerIndex: 0.6,
  timeZone: 'Europe/London',
  ...over,
});

const opBody = (over: Record<string, unknown> = {}) => ({
  name: unique('Cable pull-in'),
  description: 'Pull the export cable through the landfall duct',
  tpop: 12,
  tc: 6,
  weatherRestricted: true,
  limits: { hsMax: 1.5, tpMax: 12 },
  ...over,
});

async function createSite(agent: Agent, projectId: string, over: Record<string, unknown> = {}): Promise<SiteResponse> {
  const res = await agent.post(`/api/projects/${projectId}/sites`).send(siteBody(over));
  expect(res.status, res.text).toBe(201);
  return res.body;
}

async function createOp(agent: Agent, projectId: string, over: Record<string, unknown> = {}): Promise<OperationResponse> {
  const res = await agent.post(`/api/projects/${projectId}/operations`).send(opBody(over));
  expect(res.status, res.text).toBe(201);
  return res.body;
}

function fields(res: request.Response): string[] {
  return (res.body.error?.details ?? []).map((d: { field: string }) => d.field);
}

async function rowCounts(projectId: string) {
  const db = ctx.t.database.db;
  const [sites] = await db.select({ n: count() }).from(worksite).where(eq(worksite.projectId, projectId));
  const [ops] = await db.select({ n: count() }).from(operation).where(eq(operation.projectId, projectId));
  const [audit] = await db.select({ n: count() }).from(auditEntry).where(eq(auditEntry.projectId, projectId));
  const [alpha] = await db.select({ n: count() }).from(projectAlpha).where(eq(projectAlpha.projectId, projectId));
  return { sites: sites.n, ops: ops.n, audit: audit.n, alpha: alpha.n };
}

// docs/domain.md#weather-restricted: default alpha table (from memory of DNV-ST-N001's base case
// for waves), copied here by hand.
const NOTES_ALPHA = {
  tpopBoundsH: [12, 24, 36, 48, 72],
  hsColumnsM: [1, 2, 4, 6],
  values: [
    [0.65, 0.76, 0.79, 0.8],
    [0.63, 0.73, 0.76, 0.78],
    [0.62, 0.71, 0.73, 0.76],
    [0.6, 0.68, 0.71, 0.74],
    [0.55, 0.63, 0.68, 0.72],
  ],
};

describe('worksites', () => {
  it('creates, reads, changes and deletes a worksite', async () => {
    const body = siteBody();
    const created = await ctx.as.coordinator.post(`/api/projects/${A}/sites`).send(body);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ ...body, hindcastDatasetId: null, transferTable: null });
    expect(created.body.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(Date.parse(created.body.updatedAt)).not.toBeNaN();
    const id = created.body.id;

    const list = await ctx.as.skipper.get(`/api/projects/${A}/sites`);
    expect(list.status).toBe(200);
    expect(list.body.find((s: SiteResponse) => s.id === id)).toEqual(created.body);

    const one = await ctx.as.client.get(`/api/projects/${A}/sites/${id}`);
    expect(one.status).toBe(200);
    expect(one.body).toEqual(created.body);

    const patched = await ctx.as.coordinator.patch(`/api/projects/${A}/sites/${id}`).send({ depth: 8.5, shoreNormal: null });
    expect(patched.status).toBe(200);
    expect(patched.body).toMatchObject({ ...body, depth: 8.5, shoreNormal: null });

    expect((await ctx.as.coordinator.delete(`/api/projects/${A}/sites/${id}`)).status).toBe(204);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/sites/${id}`)).status).toBe(404);
  });

  it('fills the defaults and writes the time zone as the zone database spells it', async () => {
    const res = await ctx.as.coordinator
      .post(`/api/projects/${A}/sites`)
      .send({ name: unique('Anchorage'), depth: 30, timeZone: 'europe/oslo' });
    expect(res.status).toBe(201);
    // Breaker index default 0.6 for Hs (docs/domain.md#transformation, common practice); no bearing = no refraction.
    expect(res.body).toMatchObject({ breakerIndex: 0.6, shoreNormal: null, latitude: null, longitude: null, timeZone: 'Europe/Oslo' });
  });

  it('refuses bad values with 400 naming the field', async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ depth: 0.2 }, 'depth'],
      [{ depth: 12000 }, 'depth'],
      [{ timeZone: 'Mars/Olympus_Mons' }, 'timeZone'],
      [{ timeZone: '+01:00' }, 'timeZone'],
      [{ shoreNormal: 400 }, 'shoreNormal'],
      [{ breakerIndex: 0.1 }, 'breakerIndex'],
      [{ latitude: 91 }, 'latitude'],
      [{ name: '' }, 'name'],
      [{ name: 'Berth\u0000' }, 'name'], // PostgreSQL text cannot hold NUL: a 400, not a 500
      [{ hindcastDatasetId: 'not-an-id' }, 'hindcastDatasetId'],
      [
        {
          transferTable: {
            directionSectorsDeg: [[0, 360]],
            tpBandsS: [
              [0, 6],
              [6, 30],
            ],
            factors: [[0.8]],
          },
        },
        'transferTable.factors.0',
      ],
      [{ transferTable: { directionSectorsDeg: [[0, 360]], tpBandsS: [[0, 30]], factors: [[3.5]] } }, 'transferTable.factors.0.0'],
    ];
    for (const [over, field] of cases) {
      const res = await ctx.as.coordinator.post(`/api/projects/${A}/sites`).send(siteBody(over));
      expect(res.status, JSON.stringify(over)).toBe(400);
      expect(res.body.error.code).toBe('validation');
      expect(fields(res), JSON.stringify(over)).toContain(field);
    }
    const site = await createSite(ctx.as.coordinator, A);
    const bad = await ctx.as.coordinator.patch(`/api/projects/${A}/sites/${site.id}`).send({ timeZone: 'Nowhere/Special' });
    expect(bad.status).toBe(400);
    expect(fields(bad)).toContain('timeZone');
    // A hindcast dataset id must be one of the project's datasets.
    const unknownDataset = await ctx.as.coordinator
      .patch(`/api/projects/${A}/sites/${site.id}`)
      .send({ hindcastDatasetId: '00000000-0000-4000-8000-000000000000' });
    expect(unknownDataset.status).toBe(400);
    expect(fields(unknownDataset)).toEqual(['hindcastDatasetId']);
    expect((await ctx.as.coordinator.patch(`/api/projects/${A}/sites/${site.id}`).send({})).status).toBe(400);
  });

  it('refuses a second worksite with the same name (any case) with 409', async () => {
    const first = await createSite(ctx.as.coordinator, A);
    const res = await ctx.as.coordinator.post(`/api/projects/${A}/sites`).send(siteBody({ name: first.name.toUpperCase() }));
    expect(res.status).toBe(409);
  });

  it('keeps a transfer table read from CSV', async () => {
    const csv = 'sector_from,sector_to,0-6,6-30\n345,15,0.55,0.7\n15,345,0.9,1.0\n';
    const parsed = parseTransferTableCsv(csv);
    expect(parsed.issues).toEqual([]);
    const site = await createSite(ctx.as.coordinator, A, { transferTable: parsed.table });
    expect(site.transferTable).toEqual({
      directionSectorsDeg: [
        [345, 15],
        [15, 345],
      ],
      tpBandsS: [
        [0, 6],
        [6, 30],
      ],
      factors: [
        [0.55, 0.7],
        [0.9, 1.0],
      ],
    });
  });

  it('takes a deleted worksite out of the operations that listed it', async () => {
    const keep = await createSite(ctx.as.coordinator, A);
    const gone = await createSite(ctx.as.coordinator, A);
    const op = await createOp(ctx.as.coordinator, A, { siteIds: [keep.id, gone.id] });
    expect((await ctx.as.coordinator.delete(`/api/projects/${A}/sites/${gone.id}`)).status).toBe(204);
    const after = await ctx.as.coordinator.get(`/api/projects/${A}/operations/${op.id}`);
    expect(after.body.siteIds).toEqual([keep.id]);
  });
});

describe('operations', () => {
  it('creates, reads, changes and deletes an operation with every kind of limit', async () => {
    const site = await createSite(ctx.as.coordinator, A);
    const limits = {
      hsMax: 2,
      hsTpCurve: [
        [4, 1.2],
        [8, 1.8],
        [12, 1.5],
      ],
      tpMin: 3,
      tpMax: 14,
      tpExcluded: [[9.5, 10.5]],
      bedVelocityMax: 0.6,
      bedVelocityMethod: 'soulsby',
      windMax: 12,
    };
    const body = opBody({ tpop: 20, tc: 10, limits, siteIds: [site.id], skipperIds: [ctx.t.demo.users.skipper] });
    const created = await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(body);
    expect(created.status, created.text).toBe(201);
    expect(created.body).toMatchObject({ ...body, tr: 30, recurrence: null });
    const id = created.body.id;

    const list = await ctx.as.client.get(`/api/projects/${A}/operations`);
    expect(list.status).toBe(200);
    expect(list.body.find((o: OperationResponse) => o.id === id)).toEqual(created.body);

    const patched = await ctx.as.coordinator.patch(`/api/projects/${A}/operations/${id}`).send({ limits: { bedVelocityMax: 0.5 }, tc: 4 });
    expect(patched.status).toBe(200);
    // Limits are replaced whole; a bed-velocity limit without a method uses the linear method.
    expect(patched.body.limits).toEqual({ bedVelocityMax: 0.5, bedVelocityMethod: 'linear' });
    expect(patched.body).toMatchObject({ tpop: 20, tc: 4, tr: 24, name: body.name, siteIds: [site.id] });

    expect((await ctx.as.coordinator.delete(`/api/projects/${A}/operations/${id}`)).status).toBe(204);
    expect((await ctx.as.skipper.get(`/api/projects/${A}/operations/${id}`)).status).toBe(404);
  });

  it('refuses bad limits and durations with 400 naming the field', async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ limits: { hsMax: 25 } }, 'limits.hsMax'],
      [{ limits: { hsMax: -1 } }, 'limits.hsMax'],
      [{ limits: { windMax: 'strong' } }, 'limits.windMax'],
      [{ limits: { bedVelocityMax: 0.5, bedVelocityMethod: 'guess' } }, 'limits.bedVelocityMethod'],
      [
        {
          limits: {
            hsTpCurve: [
              [8, 1.5],
              [6, 1.2],
            ],
          },
        },
        'limits.hsTpCurve.1.0',
      ],
      [{ limits: { tpExcluded: [[11, 10]] } }, 'limits.tpExcluded.0'],
      [{ limits: { tpMin: 12, tpMax: 8 } }, 'limits.tpMax'],
      [{ tpop: 0.1 }, 'tpop'],
      [{ tc: -1 }, 'tc'],
      [{ weatherRestricted: 'yes' }, 'weatherRestricted'],
      [{ siteIds: ['not-an-id'] }, 'siteIds.0'],
      [{ description: 'Lift\u0000' }, 'description'],
    ];
    for (const [over, field] of cases) {
      const res = await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody(over));
      expect(res.status, JSON.stringify(over)).toBe(400);
      expect(fields(res), JSON.stringify(over)).toContain(field);
    }
  });

  it('refuses an operation without any limit', async () => {
    for (const limits of [{}, { hsMax: null, tpExcluded: [] }]) {
      const res = await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody({ limits }));
      expect(res.status).toBe(400);
      expect(fields(res)).toContain('limits');
      expect(res.body.error.message).toMatch(/at least one limit/i);
    }
  });

  // Weather-restricted range TPOP <= 72 h and TR <= 96 h, both bounds included: from memory of
  // DNV-ST-N001 and its predecessor DNV-OS-H101 ("less than"; including the bounds is the safe side).
  it('accepts a weather-restricted operation up to TPOP 72 h and TR 96 h (bounds included), refuses beyond', async () => {
    // TPOP 72 h exactly and TR 96 h exactly are accepted.
    expect((await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody({ tpop: 72, tc: 24 }))).status).toBe(201);
    // TR 72 h and TR 78 h (refused before this correction) are accepted.
    expect((await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody({ tpop: 60, tc: 12 }))).status).toBe(201);
    expect((await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody({ tpop: 60, tc: 18 }))).status).toBe(201);
    const overTr = await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody({ tpop: 60, tc: 36.5 }));
    expect(overTr.status).toBe(400);
    expect(fields(overTr)).toEqual(['weatherRestricted']);
    expect(overTr.body.error.message).toMatch(/96 h/);
    const overTpop = await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody({ tpop: 73, tc: 0 }));
    expect(overTpop.status).toBe(400);
    expect(fields(overTpop)).toEqual(['weatherRestricted']);
    expect(overTpop.body.error.message).toMatch(/72 h/);
    // Not weather-restricted: no bound.
    expect(
      (await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody({ tpop: 300, tc: 100, weatherRestricted: false })))
        .status,
    ).toBe(201);
    // A change that pushes a weather-restricted operation over 96 h is refused as well.
    const op = await createOp(ctx.as.coordinator, A, { tpop: 48, tc: 12 });
    const patch = await ctx.as.coordinator.patch(`/api/projects/${A}/operations/${op.id}`).send({ tc: 49 });
    expect(patch.status).toBe(400);
    expect(fields(patch)).toEqual(['weatherRestricted']);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/operations/${op.id}`)).body.tc).toBe(12);
  });

  it('refuses an alpha table that does not reach TPOP 72 h (400 naming the field): never a silent alpha = 1', async () => {
    const short = {
      tpopBoundsH: [12, 24, 48],
      hsColumnsM: [1, 2],
      values: [
        [0.65, 0.76],
        [0.63, 0.73],
        [0.6, 0.68],
      ],
    };
    const res = await ctx.as.coordinator.put(`/api/projects/${A}/alpha`).send(short);
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { field: string }) => d.field)).toEqual(['tpopBoundsH.2']);
    expect(res.body.error.details[0].message).toMatch(/72 h/);
    const ok = await ctx.as.coordinator.put(`/api/projects/${A}/alpha`).send({ ...short, tpopBoundsH: [12, 24, 72] });
    expect(ok.status, ok.text).toBe(200);
    expect((await ctx.as.coordinator.delete(`/api/projects/${A}/alpha`)).status).toBeLessThan(300);
  });

  it('accepts only worksites and skippers of the same project', async () => {
    const siteOfB = await createSite(ctx.as.coordinator, B);
    const foreign = await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody({ siteIds: [siteOfB.id] }));
    expect(foreign.status).toBe(400);
    expect(fields(foreign)).toEqual(['siteIds.0']);
    const notSkipper = await ctx.as.coordinator
      .post(`/api/projects/${A}/operations`)
      .send(opBody({ skipperIds: [ctx.t.demo.users.skipper, ctx.t.demo.users.client] }));
    expect(notSkipper.status).toBe(400);
    expect(fields(notSkipper)).toEqual(['skipperIds.1']);
  });

  it('refuses a second operation with the same name with 409', async () => {
    const op = await createOp(ctx.as.coordinator, A);
    expect((await ctx.as.coordinator.post(`/api/projects/${A}/operations`).send(opBody({ name: ` ${op.name} ` }))).status).toBe(409);
  });
});

describe('alpha table', () => {
  it('starts from the default table of docs/domain.md#weather-restricted with the note, saves an edit and resets it', async () => {
    const first = await ctx.as.skipper.get(`/api/projects/${A}/alpha`);
    expect(first.status).toBe(200);
    expect(first.body).toEqual({
      table: NOTES_ALPHA,
      isDefault: true,
      note: 'Defaults from memory of DNV-ST-N001 base case; check against the current standard.',
      updatedAt: null,
    });

    const edited = { ...NOTES_ALPHA, values: NOTES_ALPHA.values.map((row, r) => (r === 0 ? [0.6, 0.7, 0.75, 0.8] : row)) };
    const put = await ctx.as.coordinator.put(`/api/projects/${A}/alpha`).send(edited);
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({ table: edited, isDefault: false });
    expect((await ctx.as.client.get(`/api/projects/${A}/alpha`)).body.table).toEqual(edited);

    const bad = await ctx.as.coordinator
      .put(`/api/projects/${A}/alpha`)
      .send({ ...NOTES_ALPHA, values: [[1.2, 0.7, 0.7, 0.7], ...NOTES_ALPHA.values.slice(1)] });
    expect(bad.status).toBe(400);
    expect(fields(bad)).toContain('values.0.0');
    const unsorted = await ctx.as.coordinator.put(`/api/projects/${A}/alpha`).send({ ...NOTES_ALPHA, tpopBoundsH: [12, 24, 24, 48, 72] });
    expect(unsorted.status).toBe(400);
    expect(fields(unsorted)).toContain('tpopBoundsH.2');

    const reset = await ctx.as.coordinator.delete(`/api/projects/${A}/alpha`);
    expect(reset.status).toBe(200);
    expect(reset.body).toMatchObject({ table: NOTES_ALPHA, isDefault: true });
  });
});

describe('roles and project boundaries', () => {
  let site: SiteResponse;
  let op: OperationResponse;
  let siteOfB: SiteResponse;
  let opOfB: OperationResponse;

  beforeAll(async () => {
    site = await createSite(ctx.as.coordinator, A);
    op = await createOp(ctx.as.coordinator, A, { siteIds: [site.id] });
    siteOfB = await createSite(ctx.as.coordinator, B);
    opOfB = await createOp(ctx.as.coordinator, B);
  });

  const routes = (p: string, siteId: string, opId: string) =>
    [
      ['get', `/api/projects/${p}/sites`],
      ['post', `/api/projects/${p}/sites`],
      ['get', `/api/projects/${p}/sites/${siteId}`],
      ['patch', `/api/projects/${p}/sites/${siteId}`],
      ['delete', `/api/projects/${p}/sites/${siteId}`],
      ['get', `/api/projects/${p}/operations`],
      ['post', `/api/projects/${p}/operations`],
      ['get', `/api/projects/${p}/operations/${opId}`],
      ['patch', `/api/projects/${p}/operations/${opId}`],
      ['delete', `/api/projects/${p}/operations/${opId}`],
      ['get', `/api/projects/${p}/alpha`],
      ['put', `/api/projects/${p}/alpha`],
      ['delete', `/api/projects/${p}/alpha`],
      ['get', `/api/projects/${p}/export`],
      ['post', `/api/projects/${p}/import`],
      ['get', `/api/projects/${p}/audit`],
    ] as const;

  it('refuses anonymous callers with 401 on every route', async () => {
    const anon = request(ctx.t.app);
    for (const [method, url] of routes(A, site.id, op.id)) {
      const res = await anon[method](url).send({});
      expect(res.status, `${method} ${url}`).toBe(401);
      expect(res.body.error.code).toBe('unauthenticated');
    }
  });

  it('lets skippers and clients read and refuses every write with 403', async () => {
    const writes: [string, string, unknown][] = [
      ['post', `/api/projects/${A}/sites`, siteBody()],
      ['patch', `/api/projects/${A}/sites/${site.id}`, { depth: 5 }],
      ['delete', `/api/projects/${A}/sites/${site.id}`, {}],
      ['post', `/api/projects/${A}/operations`, opBody()],
      ['patch', `/api/projects/${A}/operations/${op.id}`, { limits: { hsMax: 3 } }],
      ['delete', `/api/projects/${A}/operations/${op.id}`, {}],
      ['put', `/api/projects/${A}/alpha`, NOTES_ALPHA],
      ['delete', `/api/projects/${A}/alpha`, {}],
      ['post', `/api/projects/${A}/import?mode=replace`, { format: 'lullwatch-setup' }],
    ];
    for (const agent of [ctx.as.skipper, ctx.as.client] as Agent[]) {
      for (const [method, url, body] of writes) {
        const res = await (agent as unknown as Record<string, (u: string) => request.Test>)[method](url).send(body as object);
        expect(res.status, `${method} ${url}`).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
      for (const [method, url] of routes(A, site.id, op.id).filter(([m]) => m === 'get')) {
        expect((await agent[method](url)).status, url).toBe(200);
      }
    }
    // Nothing changed.
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/sites/${site.id}`)).body).toEqual(site);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/operations/${op.id}`)).body).toEqual(op);
    // The skipper is a client in project B: writes there are refused too.
    expect((await ctx.as.skipper.post(`/api/projects/${B}/sites`).send(siteBody())).status).toBe(403);
  });

  it('lets an administrator who is not a member write', async () => {
    const res = await ctx.as.admin.post(`/api/projects/${A}/sites`).send(siteBody());
    expect(res.status).toBe(201);
  });

  it('answers 404 to the demo client on every route of the second project', async () => {
    for (const [method, url] of routes(B, siteOfB.id, opOfB.id)) {
      const res = await ctx.as.client[method](url).send({});
      expect(res.status, `${method} ${url}`).toBe(404);
    }
  });

  it('answers 404 for another project’s ids, malformed ids and unknown ids', async () => {
    const unknownId = '00000000-0000-4000-8000-000000000000';
    for (const id of [siteOfB.id, 'not-a-uuid', unknownId]) {
      expect((await ctx.as.coordinator.get(`/api/projects/${A}/sites/${id}`)).status, id).toBe(404);
      expect((await ctx.as.coordinator.patch(`/api/projects/${A}/sites/${id}`).send({ depth: 3 })).status, id).toBe(404);
      expect((await ctx.as.coordinator.delete(`/api/projects/${A}/sites/${id}`)).status, id).toBe(404);
    }
    for (const id of [opOfB.id, 'not-a-uuid', unknownId]) {
      expect((await ctx.as.coordinator.get(`/api/projects/${A}/operations/${id}`)).status, id).toBe(404);
      expect((await ctx.as.coordinator.patch(`/api/projects/${A}/operations/${id}`).send({ tpop: 3 })).status, id).toBe(404);
      expect((await ctx.as.coordinator.delete(`/api/projects/${A}/operations/${id}`)).status, id).toBe(404);
    }
    // Project B's worksite is untouched.
    expect((await ctx.as.coordinator.get(`/api/projects/${B}/sites/${siteOfB.id}`)).body).toEqual(siteOfB);
    expect((await ctx.as.coordinator.get(`/api/projects/not-a-uuid/sites`)).status).toBe(404);
  });
});

describe('audit trail', () => {
  it('records a limit change: who, when, before and after', async () => {
    const op = await createOp(ctx.as.coordinator, A, { limits: { hsMax: 2, windMax: 15 } });
    const startedAt = Date.now();
    const res = await ctx.as.coordinator.patch(`/api/projects/${A}/operations/${op.id}`).send({ limits: { hsMax: 1.5, windMax: 15 } });
    expect(res.status).toBe(200);

    // Clients read the trail (issue 5); so do skippers (see server/routes/audit.ts).
    for (const agent of [ctx.as.client, ctx.as.skipper, ctx.as.coordinator] as Agent[]) {
      const audit = await agent.get(`/api/projects/${A}/audit?entity=operation&limit=5`);
      expect(audit.status).toBe(200);
      const [latest] = audit.body;
      expect(latest).toMatchObject({
        entity: 'operation',
        entityId: op.id,
        entityName: op.name,
        action: 'update',
        userId: ctx.t.demo.users.coordinator,
        userName: 'Demo Coordinator',
        before: { limits: { hsMax: 2, windMax: 15 }, tpop: op.tpop, tc: op.tc },
        after: { limits: { hsMax: 1.5, windMax: 15 }, tpop: op.tpop, tc: op.tc },
      });
      expect(Date.parse(latest.at)).toBeGreaterThanOrEqual(startedAt - 5_000);
    }
    // The creation is in the trail too, before the change.
    const all = await ctx.as.coordinator.get(`/api/projects/${A}/audit?entity=operation&limit=500`);
    const mine = all.body.filter((e: { entityId: string }) => e.entityId === op.id).map((e: { action: string }) => e.action);
    expect(mine).toEqual(['update', 'create']);
  });

  it('records a worksite depth change and an alpha-table edit, and skips changes that change nothing', async () => {
    const site = await createSite(ctx.as.coordinator, A, { depth: 14 });
    await ctx.as.coordinator.patch(`/api/projects/${A}/sites/${site.id}`).send({ depth: 9 });
    await ctx.as.coordinator.patch(`/api/projects/${A}/sites/${site.id}`).send({ depth: 9 });
    const sites = await ctx.as.coordinator.get(`/api/projects/${A}/audit?entity=worksite&limit=500`);
    const entries = sites.body.filter((e: { entityId: string }) => e.entityId === site.id);
    expect(entries.map((e: { action: string }) => e.action)).toEqual(['update', 'create']);
    expect(entries[0].before.depth).toBe(14);
    expect(entries[0].after.depth).toBe(9);

    const edited = { ...NOTES_ALPHA, values: NOTES_ALPHA.values.map((row) => row.map((v) => Math.round((v - 0.01) * 100) / 100)) };
    await ctx.as.coordinator.put(`/api/projects/${A}/alpha`).send(edited);
    const alpha = await ctx.as.coordinator.get(`/api/projects/${A}/audit?entity=alpha&limit=1`);
    expect(alpha.body[0]).toMatchObject({
      action: 'update',
      before: { table: NOTES_ALPHA, isDefault: true },
      after: { table: edited, isDefault: false },
    });
    await ctx.as.coordinator.delete(`/api/projects/${A}/alpha`);
  });

  it('cannot be changed through the API', async () => {
    const before = await ctx.as.coordinator.get(`/api/projects/${A}/audit?limit=500`);
    expect(before.body.length).toBeGreaterThan(0);
    const entryId = before.body[0].id;
    for (const agent of [ctx.as.coordinator, ctx.as.admin] as Agent[]) {
      for (const url of [`/api/projects/${A}/audit`, `/api/projects/${A}/audit/${entryId}`]) {
        expect((await agent.put(url).send({ after: null })).status, `PUT ${url}`).toBe(404);
        expect((await agent.patch(url).send({ after: null })).status, `PATCH ${url}`).toBe(404);
        expect((await agent.delete(url)).status, `DELETE ${url}`).toBe(404);
        expect((await agent.post(url).send({ entity: 'operation' })).status, `POST ${url}`).toBe(404);
      }
    }
    const after = await ctx.as.coordinator.get(`/api/projects/${A}/audit?limit=500`);
    expect(after.body).toEqual(before.body);
  });

  it('validates its query', async () => {
    const res = await ctx.as.coordinator.get(`/api/projects/${A}/audit?entity=ship`);
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['entity']);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/audit?limit=0`)).status).toBe(400);
    const two = await ctx.as.coordinator.get(`/api/projects/${A}/audit?entity=&limit=2`);
    expect(two.status).toBe(200);
    expect(two.body).toHaveLength(2);
  });
});

describe('setup export and import', () => {
  const stripVolatile = (doc: Record<string, unknown>) => {
    const { exportedAt: _e, project: _p, ...rest } = doc;
    return rest;
  };

  it('exports a project setup and imports it into the second project (replace), round trip', async () => {
    const table = {
      directionSectorsDeg: [
        [0, 180],
        [180, 360],
      ],
      tpBandsS: [
        [0, 8],
        [8, 25],
      ],
      factors: [
        [0.6, 0.7],
        [0.9, 1],
      ],
    };
    const north = await createSite(ctx.as.coordinator, A, { name: unique('Landfall'), transferTable: table });
    const south = await createSite(ctx.as.coordinator, A, { name: unique('Substation'), depth: 40, shoreNormal: null });
    const twoSites = await createOp(ctx.as.coordinator, A, { siteIds: [north.id, south.id], skipperIds: [ctx.t.demo.users.skipper] });
    await createOp(ctx.as.coordinator, A, {
      limits: {
        hsTpCurve: [
          [4, 1],
          [10, 2],
        ],
        windMax: 14,
      },
      weatherRestricted: false,
      tpop: 200,
      tc: 40,
    });
    const alpha = { ...NOTES_ALPHA, values: NOTES_ALPHA.values.map((row) => row.map((v) => Math.round((v - 0.02) * 100) / 100)) };
    expect((await ctx.as.coordinator.put(`/api/projects/${A}/alpha`).send(alpha)).status).toBe(200);
    // Something in B that the replace must remove.
    const old = await createSite(ctx.as.coordinator, B, { name: unique('Old pontoon') });

    const exported = await ctx.as.client.get(`/api/projects/${A}/export`);
    expect(exported.status).toBe(200);
    expect(exported.headers['content-type']).toMatch(/application\/json/);
    // Project name "Varrow Reach export cable and landfall" (seed/scenario.ts) sanitised.
    expect(exported.headers['content-disposition']).toBe('attachment; filename="varrow-reach-export-cable-and-landfall-setup.json"');
    const doc = exported.body;
    expect(ProjectSetupDocument.safeParse(doc).success).toBe(true);
    expect(doc).toMatchObject({ format: 'lullwatch-setup', version: 1, alphaTable: alpha });
    const docOp = doc.operations.find((o: { name: string }) => o.name === twoSites.name);
    expect(docOp.siteNames.sort()).toEqual([north.name, south.name].sort());
    expect(docOp).not.toHaveProperty('skipperIds');
    expect(JSON.stringify(doc)).not.toContain(north.id);

    const imported = await ctx.as.coordinator.post(`/api/projects/${B}/import?mode=replace`).send(doc);
    expect(imported.status, imported.text).toBe(200);
    expect(imported.body).toMatchObject({
      mode: 'replace',
      worksites: { created: doc.worksites.length },
      operations: { created: doc.operations.length },
      alphaTable: 'set',
    });

    const again = await ctx.as.coordinator.get(`/api/projects/${B}/export`);
    expect(stripVolatile(again.body)).toEqual(stripVolatile(doc));
    expect(again.headers['content-disposition']).toBe('attachment; filename="harl-sound-pontoon-renewal-setup.json"');

    // New ids in B; site names map to B's own worksites; the old worksite is gone.
    const sitesB: SiteResponse[] = (await ctx.as.coordinator.get(`/api/projects/${B}/sites`)).body;
    expect(sitesB.map((s) => s.name)).not.toContain(old.name);
    const northB = sitesB.find((s) => s.name === north.name)!;
    expect(northB.id).not.toBe(north.id);
    expect(northB.transferTable).toEqual(table);
    const opsB: OperationResponse[] = (await ctx.as.coordinator.get(`/api/projects/${B}/operations`)).body;
    const opB = opsB.find((o) => o.name === docOp.name)!;
    expect(opB.siteIds.sort()).toEqual([northB.id, sitesB.find((s) => s.name === south.name)!.id].sort());
    expect(opB.skipperIds).toEqual([]);

    // Campaigns travel by name: the demo's campaign arrives with B's own operation and site ids.
    expect(doc.campaigns.map((c: { name: string }) => c.name)).toEqual(['Nearshore campaign: lay, berm, pull-in']);
    const campaignsB = (await ctx.as.coordinator.get(`/api/projects/${B}/campaigns`)).body as {
      name: string;
      steps: { operationId: string; siteId: string }[];
    }[];
    expect(campaignsB.map((c) => c.name)).toEqual(['Nearshore campaign: lay, berm, pull-in']);
    const idsB = new Set([...opsB.map((o) => o.id), ...sitesB.map((s) => s.id)]);
    for (const st of campaignsB[0].steps) expect(idsB.has(st.operationId) && idsB.has(st.siteId)).toBe(true);
    expect(campaignsB[0].steps.map((st) => opsB.find((o) => o.id === st.operationId)!.name)).toEqual(
      doc.campaigns[0].steps.map((st: { operationName: string }) => st.operationName),
    );

    const audit = await ctx.as.coordinator.get(`/api/projects/${B}/audit?entity=project&limit=1`);
    expect(audit.body[0]).toMatchObject({ action: 'import', userName: 'Demo Coordinator' });

    // Merge of the same document now clashes on every name: 409 listing them, nothing written.
    const countsBefore = await rowCounts(B);
    const clash = await ctx.as.coordinator.post(`/api/projects/${B}/import`).send(doc);
    expect(clash.status).toBe(409);
    expect(clash.body.error.details.worksites.sort()).toEqual(doc.worksites.map((w: { name: string }) => w.name).sort());
    expect(clash.body.error.details.operations.sort()).toEqual(doc.operations.map((o: { name: string }) => o.name).sort());
    expect(await rowCounts(B)).toEqual(countsBefore);

    await ctx.as.coordinator.delete(`/api/projects/${A}/alpha`);
  });

  it('merges a document with new names, keeping what is there', async () => {
    const before = await rowCounts(A);
    const doc = {
      format: 'lullwatch-setup',
      version: 1,
      exportedAt: '2026-03-01T08:00:00Z',
      project: { name: 'An older contract' },
      worksites: [{ name: unique('Merged berth'), depth: 6, timeZone: 'UTC' }],
      operations: [{ name: unique('Merged lift'), tpop: 4, tc: 2, weatherRestricted: true, limits: { hsMax: 1 } }],
    };
    const res = await ctx.as.coordinator.post(`/api/projects/${A}/import`).send(doc);
    expect(res.status, res.text).toBe(200);
    // No alphaTable key: the project's table is kept.
    expect(res.body).toMatchObject({
      mode: 'merge',
      worksites: { created: 1, deleted: 0 },
      operations: { created: 1, deleted: 0 },
      alphaTable: 'kept',
      dataPoint: 'kept',
    });
    expect(res.body.messages).toEqual([expect.stringMatching(/no alpha table/), expect.stringMatching(/no data point/)]);
    const after = await rowCounts(A);
    expect(after.sites).toBe(before.sites + 1);
    expect(after.ops).toBe(before.ops + 1);
  });

  // Issue 22, item 2: a merge used to set the file's alpha table (here: the default) over a
  // project's own table without a word; the file's data point was dropped without a word.
  it('merge keeps the project’s own alpha table unless asked to take the file’s, and says what it did with the data point', async () => {
    const own = { ...NOTES_ALPHA, values: NOTES_ALPHA.values.map((row) => row.map((v) => Math.round((v - 0.05) * 100) / 100)) };
    expect((await ctx.as.coordinator.put(`/api/projects/${A}/alpha`).send(own)).status).toBe(200);
    const projectBefore = (await ctx.as.coordinator.get(`/api/projects/${A}`)).body;
    const doc = () => ({
      format: 'lullwatch-setup',
      version: 1,
      exportedAt: '2026-03-01T08:00:00Z',
      project: {
        name: 'An older contract',
        dataPointName: 'Outer buoy K2',
        dataPointLatitude: 51.5,
        dataPointLongitude: -4.25,
        dataPointDepthM: 60,
      },
      alphaTable: null,
      worksites: [{ name: unique('Merged quay'), depth: 6, timeZone: 'UTC' }],
      operations: [],
    });

    // Issue 22, item 2 first: a merge without the tick used to reset the project's table to the default.
    const plain = await ctx.as.coordinator.post(`/api/projects/${A}/import`).send(doc());
    expect(plain.status, plain.text).toBe(200);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/alpha`)).body).toMatchObject({ isDefault: false, table: own });

    // The preview says what would happen, and writes nothing.
    const d1 = doc();
    const preview = await ctx.as.coordinator.post(`/api/projects/${A}/import/preview`).send(d1);
    expect(preview.status, preview.text).toBe(200);
    expect(preview.body).toMatchObject({
      mode: 'merge',
      refusal: null,
      adds: { worksites: [d1.worksites[0].name], operations: [], campaigns: [] },
      removes: { worksites: [], operations: [], campaigns: [], confirmedLedgerDays: 0 },
      alphaTable: { outcome: 'kept' },
      dataPoint: { outcome: 'kept' },
    });
    expect(preview.body.alphaTable.message).toMatch(/left out.*keeps its own table/);
    expect(preview.body.dataPoint.message).toMatch(/Outer buoy K2.*left out/);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/sites`)).body.map((s: SiteResponse) => s.name)).not.toContain(
      d1.worksites[0].name,
    );

    const kept = await ctx.as.coordinator.post(`/api/projects/${A}/import`).send(d1);
    expect(kept.status, kept.text).toBe(200);
    expect(kept.body).toMatchObject({ alphaTable: 'kept', dataPoint: 'kept' });
    expect(kept.body.messages).toEqual([preview.body.alphaTable.message, preview.body.dataPoint.message]);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/alpha`)).body).toMatchObject({ isDefault: false, table: own });
    const projectKept = (await ctx.as.coordinator.get(`/api/projects/${A}`)).body;
    expect(projectKept.dataPointName).toBe(projectBefore.dataPointName);
    expect(projectKept.dataPointDepthM).toBe(projectBefore.dataPointDepthM);

    // Ticked: the file's table (the default) and its data point are taken.
    const taken = await ctx.as.coordinator.post(`/api/projects/${A}/import?alphaTable=take&dataPoint=take`).send(doc());
    expect(taken.status, taken.text).toBe(200);
    expect(taken.body).toMatchObject({ alphaTable: 'default', dataPoint: 'set' });
    expect(taken.body.messages[1]).toMatch(/Outer buoy K2.*replaces/);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/alpha`)).body.isDefault).toBe(true);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}`)).body).toMatchObject({
      dataPointName: 'Outer buoy K2',
      dataPointLatitude: 51.5,
      dataPointLongitude: -4.25,
      dataPointDepthM: 60,
    });
    // Put the demo's data point back for the tests that follow.
    await ctx.t.database.db
      .update(project)
      .set({
        dataPointName: projectBefore.dataPointName,
        dataPointLatitude: projectBefore.dataPointLatitude,
        dataPointLongitude: projectBefore.dataPointLongitude,
        dataPointDepthM: projectBefore.dataPointDepthM,
      })
      .where(eq(project.id, A));
    expect((await ctx.as.coordinator.post(`/api/projects/${A}/import?alphaTable=always`).send(doc())).status).toBe(400);
  });

  // Issue 22, item 1: replace used to delete the whole downtime ledger, confirmed days included.
  it('replace is refused while confirmed ledger days exist, and the preview lists everything replace removes', async () => {
    const exported = (await ctx.as.coordinator.get(`/api/projects/${A}/export`)).body;
    const site = await createSite(ctx.as.coordinator, B, { name: unique('Ledger berth') });
    const op = await createOp(ctx.as.coordinator, B, { name: unique('Ledger lift'), siteIds: [site.id] });
    const db = ctx.t.database.db;
    const [confirmedRow] = await db
      .insert(ledgerDay)
      .values({
        projectId: B,
        operationId: op.id,
        siteId: site.id,
        day: '2026-11-02',
        plannedHours: 24,
        proposedLostHours: 5,
        lostHours: 5,
        source: 'observation',
        status: 'confirmed',
      })
      .returning();
    await db.insert(ledgerDay).values({
      projectId: B,
      operationId: op.id,
      siteId: site.id,
      day: '2026-11-03',
      plannedHours: 24,
      proposedLostHours: 2,
      source: 'observation',
    });

    // The bug first: replace used to go ahead and delete the confirmed day with the worksites.
    const before = await rowCounts(B);
    const refused = await ctx.as.coordinator.post(`/api/projects/${B}/import?mode=replace`).send(exported);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/confirmed day/);
    expect(await rowCounts(B)).toEqual(before);
    expect((await db.select().from(ledgerDay).where(eq(ledgerDay.id, confirmedRow.id))).length).toBe(1);

    const preview = await ctx.as.coordinator.post(`/api/projects/${B}/import/preview?mode=replace`).send(exported);
    expect(preview.status, preview.text).toBe(200);
    const sitesB = (await ctx.as.coordinator.get(`/api/projects/${B}/sites`)).body as SiteResponse[];
    const opsB = (await ctx.as.coordinator.get(`/api/projects/${B}/operations`)).body as OperationResponse[];
    expect(preview.body.removes.worksites.sort()).toEqual(sitesB.map((s) => s.name).sort());
    expect(preview.body.removes.operations.sort()).toEqual(opsB.map((o) => o.name).sort());
    expect(preview.body.removes).toMatchObject({ confirmedLedgerDays: 1, proposedLedgerDays: 1 });
    expect(preview.body.refusal).toMatch(/1 confirmed day \(2026-11-02 to 2026-11-02\)/);

    // With the confirmed day gone (here: removed by hand), replace goes ahead and takes the
    // proposed day with it, as the preview said.
    await db.delete(ledgerDay).where(eq(ledgerDay.id, confirmedRow.id));
    const ok = await ctx.as.coordinator.post(`/api/projects/${B}/import?mode=replace`).send(exported);
    expect(ok.status, ok.text).toBe(200);
    expect(await db.select().from(ledgerDay).where(eq(ledgerDay.projectId, B))).toEqual([]);
  });

  it('refuses a bad document with 400 naming each bad field, and changes nothing', async () => {
    const exported = await ctx.as.coordinator.get(`/api/projects/${A}/export`);
    const doc = structuredClone(exported.body);
    expect(doc.worksites.length).toBeGreaterThan(0);
    expect(doc.operations.length).toBeGreaterThan(1);
    doc.worksites[0].timeZone = 'Atlantis/Capital';
    doc.operations[1].limits = { hsMax: -1 };
    doc.operations[0].siteNames = ['No such berth'];
    doc.campaigns = [{ name: 'Later', steps: [{ operationName: 'No such operation', siteName: doc.worksites[1].name }] }];

    const before = await rowCounts(B);
    const res = await ctx.as.coordinator.post(`/api/projects/${B}/import?mode=replace`).send(doc);
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(
      expect.arrayContaining([
        'worksites.0.timeZone',
        'operations.1.limits.hsMax',
        'operations.0.siteNames.0',
        'campaigns.0.steps.0.operationName',
      ]),
    );
    expect(await rowCounts(B)).toEqual(before);

    for (const bad of [{ ...exported.body, format: 'other' }, { ...exported.body, version: 2 }, {}]) {
      const r = await ctx.as.coordinator.post(`/api/projects/${B}/import?mode=replace`).send(bad);
      expect(r.status).toBe(400);
    }
    const mode = await ctx.as.coordinator.post(`/api/projects/${B}/import?mode=overwrite`).send(exported.body);
    expect(mode.status).toBe(400);
    expect(fields(mode)).toEqual(['mode']);
    expect(await rowCounts(B)).toEqual(before);
  });

  it('rolls everything back when a write fails inside the import transaction', async () => {
    const exported = await ctx.as.coordinator.get(`/api/projects/${A}/export`);
    const parsed = ProjectSetupDocument.parse(exported.body);
    // PostgreSQL text cannot hold a NUL character: the last worksite's insert fails after the
    // replace has already deleted B's worksites and operations.
    parsed.worksites.push({ ...parsed.worksites[0], name: 'Broken\u0000name' });
    const before = await rowCounts(B);
    expect(before.sites).toBeGreaterThan(0); // so the replace has something to delete first
    const sitesBefore = (await ctx.as.coordinator.get(`/api/projects/${B}/sites`)).body;
    const user = { id: ctx.t.demo.users.coordinator, name: 'Demo Coordinator', email: 'coordinator@example.com', role: 'user' as const };
    await expect(importSetup(ctx.t.deps.db, B, user, parsed, 'replace')).rejects.toThrow(/insert into "worksite"/);
    expect(await rowCounts(B)).toEqual(before);
    expect((await ctx.as.coordinator.get(`/api/projects/${B}/sites`)).body).toEqual(sitesBefore);
  });
});

describe('transfer table CSV', () => {
  it('reads a comma file with a byte-order mark, CRLF, comments, blank lines and units in the headers', () => {
    const csv =
      '\uFEFF# Study R-12, model run 3\r\nsector_from [deg],sector_to [deg],0-6 s,6-10 s,10-25 s\r\n\r\n345,15,0.42,0.5,0.61\r\n15,90,0.8,0.85,0.9\r\n90,345,1,1,1\r\n';
    const { table, issues } = parseTransferTableCsv(csv);
    expect(issues).toEqual([]);
    expect(table).toEqual({
      directionSectorsDeg: [
        [345, 15],
        [15, 90],
        [90, 345],
      ],
      tpBandsS: [
        [0, 6],
        [6, 10],
        [10, 25],
      ],
      factors: [
        [0.42, 0.5, 0.61],
        [0.8, 0.85, 0.9],
        [1, 1, 1],
      ],
    });
  });

  it('reads semicolons with decimal commas, quotes and "to" in band headers', () => {
    const csv = 'Sector_From;Sector_To;"4,5 to 7";7-12\n0;360;"0,75";0,8;;\n';
    const { table, issues } = parseTransferTableCsv(csv);
    expect(issues).toEqual([]);
    expect(table).toEqual({
      directionSectorsDeg: [[0, 360]],
      tpBandsS: [
        [4.5, 7],
        [7, 12],
      ],
      factors: [[0.75, 0.8]],
    });
  });

  it('reports bad cells with their line and column', () => {
    const csv = 'sector_from,sector_to,0-6,6-12\n# comment\n0,180,0.5,abc\n180,360,0.7\n';
    const { table, issues } = parseTransferTableCsv(csv);
    expect(table).toBeNull();
    expect(issues).toEqual([
      { line: 3, column: 4, value: 'abc', reason: expect.stringMatching(/number/) },
      { line: 4, column: 0, value: '', reason: expect.stringMatching(/4 cells/) },
    ]);
  });

  it('reports bad headers', () => {
    const { table, issues } = parseTransferTableCsv('direction,sector_to,short,6-12\n0,360,0.5,0.6\n');
    expect(table).toBeNull();
    expect(issues.map((i) => [i.line, i.column])).toEqual([
      [1, 1],
      [1, 3],
    ]);
    expect(parseTransferTableCsv('sector_from,sector_to\n0,360\n').issues[0]).toMatchObject({ line: 1, column: 0 });
    expect(parseTransferTableCsv('sector_from,sector_to,0-6\n').issues[0].reason).toMatch(/no direction sector rows/i);
    expect(parseTransferTableCsv(' \n# only a comment\n').issues).toEqual([{ line: 0, column: 0, value: '', reason: 'The file is empty' }]);
  });

  it('checks the table rules and places each problem in the file', () => {
    // Overlapping sectors (45 < 90), factor above 3, bands out of order (6-12 after 8-20).
    const csv = 'sector_from,sector_to,0-6,8-20,6-12\n0,90,0.5,0.6,0.7\n45,180,0.7,3.5,0.9\n';
    const { table, issues } = parseTransferTableCsv(csv);
    expect(table).toBeNull();
    expect(issues.map((i) => [i.line, i.column, i.value])).toEqual([
      [1, 5, '6-12'],
      [3, 1, '45'],
      [3, 4, '3.5'],
    ]);
  });

  it('allows only the first sector to wrap through north, without overlapping the last one', () => {
    // One Tp band, one factor per sector.
    const sectors = (...directionSectorsDeg: [number, number][]) => ({
      tpBandsS: [[0, 30]] as [number, number][],
      directionSectorsDeg,
      factors: directionSectorsDeg.map(() => [1]),
    });
    const ok = sectors([330, 30], [30, 200], [200, 330]);
    expect(TransferTableInput.safeParse(ok).success).toBe(true);
    const wrapLater = sectors([30, 200], [200, 30]);
    expect(TransferTableInput.safeParse(wrapLater).error?.issues[0].path).toEqual(['directionSectorsDeg', 1, 0]);
    const overlapWrap = sectors([330, 30], [30, 340]);
    expect(TransferTableInput.safeParse(overlapWrap).error?.issues[0].path).toEqual(['directionSectorsDeg', 1, 1]);
  });
});

describe('deleting the only worksite of an operation', () => {
  it('is refused with 409 naming the operation, so the operation is not silently widened to every worksite', async () => {
    const site = await createSite(ctx.as.coordinator, A);
    const op = await createOp(ctx.as.coordinator, A, { siteIds: [site.id] });
    const res = await ctx.as.coordinator.delete(`/api/projects/${A}/sites/${site.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain(op.name);
    expect((await ctx.as.coordinator.get(`/api/projects/${A}/sites/${site.id}`)).status).toBe(200);
  });
});

describe('project members for skipper assignment', () => {
  it('lists members with roles to coordinators only', async () => {
    const res = await ctx.as.coordinator.get(`/api/projects/${A}/members`);
    expect(res.status).toBe(200);
    const roles = Object.fromEntries(res.body.map((m: { email: string; role: string }) => [m.email, m.role]));
    expect(roles['skipper@example.com']).toBe('skipper');
    expect(roles['client@example.com']).toBe('client');
    expect((await ctx.as.client.get(`/api/projects/${A}/members`)).status).toBe(403);
    expect((await ctx.as.skipper.get(`/api/projects/${A}/members`)).status).toBe(403);
  });
});
