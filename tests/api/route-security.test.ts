/**
 * Access rules of every /api route, one table entry per route (method + path pattern as declared
 * in server/routes/). The route list is read from the routers themselves (API_ROUTERS), so a new
 * route without an entry here fails the first test, and so does an entry whose route is gone.
 *
 * Per route it checks: anonymous callers (401 unless the route is public), the four demo users
 * (allowed, or 403 / 404 as the route's guard says), ids of the other demo project (404 for a
 * non-member, 404 when a child id belongs to another project), ids that do not exist or are not
 * ids at all (404, never 500), and that the audit trail cannot be changed through the API.
 *
 * The auth library's own routes (`/api/auth/*`) are mounted outside API_ROUTERS behind an
 * allowlist: the table of them is read from the library (`auth.api`), and every one the UI does
 * not use (all but sign-in, sign-out and change-password) must answer 404, to anonymous callers
 * and to an administrator alike. tests/api/foundation.test.ts and auth-security.test.ts cover the
 * three in use.
 */
import crypto from 'node:crypto';
import request from 'supertest';
import { asc, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NOTHING_CHOSEN } from '../../server/services/subscriptions';
import { createTestApp, signInAll, type Agent, type TestApp } from '../support/app';
import { listApiRoutes, type ApiRoute } from '../../server/routes/route-list';
import { auditEntry, ledgerDay } from '../../server/db/schema';
import { unsubscribeUrl } from '../../server/services/alert-mail';
import { AUTH_ROUTES_IN_USE } from '../../server/app';
import { user as userTable } from '../../server/db/schema';

type Role = 'admin' | 'coordinator' | 'skipper' | 'client';
type Who = 'anonymous' | Role;
const ROLES: Role[] = ['admin', 'coordinator', 'skipper', 'client'];

/**
 * Who may call a route:
 * - `public`: no sign-in; `status` is the answer expected with the prepared parameters.
 * - `token`: a secret header only; without it every caller gets 404, as if the route did not exist.
 * - `signedIn`: any signed-in user.
 * - `admin`: administrators (global role).
 * - `member`: members of the project in the path, and administrators.
 * - `coordinator`: coordinators of the project in the path, and administrators.
 */
type Access = 'public' | 'token' | 'signedIn' | 'admin' | 'member' | 'coordinator';

interface Params {
  projectId: string;
  siteId: string;
  operationId: string;
  datasetId: string;
  campaignId: string;
  entryId: string;
  vesselId: string;
  userId: string;
  file: string;
  /** A campaign step's index. */
  index: string;
}
type ParamName = keyof Params;

interface RouteCase {
  access: Access;
  /** Why the route is public, or any other note on its rule. */
  why?: string;
  /** Public routes: the status expected for every caller with the prepared parameters. */
  status?: number;
  query?: (p: Params) => Record<string, string>;
  /** A valid, harmless body for callers who may use the route (refused callers send `{}`). */
  body?: (p: Params) => unknown;
  /** multipart upload instead of JSON. */
  upload?: boolean;
  /** Throw-away entities made before each call, so that allowed calls change nothing shared. */
  fresh?: () => Promise<Partial<Params>>;
  /** Query parameters that carry ids of project entities. */
  queryIds?: Partial<Record<string, ParamName>>;
}

let t: TestApp;
let as: Record<Role, Agent>;
let anonymous: Agent;
let routes: ApiRoute[];
/** Entities of the first demo project (all demo users are members) and of the second one (the client is not). */
let P1: Params;
let P2: Params;
let settingsBody: Record<string, unknown>;
let alphaTable: unknown;
let setupDocument: unknown;
let firstRecordTime: string;
let counter = 0;
const next = () => ++counter;

const agentOf = (who: Who): Agent => (who === 'anonymous' ? anonymous : as[who]);

const RANDOM_ID = crypto.randomUUID();
const BAD_IDS = [RANDOM_ID, 'not-an-id', "'; drop table x; --"];

const HOURS = 48;
const START_MS = Date.UTC(2026, 0, 1);
const CSV = [
  'time,hs,tp',
  ...Array.from(
    { length: HOURS },
    (_, i) => `${new Date(START_MS + i * 3_600_000).toISOString()},${(0.6 + 0.02 * i).toFixed(2)},${(7 + (i % 5) * 0.5).toFixed(1)}`,
  ),
].join('\n');

async function uploadDataset(projectId: string, kind = 'hindcast'): Promise<string> {
  const res = await as.coordinator
    .post(`/api/projects/${projectId}/datasets`)
    .field('name', `Route security data ${next()}`)
    .field('kind', kind)
    .field('dataPointDepth', 'deep')
    .attach('file', Buffer.from(CSV), 'records.csv');
  if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${res.text}`);
  return res.body.id;
}

async function createSite(projectId: string): Promise<string> {
  const res = await as.coordinator
    .post(`/api/projects/${projectId}/sites`)
    .send({ name: `Route security site ${next()}`, depth: 12, timeZone: 'UTC', shoreNormal: 270 });
  if (res.status !== 201) throw new Error(`site failed: ${res.status} ${res.text}`);
  return res.body.id;
}

/** A worksite with a position and a tide of invented constants (M2 and S2), for the tide routes. */
async function createTideSite(projectId: string): Promise<string> {
  const res = await as.coordinator.post(`/api/projects/${projectId}/sites`).send({
    name: `Route security tide site ${next()}`,
    depth: 4,
    timeZone: 'UTC',
    latitude: 53.5,
    longitude: 8.1,
    tide: {
      source: 'constants',
      constituents: [
        { name: 'M2', amplitude: 1.5, phase: 40 },
        { name: 'S2', amplitude: 0.4, phase: 80 },
      ],
      z0: 2,
      datum: 'LAT',
    },
  });
  if (res.status !== 201) throw new Error(`tide site failed: ${res.status} ${res.text}`);
  return res.body.id;
}

const operationBody = (siteId: string) => ({
  name: `Route security operation ${next()}`,
  tpop: 6,
  tc: 2,
  weatherRestricted: true,
  limits: { hsMax: 1.5 },
  siteIds: [siteId],
});

async function createOperation(projectId: string, siteId: string): Promise<string> {
  const res = await as.coordinator.post(`/api/projects/${projectId}/operations`).send(operationBody(siteId));
  if (res.status !== 201) throw new Error(`operation failed: ${res.status} ${res.text}`);
  return res.body.id;
}

async function createCampaign(projectId: string, operationId: string, siteId: string): Promise<string> {
  const res = await as.coordinator
    .post(`/api/projects/${projectId}/campaigns`)
    .send({ name: `Route security campaign ${next()}`, steps: [{ operationId, siteId }] });
  if (res.status !== 201) throw new Error(`campaign failed: ${res.status} ${res.text}`);
  return res.body.id;
}

/** A proposed ledger day, written directly (proposals need observations this file does not load). */
/** The day of each ledger entry made here, by id (a day's confirmation names the day). */
const ledgerEntryDays = new Map<string, string>();

async function createLedgerEntry(projectId: string, operationId: string, siteId: string): Promise<string> {
  const day = new Date(Date.UTC(2025, 0, 1) + next() * 86_400_000).toISOString().slice(0, 10);
  const [row] = await t.database.db
    .insert(ledgerDay)
    .values({ projectId, operationId, siteId, day, plannedHours: 10, proposedLostHours: 2, proposedLimiting: 'hs', source: 'forecast' })
    .returning({ id: ledgerDay.id });
  ledgerEntryDays.set(row.id, day);
  return row.id;
}

async function createVessel(projectId: string): Promise<string> {
  const res = await as.coordinator.post(`/api/projects/${projectId}/vessels`).send({ name: `Route security vessel ${next()}` });
  if (res.status !== 201) throw new Error(`vessel failed: ${res.status} ${res.text}`);
  return res.body.id;
}

async function calendarFile(): Promise<string> {
  const res = await as.skipper.post('/api/me/calendar');
  if (res.status !== 201) throw new Error(`calendar failed: ${res.status} ${res.text}`);
  return String(res.body.url).split('/').pop()!;
}

/** The signed query of a fresh unsubscribe link. */
const unsubscribeQuery = (p: Params) =>
  Object.fromEntries(new URL(unsubscribeUrl('http://x.invalid', t.deps.config.linkSecret, p.userId, p.projectId, Date.now())).searchParams);

const subscriptionBody = { ...NOTHING_CHOSEN, active: true };
const recurrenceBody = { start: '2026-01-05T06:00', timeZone: 'UTC', rule: 'FREQ=WEEKLY;COUNT=4' };
const ledgerRange = { from: '2026-01-01', to: '2026-01-02' };

/** A query naming one of the project's datasets as `?<name>=`, checked with ids of other projects too. */
function datasetQuery(name: string): Pick<RouteCase, 'query' | 'queryIds'> {
  return { query: (p) => ({ [name]: p.datasetId }), queryIds: { [name]: 'datasetId' } };
}

/** Every /api route and who may call it. Keys: method and path pattern, without the /api prefix. */
const TABLE: Record<string, RouteCase> = {
  'GET /health': { access: 'public', status: 200, why: 'liveness probe for a load balancer; answers only { ok }, no data' },
  'GET /me': { access: 'signedIn' },
  'GET /projects': { access: 'signedIn', why: 'lists only the caller’s own projects (admins: all)' },
  'POST /projects': {
    access: 'coordinator',
    why: 'administrators and users who coordinate at least one project (not tied to the project in the path)',
    body: () => ({ name: `Route security project ${next()}` }),
  },
  'GET /projects/:projectId': { access: 'member' },
  'PUT /projects/:projectId/settings': { access: 'coordinator', body: () => settingsBody },
  'GET /projects/:projectId/members': { access: 'coordinator' },

  'GET /admin/users': { access: 'admin' },
  'POST /admin/users': { access: 'admin', body: () => ({ name: 'Route security user', email: `route-security-${next()}@example.com` }) },
  'PATCH /admin/users/:userId': { access: 'admin', body: () => ({ active: true }) },
  'POST /admin/users/:userId/temporary-password': { access: 'admin', why: 'a new temporary password for the scratch user' },
  'PUT /admin/users/:userId/projects/:projectId': { access: 'admin', body: () => ({ role: 'client' }) },
  'DELETE /admin/users/:userId/projects/:projectId': {
    access: 'admin',
    fresh: async () => {
      const res = await as.admin.put(`/api/admin/users/${P1.userId}/projects/${P1.projectId}`).send({ role: 'client' });
      if (res.status !== 200) throw new Error(`membership failed: ${res.status} ${res.text}`);
      return {};
    },
  },

  'GET /projects/:projectId/sites': { access: 'member' },
  'POST /projects/:projectId/sites': {
    access: 'coordinator',
    body: () => ({ name: `Route security site ${next()}`, depth: 9, timeZone: 'UTC' }),
  },
  'GET /projects/:projectId/sites/:siteId': { access: 'member' },
  'PATCH /projects/:projectId/sites/:siteId': { access: 'coordinator', body: () => ({ breakerIndex: 0.6 }) },
  'DELETE /projects/:projectId/sites/:siteId': { access: 'coordinator', fresh: async () => ({ siteId: await createSite(P1.projectId) }) },
  'GET /projects/:projectId/sites/:siteId/tide': {
    access: 'member',
    why: 'the predicted tide of a worksite with constants; read-only',
    fresh: async () => ({ siteId: await createTideSite(P1.projectId) }),
    query: () => ({ from: '2026-12-01T00:00:00Z', to: '2026-12-02T00:00:00Z' }),
  },
  'GET /projects/:projectId/sites/:siteId/tide-stations': {
    access: 'member',
    why: 'stations of the public tide database near a worksite with a position; read-only',
    fresh: async () => ({ siteId: await createTideSite(P1.projectId) }),
  },
  'GET /projects/:projectId/sites/:siteId/current-stations': {
    access: 'member',
    why: 'current stations of the public tide database near a worksite with a position; read-only',
    fresh: async () => ({ siteId: await createTideSite(P1.projectId) }),
  },

  'POST /projects/:projectId/tide-preview': {
    access: 'coordinator',
    why: 'the tide the worksite form is editing, before it is saved; changes nothing but belongs to setup',
    body: () => ({ tide: { source: 'constants', constituents: [{ name: 'M2', amplitude: 1, phase: 0 }], z0: 1, datum: 'LAT' } }),
  },
  'GET /projects/:projectId/tide-stations': {
    access: 'member',
    why: 'stations of the public tide database near a position; read-only',
    query: () => ({ latitude: '53.5', longitude: '8.1' }),
  },
  'GET /projects/:projectId/current-stations': {
    access: 'member',
    why: 'current stations of the public tide database near a position; read-only',
    query: () => ({ latitude: '41.55', longitude: '-69.98' }),
  },

  'GET /projects/:projectId/operations': { access: 'member' },
  'POST /projects/:projectId/operations': { access: 'coordinator', body: (p) => operationBody(p.siteId) },
  'GET /projects/:projectId/operations/:operationId': { access: 'member' },
  'PATCH /projects/:projectId/operations/:operationId': { access: 'coordinator', body: () => ({ tc: 2 }) },
  'DELETE /projects/:projectId/operations/:operationId': {
    access: 'coordinator',
    fresh: async () => ({ operationId: await createOperation(P1.projectId, P1.siteId) }),
  },
  'PUT /projects/:projectId/operations/:operationId/recurrence': { access: 'coordinator', body: () => recurrenceBody },
  'DELETE /projects/:projectId/operations/:operationId/recurrence': { access: 'coordinator' },

  'GET /projects/:projectId/alpha': { access: 'member' },
  'PUT /projects/:projectId/alpha': { access: 'coordinator', body: () => alphaTable },
  'DELETE /projects/:projectId/alpha': { access: 'coordinator', why: 'resets to the default table' },
  'GET /projects/:projectId/alpha/calibrated': { access: 'member', ...datasetQuery('observation') },
  'POST /projects/:projectId/alpha/adopt-calibrated': {
    access: 'coordinator',
    why: 'allowed callers get 409 here (no forecast archive in the test data), so nothing is adopted',
    body: (p) => ({ observation: p.datasetId }),
  },
  'GET /projects/:projectId/forecast-skill': { access: 'member', ...datasetQuery('observation') },

  'GET /projects/:projectId/export': { access: 'member' },
  'POST /projects/:projectId/import/preview': {
    access: 'coordinator',
    why: 'writes nothing; answers what an import would add and remove',
    query: () => ({ mode: 'replace' }),
    body: () => setupDocument,
  },
  'POST /projects/:projectId/import': {
    access: 'coordinator',
    why: 'the project’s own export in merge mode: 409 on the clashing names, nothing changes',
    query: () => ({ mode: 'merge' }),
    body: () => setupDocument,
  },
  'GET /projects/:projectId/audit': { access: 'member', why: 'read-only; skippers and clients may see why limits changed' },

  'GET /projects/:projectId/datasets': { access: 'member' },
  'PUT /projects/:projectId/default-hindcast': {
    access: 'coordinator',
    why: 'null: the newest hindcast is the default again',
    body: () => ({ datasetId: null }),
  },
  'POST /projects/:projectId/datasets': { access: 'coordinator', upload: true },
  // Lists a NetCDF file's grid points before an import: coordinators, who import (a CSV answers 400).
  'POST /projects/:projectId/datasets/netcdf-points': { access: 'coordinator', upload: true },
  'GET /projects/:projectId/datasets/:datasetId': { access: 'member' },
  'GET /projects/:projectId/datasets/:datasetId/records': { access: 'member' },
  'GET /projects/:projectId/datasets/:datasetId/monthly': { access: 'member' },
  'GET /projects/:projectId/datasets/:datasetId/csv': { access: 'member' },
  'DELETE /projects/:projectId/datasets/:datasetId': {
    access: 'coordinator',
    fresh: async () => ({ datasetId: await uploadDataset(P1.projectId) }),
  },
  'POST /projects/:projectId/forecasts/fetch': { access: 'coordinator', why: 'asks the (local fake) forecast service' },

  'GET /wave/regular': { access: 'signedIn', query: () => ({ period: '8', height: '1', depth: '10' }) },
  'GET /wave/profile': { access: 'signedIn', query: () => ({ period: '8', height: '1', depth: '10' }) },
  'GET /wave/table': { access: 'signedIn', query: () => ({ from: '0.01', to: '0.5', step: '0.01' }) },
  'GET /wave/sea-state': { access: 'signedIn', query: () => ({ hs: '1.5', tp: '9', depth: '12' }) },
  'GET /wave/response': {
    access: 'signedIn',
    why: 'no project in the path: answers only for a vessel of a project the caller is a member of (404 otherwise, tests/api/vessels.test.ts)',
    query: (p) => ({ vesselId: p.vesselId, heading: '0', hs: '1.5', tp: '9', dir: '0' }),
  },
  'GET /projects/:projectId/vessels': { access: 'member' },
  'POST /projects/:projectId/vessels': { access: 'coordinator', body: () => ({ name: `Route security vessel ${next()}` }) },
  'GET /projects/:projectId/vessels/:vesselId/raos': { access: 'member' },
  'POST /projects/:projectId/vessels/:vesselId/raos': {
    access: 'coordinator',
    upload: true,
    why: 'the generic upload is a sea-state CSV: refused with 400 naming its columns',
  },

  'GET /projects/:projectId/overview': { access: 'member', why: 'each role sees its own parts (coordinator counts only for coordinators)' },
  'GET /map-style': { access: 'signedIn', why: 'the tile style address and attribution only, no project data' },
  'GET /projects/:projectId/plan': { access: 'member', ...datasetQuery('dataset') },
  'GET /projects/:projectId/plan/chain': {
    access: 'member',
    query: (p) => ({ dataset: p.datasetId, operationId: p.operationId, siteId: p.siteId, time: firstRecordTime }),
    queryIds: { dataset: 'datasetId', operationId: 'operationId', siteId: 'siteId' },
  },
  'GET /projects/:projectId/plan/windows.ics': {
    access: 'member',
    query: (p) => ({ dataset: p.datasetId, operationId: p.operationId, siteId: p.siteId }),
    queryIds: { dataset: 'datasetId', operationId: 'operationId', siteId: 'siteId' },
  },
  'GET /projects/:projectId/conditions/:siteId': { access: 'member', ...datasetQuery('dataset') },
  'GET /projects/:projectId/workability': { access: 'member', ...datasetQuery('dataset') },
  'GET /projects/:projectId/workability.csv': { access: 'member', ...datasetQuery('dataset') },

  'GET /projects/:projectId/campaigns': { access: 'member' },
  'POST /projects/:projectId/campaigns': {
    access: 'coordinator',
    body: (p) => ({ name: `Route security campaign ${next()}`, steps: [{ operationId: p.operationId, siteId: p.siteId }] }),
  },
  'GET /projects/:projectId/campaigns/:campaignId': { access: 'member' },
  'PATCH /projects/:projectId/campaigns/:campaignId': { access: 'coordinator', body: () => ({ timeZone: 'UTC' }) },
  'DELETE /projects/:projectId/campaigns/:campaignId': {
    access: 'coordinator',
    fresh: async () => ({ campaignId: await createCampaign(P1.projectId, P1.operationId, P1.siteId) }),
  },
  'POST /projects/:projectId/campaigns/:campaignId/simulate': {
    access: 'member',
    why: 'a read: it simulates and stores nothing',
    ...datasetQuery('dataset'),
  },
  'PATCH /projects/:projectId/campaigns/:campaignId/steps/:index': {
    access: 'coordinator',
    why: 'marks progress (audited); clients and skippers only read it',
    body: () => ({ status: 'started' }),
    fresh: async () => ({ campaignId: await createCampaign(P1.projectId, P1.operationId, P1.siteId) }),
  },
  'GET /projects/:projectId/campaigns/:campaignId/outlook': {
    access: 'member',
    why: 'a read: clients see when the campaign will finish',
    query: () => ({ alpha: 'true' }),
  },
  'GET /projects/:projectId/campaigns/:campaignId/outlook/history': { access: 'member' },

  'POST /projects/:projectId/ledger/propose': { access: 'coordinator', query: () => ledgerRange },
  'GET /projects/:projectId/ledger': { access: 'member', why: 'clients see confirmed days only', query: () => ledgerRange },
  'GET /projects/:projectId/ledger/monthly': { access: 'member', ...datasetQuery('dataset') },
  'POST /projects/:projectId/ledger/:entryId/confirm': {
    access: 'coordinator',
    body: () => ({}),
    fresh: async () => ({ entryId: await createLedgerEntry(P1.projectId, P1.operationId, P1.siteId) }),
  },
  'POST /projects/:projectId/ledger/confirm-day': {
    access: 'coordinator',
    why: 'confirms every proposal of a fresh day made for the call',
    body: (p) => ({ day: ledgerEntryDays.get(p.entryId) }),
    fresh: async () => ({ entryId: await createLedgerEntry(P1.projectId, P1.operationId, P1.siteId) }),
  },

  'POST /admin/jobs/plan': {
    access: 'admin',
    why: 'planned for the second project only, to keep it short',
    body: () => ({ projectId: P2.projectId }),
  },
  'POST /internal/jobs/plan': {
    access: 'token',
    why: 'how `npm run plan:once` asks the running server to plan: only with the one-time job token header; 404 otherwise',
  },
  'POST /internal/backup': {
    access: 'token',
    why: 'how `npm run db:backup` asks the running server for a copy of the embedded database: only with the job token header; 404 otherwise',
  },
  'POST /projects/:projectId/replan': { access: 'coordinator' },
  'GET /projects/:projectId/alerts': { access: 'member' },
  'GET /projects/:projectId/outbox': { access: 'coordinator' },
  'GET /projects/:projectId/subscription': { access: 'member', why: 'the caller’s own subscription' },
  'PUT /projects/:projectId/subscription': { access: 'member', why: 'the caller’s own subscription', body: () => subscriptionBody },
  'GET /unsubscribe': {
    access: 'public',
    status: 200,
    why: 'the link in an alert e-mail, opened without signing in: a confirmation page only (RFC 8058); the HMAC signature over user, project and expiry is the key (forged or expired: 400)',
    query: (p) => unsubscribeQuery(p),
  },
  'POST /unsubscribe': {
    access: 'public',
    status: 200,
    why: 'RFC 8058 one-click unsubscribe, sent by mail programs and by the confirmation page without a session; the same signed, expiring link is the key',
    query: (p) => unsubscribeQuery(p),
  },
  'GET /dev/mailbox': { access: 'admin', why: 'exists only while the local mailbox is in use (it is in tests)' },
  'GET /me/calendar': { access: 'signedIn', why: 'the caller’s own feed address' },
  'POST /me/calendar': { access: 'signedIn', why: 'the caller’s own feed address' },
  'DELETE /me/calendar': { access: 'signedIn', why: 'the caller’s own feed address' },
  'GET /calendar/:file': {
    access: 'public',
    status: 200,
    why: 'calendar apps subscribe without a session; the secret token in the address is the key (unknown or malformed: 404)',
    fresh: async () => ({ file: `${await calendarFile()}` }),
  },
};

const keyOf = (r: ApiRoute) => `${r.method} ${r.path}`;
const methodOf = (key: string) => key.split(' ')[0];
const pathOf = (key: string) => key.split(' ')[1];
const paramsIn = (path: string) => [...path.matchAll(/:([A-Za-z]+)/g)].map((m) => m[1] as ParamName);
const isProjectScoped = (key: string) =>
  paramsIn(pathOf(key)).includes('projectId') && ['member', 'coordinator'].includes(TABLE[key].access);

function fill(path: string, params: Params): string {
  return path.replace(/:([A-Za-z]+)/g, (_, name: string) => {
    if (!(name in params)) throw new Error(`No value for path parameter :${name}: add it to Params`);
    return encodeURIComponent(params[name as ParamName]);
  });
}

interface CallOptions {
  params: Params;
  /** `valid`: the entry's body (or upload); `empty`: `{}` (what refused callers send). */
  body: 'valid' | 'empty';
  query?: Record<string, string>;
  headers?: Record<string, string>;
}

async function call(who: Who, key: string, options: CallOptions): Promise<request.Response> {
  const rc = TABLE[key];
  const method = methodOf(key);
  const query = new URLSearchParams(options.query ?? rc.query?.(options.params) ?? {}).toString();
  const url = `/api${fill(pathOf(key), options.params)}${query ? `?${query}` : ''}`;
  const agent = agentOf(who);
  const req =
    method === 'GET'
      ? agent.get(url)
      : method === 'POST'
        ? agent.post(url)
        : method === 'PUT'
          ? agent.put(url)
          : method === 'PATCH'
            ? agent.patch(url)
            : method === 'DELETE'
              ? agent.delete(url)
              : null;
  if (!req) throw new Error(`No request builder for ${method}`);
  for (const [name, value] of Object.entries(options.headers ?? {})) req.set(name, value);
  if (method === 'GET' || method === 'DELETE') return req;
  if (options.body === 'valid' && rc.upload) {
    return req
      .field('name', `Route security upload ${next()}`)
      .field('kind', 'observation')
      .field('dataPointDepth', 'deep')
      .attach('file', Buffer.from(CSV), 'records.csv');
  }
  return req.send(options.body === 'valid' && rc.body ? (rc.body(options.params) as object) : {});
}

async function prepared(key: string, base: Params = P1): Promise<Params> {
  const fresh = TABLE[key].fresh;
  return fresh ? { ...base, ...(await fresh()) } : base;
}

const show = (who: string, key: string, res: request.Response, extra = '') =>
  `${who} ${key}${extra}: ${res.status} ${res.text.slice(0, 300)}`;

/** Passed the guard: not refused, not "not found", no server error (a 400 or 409 is fine). */
function expectAllowed(who: string, key: string, res: request.Response, extra = '') {
  expect.soft([401, 403, 404].includes(res.status) || res.status >= 500, show(who, key, res, extra)).toBe(false);
}

/** What the four demo users get in the first demo project, where all of them are members. */
function expectedFor(access: Access, role: Role): 'allowed' | 403 | 404 {
  switch (access) {
    case 'token':
      return 404;
    case 'admin':
      return role === 'admin' ? 'allowed' : 403;
    case 'coordinator':
      return role === 'admin' || role === 'coordinator' ? 'allowed' : 403;
    default:
      return 'allowed';
  }
}

beforeAll(async () => {
  t = await createTestApp();
  as = await signInAll(t.app);
  anonymous = request.agent(t.app);
  routes = listApiRoutes(t.deps);

  const scratchUser = await as.admin
    .post('/api/admin/users')
    .send({ name: 'Route security scratch', email: 'route-security-scratch@example.com' });
  if (scratchUser.status !== 201) throw new Error(`user failed: ${scratchUser.status} ${scratchUser.text}`);

  const projects = [t.demo.projectId, t.demo.secondProjectId];
  const [p1, p2] = await Promise.all(
    projects.map(async (projectId): Promise<Params> => {
      const siteId = await createSite(projectId);
      const operationId = await createOperation(projectId, siteId);
      const [datasetId, campaignId, entryId, vesselId] = await Promise.all([
        uploadDataset(projectId),
        createCampaign(projectId, operationId, siteId),
        createLedgerEntry(projectId, operationId, siteId),
        createVessel(projectId),
      ]);
      return {
        projectId,
        siteId,
        operationId,
        datasetId,
        campaignId,
        entryId,
        vesselId,
        userId: scratchUser.body.user.id,
        file: 'unused',
        index: '0',
      };
    }),
  );
  P1 = p1;
  P2 = p2;
  P1.file = await calendarFile();
  P2.file = P1.file;
  firstRecordTime = new Date(START_MS).toISOString();

  const project = await as.coordinator.get(`/api/projects/${P1.projectId}`);
  const { name, description, dataPointName, dataPointLatitude, dataPointLongitude, dataPointDepthM, forecastSource } = project.body;
  settingsBody = { name, description, dataPointName, dataPointLatitude, dataPointLongitude, dataPointDepthM, forecastSource };
  alphaTable = (await as.coordinator.get(`/api/projects/${P1.projectId}/alpha`)).body.table;
  setupDocument = (await as.coordinator.get(`/api/projects/${P1.projectId}/export`)).body;
});

afterAll(async () => {
  await t?.close();
});

describe('the route table', () => {
  it('has exactly one entry per route of the API routers', () => {
    const listed = routes.map(keyOf);
    expect(new Set(listed).size, 'a method and path declared twice').toBe(listed.length);
    expect(
      listed.filter((k) => !(k in TABLE)),
      'routes without a table entry',
    ).toEqual([]);
    expect(
      Object.keys(TABLE).filter((k) => !listed.includes(k)),
      'table entries without a route',
    ).toEqual([]);
    expect(listed.length).toBeGreaterThanOrEqual(70);
  });

  it('documents why each public route is public', () => {
    for (const [key, rc] of Object.entries(TABLE)) {
      if (rc.access === 'public' || rc.access === 'token') expect(rc.why, key).toBeTruthy();
      if (rc.access === 'public') expect(rc.status, key).toBeTypeOf('number');
    }
  });
});

describe.each(Object.keys(TABLE))('%s', (key) => {
  const rc = TABLE[key];

  it(`anonymous callers and each demo role get what the ${rc.access} rule says`, async () => {
    // Anonymous.
    const anonParams = await prepared(key);
    const anon = await call('anonymous', key, { params: anonParams, body: rc.access === 'public' ? 'valid' : 'empty' });
    if (rc.access === 'public') expect.soft(anon.status, show('anonymous', key, anon)).toBe(rc.status);
    else if (rc.access === 'token') expect.soft(anon.status, show('anonymous', key, anon)).toBe(404);
    else expect.soft(anon.status, show('anonymous', key, anon)).toBe(401);

    // Each role, in the first demo project. Plain reads run side by side; anything that changes
    // state, or needs throw-away entities, runs one call at a time.
    const check = async (role: Role) => {
      const expected = expectedFor(rc.access, role);
      const params = await prepared(key);
      const res = await call(role, key, { params, body: expected === 'allowed' ? 'valid' : 'empty' });
      if (rc.access === 'public') expect.soft(res.status, show(role, key, res)).toBe(rc.status);
      else if (expected === 'allowed') expectAllowed(role, key, res);
      else expect.soft(res.status, show(role, key, res)).toBe(expected);
    };
    if (methodOf(key) === 'GET' && !rc.fresh) await Promise.all(ROLES.map(check));
    else for (const role of ROLES) await check(role);
  });

  const pathParams = paramsIn(pathOf(key));
  if (pathParams.length > 0) {
    it.each(pathParams)('answers 404, never 500, for an unknown or malformed :%s', async (param) => {
      const who: Who = rc.access === 'admin' ? 'admin' : rc.access === 'public' || rc.access === 'token' ? 'anonymous' : 'coordinator';
      const answers = await Promise.all(BAD_IDS.map((bad) => call(who, key, { params: { ...P1, [param]: bad }, body: 'valid' })));
      answers.forEach((res, i) => expect.soft(res.status, show(who, key, res, ` with :${param}=${BAD_IDS[i]}`)).toBe(404));
    });
  }

  if (isProjectScoped(key)) {
    it('answers 404 to a user who is not a member of the project (the client in the second project)', async () => {
      const res = await call('client', key, { params: P2, body: 'valid' });
      expect.soft(res.status, show('client', key, res, ' in the second project')).toBe(404);
    });

    if (rc.access === 'coordinator') {
      it('answers 403 to a client of the project (the skipper is a client in the second project)', async () => {
        const res = await call('skipper', key, { params: P2, body: 'empty' });
        expect.soft(res.status, show('skipper', key, res, ' in the second project')).toBe(403);
      });
    }

    // A step :index is a position inside the campaign in the path, not an id another project could own.
    const childParams = pathParams.filter((p) => p !== 'projectId' && p !== 'index');
    if (childParams.length > 0) {
      it.each(childParams)('answers 404 for a :%s of another project, even to a member of both', async (param) => {
        // The coordinator is a member of both projects: the child id must still belong to the project in the path.
        const res = await call('coordinator', key, { params: { ...P1, [param]: P2[param] }, body: 'valid' });
        expect.soft(res.status, show('coordinator', key, res, ` with the second project's :${param}`)).toBe(404);
      });
    }
  }

  const queryIds = Object.entries(rc.queryIds ?? {}) as [string, ParamName][];
  if (queryIds.length > 0) {
    it.each(queryIds)('answers 404 for a ?%s of another project or unknown, and never 500 for a malformed one', async (name, param) => {
      const base = rc.query!(P1);
      for (const value of [P2[param], RANDOM_ID]) {
        const res = await call('coordinator', key, { params: P1, body: 'valid', query: { ...base, [name]: value } });
        expect.soft(res.status, show('coordinator', key, res, ` with ?${name}=${value}`)).toBe(404);
      }
      for (const value of BAD_IDS.slice(1)) {
        const res = await call('coordinator', key, { params: P1, body: 'valid', query: { ...base, [name]: value } });
        expect.soft([400, 404], show('coordinator', key, res, ` with ?${name}=${value}`)).toContain(res.status);
      }
    });
  }
});

describe("the auth library's routes", () => {
  /** Every HTTP route of the auth library and its plugins, as `METHOD /path` (server-only endpoints have no path). */
  function authLibraryRoutes(): string[] {
    const out: string[] = [];
    for (const endpoint of Object.values(t.deps.auth.api) as { path?: string; options?: { method?: string | string[] } }[]) {
      if (!endpoint.path) continue;
      const methods = endpoint.options?.method;
      for (const m of Array.isArray(methods) ? methods : [methods ?? 'GET']) out.push(`${m === '*' ? 'POST' : m} ${endpoint.path}`);
    }
    return [...new Set(out)].sort();
  }

  it('lists the routes in use among the library’s own, and many more that are not', () => {
    const all = authLibraryRoutes();
    for (const used of AUTH_ROUTES_IN_USE) expect(all, used).toContain(used);
    // From the library's documentation (better-auth core and admin plugin), from memory: update-user,
    // the admin plugin's impersonation and role routes, and session listing are among them.
    for (const notUsed of [
      'POST /update-user',
      'POST /admin/impersonate-user',
      'POST /admin/set-role',
      'POST /admin/create-user',
      'GET /list-sessions',
      'GET /get-session',
    ]) {
      expect(all, notUsed).toContain(notUsed);
    }
    expect(all.length).toBeGreaterThan(30);
  });

  it('answers 404 on every route the UI does not use, to anonymous callers and to an administrator, and changes nothing', async () => {
    const before = await t.database.db.select().from(userTable).orderBy(asc(userTable.id));
    const unused = authLibraryRoutes().filter((r) => !AUTH_ROUTES_IN_USE.includes(r));
    expect(unused.length).toBeGreaterThan(30);
    for (const route of unused) {
      const [method, pattern] = route.split(' ');
      const url = `/api/auth${pattern.replace(/:[A-Za-z]+/g, 'x')}`;
      // A body that would do harm if the route ran: a new name, a role, an impersonation.
      const body = {
        name: 'Demo Administrator',
        role: 'root',
        userId: P1.userId,
        email: 'x@example.com',
        password: 'x'.repeat(16),
        newPassword: 'y'.repeat(16),
      };
      for (const who of ['anonymous', 'admin'] as const) {
        const agent = agentOf(who);
        const res = method === 'GET' ? await agent.get(url) : await agent.post(url).set('Origin', 'http://localhost:3000').send(body);
        expect.soft(res.status, show(who, route, res)).toBe(404);
        expect.soft(res.body?.error?.code, show(who, route, res)).toBe('not_found');
      }
    }
    expect(await t.database.db.select().from(userTable).orderBy(asc(userTable.id))).toEqual(before);
  });
});

describe('ids of another project inside a request body', () => {
  it('are refused with 400 or 404, and nothing is stored', async () => {
    const base = `/api/projects/${P1.projectId}`;
    const foreignStep = [{ operationId: P2.operationId, siteId: P2.siteId }];
    const attempts: [string, () => Promise<request.Response>][] = [
      ['new operation at a foreign worksite', () => as.coordinator.post(`${base}/operations`).send(operationBody(P2.siteId))],
      [
        'operation moved to a foreign worksite',
        () => as.coordinator.patch(`${base}/operations/${P1.operationId}`).send({ siteIds: [P2.siteId] }),
      ],
      [
        'new campaign of foreign steps',
        () => as.coordinator.post(`${base}/campaigns`).send({ name: `Route security foreign ${next()}`, steps: foreignStep }),
      ],
      ['campaign given foreign steps', () => as.coordinator.patch(`${base}/campaigns/${P1.campaignId}`).send({ steps: foreignStep })],
      [
        'new worksite on a foreign hindcast',
        () =>
          as.coordinator
            .post(`${base}/sites`)
            .send({ name: `Route security foreign ${next()}`, depth: 9, timeZone: 'UTC', hindcastDatasetId: P2.datasetId }),
      ],
      [
        'worksite given a foreign hindcast',
        () => as.coordinator.patch(`${base}/sites/${P1.siteId}`).send({ hindcastDatasetId: P2.datasetId }),
      ],
      [
        'subscription to a foreign operation',
        () => as.coordinator.put(`${base}/subscription`).send({ ...subscriptionBody, operationIds: [P2.operationId] }),
      ],
      [
        'subscription to a foreign worksite',
        () => as.coordinator.put(`${base}/subscription`).send({ ...subscriptionBody, siteIds: [P2.siteId] }),
      ],
    ];
    for (const [what, attempt] of attempts) {
      const res = await attempt();
      expect.soft([400, 404], `${what}: ${res.status} ${res.text.slice(0, 300)}`).toContain(res.status);
    }
    const operation = await as.coordinator.get(`${base}/operations/${P1.operationId}`);
    expect(operation.body.siteIds).toEqual([P1.siteId]);
    const campaign = await as.coordinator.get(`${base}/campaigns/${P1.campaignId}`);
    expect(campaign.body.steps).toEqual([{ operationId: P1.operationId, siteId: P1.siteId }]);
    const site = await as.coordinator.get(`${base}/sites/${P1.siteId}`);
    expect(site.body.hindcastDatasetId).toBeNull();
    const subscription = await as.coordinator.get(`${base}/subscription`);
    expect(subscription.body.operationIds).not.toContain(P2.operationId);
    expect(subscription.body.siteIds).not.toContain(P2.siteId);
  });

  it('plans nothing for an unknown project id given to the planning job (its report says skipped)', async () => {
    const res = await as.admin.post('/api/admin/jobs/plan').send({ projectId: RANDOM_ID });
    expect(res.status, res.text).toBe(200);
    expect(res.body.projects).toEqual([{ projectId: RANDOM_ID, status: 'skipped', reason: 'project not found' }]);
    const malformed = await as.admin.post('/api/admin/jobs/plan').send({ projectId: 'not-an-id' });
    expect(malformed.status).toBe(400);
  });
});

describe('public and token routes beyond the table', () => {
  it('refuses a forged unsubscribe link with 400 and unsubscribes nobody', async () => {
    const good = unsubscribeQuery(P1);
    for (const method of ['get', 'post'] as const) {
      const res = await anonymous[method]('/api/unsubscribe').query({ ...good, sig: 'forged' });
      expect(res.status).toBe(400);
      const missing = await anonymous[method]('/api/unsubscribe');
      expect(missing.status).toBe(400);
      // The expiry is signed too: a later one with the same signature is refused.
      const extended = await anonymous[method]('/api/unsubscribe').query({ ...good, e: String(Number(good.e) + 86_400) });
      expect(extended.status).toBe(400);
    }
  });

  it('answers 404 to a wrong job token on every token route, and runs the planning job for the right one', async () => {
    const config = t.deps.config;
    const before = config.jobToken;
    config.jobToken = 'route-security-job-token-0123456789';
    try {
      const tokenRoutes = Object.keys(TABLE).filter((key) => TABLE[key].access === 'token');
      expect(tokenRoutes.length).toBeGreaterThan(0);
      for (const key of tokenRoutes) {
        for (const token of ['route-security-job-token-012345678X', 'short']) {
          for (const who of ['anonymous', 'admin'] as const) {
            const res = await call(who, key, { params: P1, body: 'empty', headers: { 'x-lullwatch-job-token': token } });
            expect.soft(res.status, show(who, key, res, ` with token ${token}`)).toBe(404);
          }
        }
      }
      const right = await anonymous
        .post('/api/internal/jobs/plan')
        .set('x-lullwatch-job-token', config.jobToken)
        .send({ projectId: P2.projectId });
      expect(right.status, right.text).toBe(200);
    } finally {
      config.jobToken = before;
    }
  });

  it('stops serving a calendar feed once its owner revokes it', async () => {
    const file = await calendarFile();
    expect((await anonymous.get(`/api/calendar/${file}`)).status).toBe(200);
    expect((await as.skipper.delete('/api/me/calendar')).status).toBe(204);
    expect((await anonymous.get(`/api/calendar/${file}`)).status).toBe(404);
  });
});

describe('the audit trail', () => {
  it('has no route that changes or deletes an entry', () => {
    const auditRoutes = routes.filter((r) => r.path.includes('/audit'));
    expect(auditRoutes.length).toBeGreaterThan(0);
    for (const r of auditRoutes) expect(r.method, keyOf(r)).toBe('GET');
  });

  it('answers 404 to PUT, PATCH, POST and DELETE on audit paths and leaves the entries unchanged', async () => {
    const rows = () => t.database.db.select().from(auditEntry).where(eq(auditEntry.projectId, P1.projectId)).orderBy(asc(auditEntry.id));
    const before = await rows();
    expect(before.length).toBeGreaterThan(0);
    const entryId = before[0].id;
    const paths = [
      `/api/projects/${P1.projectId}/audit`,
      `/api/projects/${P1.projectId}/audit/${entryId}`,
      `/api/projects/${P1.projectId}/audit?entity=operation`,
    ];
    for (const who of ['admin', 'coordinator'] as const) {
      for (const path of paths) {
        for (const res of [
          await as[who].put(path).send({ action: 'delete', after: null }),
          await as[who].patch(path).send({ userName: 'someone else' }),
          await as[who].post(path).send({ action: 'delete' }),
          await as[who].delete(path),
        ]) {
          expect.soft(res.status, show(who, path, res)).toBe(404);
          expect.soft(res.body.error?.code, show(who, path, res)).toBe('not_found');
        }
      }
    }
    expect(await rows()).toEqual(before);
  });
});
