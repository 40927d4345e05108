// Hostile input through the real app (supertest on PGlite, signed-in demo users, no mocks):
// SQL meta-characters, markup and unusual Unicode in every free-text field; bodies and uploads
// over the limits; binary and malformed uploads, path tricks in file names, files that expand to
// huge lines or millions of columns. Every refusal stores nothing and leaves the server answering.
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import ICAL from 'ical.js';
import Papa from 'papaparse';
import request from 'supertest';
import { count, eq, isNull, like } from 'drizzle-orm';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { queueDigests } from '../../server/services/digests';
import { dataset, datasetChunk, outbox, worksite } from '../../server/db/schema';
import { safeFileName } from '../../server/services/dataset-import';
import { csvField } from '../../shared/csv-field';
import { MAX_COLUMNS, MAX_LINE_CHARS, binaryMark } from '../../shared/seadata';
import { toCsv } from '../../src/lib/csv';
import { type Agent, planAndReadMail, subscribeSkipperToDigest, useSignedInApp } from '../support/app';

// The fake forecast service issues every 6 h; this is just after the 06:00 issue.
const NOW = new Date('2026-12-01T06:20:00Z');

const ctx = useSignedInApp({ clock: () => NOW });

/**
 * Strings that break naive code: SQL injection (OWASP SQL Injection Prevention Cheat Sheet),
 * HTML and attribute injection (OWASP XSS Prevention Cheat Sheet), spreadsheet formulas, the
 * RFC 5545 text specials (';', ',', '\'), a right-to-left override and Hebrew, zero-width
 * characters, emoji with joiners and a variation selector, template and format syntax. All one
 * line, no leading or trailing blanks (names are trimmed), each under 120 characters.
 */
const HOSTILE = [
  "Robert'); DROP TABLE worksite;--",
  '<script>alert(1)</script>',
  '" onmouseover="x',
  "' OR '1'='1' --",
  '\u202Eevil\u202C.txt \u05E9\u05DC\u05D5\u05DD',
  'zero\u200Bwidth\u200Cnon\u200Djoiner\u2060word\uFEFFbom',
  'emoji 🌊⚓🚢 👩‍👩‍👧 🏳️‍🌈',
  '=HYPERLINK("http://x.invalid","y")',
  'a\\b;c,d "q" </p><img src=x onerror=alert(1)>',
  '$1 $$ %s %n ${x} {{x}} `x` \\u0000',
];
/** Multi-line free text (descriptions, notes): every hostile string, with line breaks and tabs inside. */
const MULTILINE = HOSTILE.join('\n\t');

const UPLOAD_DIR = path.join(os.tmpdir(), 'lullwatch-uploads');
const CALM_CSV = (start: number, hours: number) =>
  ['time,hs,tp,dir,wind', ...Array.from({ length: hours }, (_, i) => `${new Date(start + i * 3_600_000).toISOString()},0.5,6,250,3`)].join(
    '\n',
  ) + '\n';
const SMALL_CSV = CALM_CSV(Date.UTC(2026, 0, 1), 3);

async function tableNames(): Promise<string[]> {
  const res = (await ctx.t.deps.db.execute(
    "select tablename from pg_tables where schemaname = 'public' order by tablename",
  )) as unknown as {
    rows: { tablename: string }[];
  };
  return res.rows.map((r) => r.tablename);
}

/** Dataset rows, chunk rows and chunk rows without their dataset. */
async function storeCounts() {
  const db = ctx.t.deps.db;
  const [datasets] = await db.select({ n: count() }).from(dataset);
  const [chunks] = await db.select({ n: count() }).from(datasetChunk);
  const [orphans] = await db
    .select({ n: count() })
    .from(datasetChunk)
    .leftJoin(dataset, eq(dataset.id, datasetChunk.datasetId))
    .where(isNull(dataset.id));
  return { datasets: datasets.n, chunks: chunks.n, orphans: orphans.n };
}

/**
 * The answer is JSON that browsers must not sniff as HTML (helmet's X-Content-Type-Options), and
 * `pick` finds a string in the parsed text itself.
 */
function jsonString(res: request.Response, pick: (body: never) => unknown): string {
  expect(res.type).toBe('application/json');
  expect(res.headers['x-content-type-options']).toBe('nosniff');
  const value = pick(JSON.parse(res.text) as never);
  expect(typeof value).toBe('string');
  return value as string;
}

interface Part {
  name: string;
  value?: string | Buffer;
  /** Sent as is in the part header (UTF-8), as browsers do: no basename, no escaping. */
  filename?: string;
  /** Sent percent-encoded as `filename*=UTF-8''...` (RFC 5987 / RFC 7578), which can carry control characters. */
  encodedFilename?: boolean;
}

/** A multipart/form-data body written by hand, so that file names reach the server untouched. */
function multipart(parts: Part[]): { body: Buffer; type: string } {
  const boundary = `----hostile${crypto.randomBytes(8).toString('hex')}`;
  const out: Buffer[] = [];
  for (const p of parts) {
    const name = p.encodedFilename ? `filename*=UTF-8''${encodeURIComponent(p.filename ?? '')}` : `filename="${p.filename}"`;
    const file = p.filename !== undefined ? `; ${name}\r\nContent-Type: application/octet-stream` : '';
    out.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${p.name}"${file}\r\n\r\n`, 'utf8'));
    out.push(Buffer.isBuffer(p.value) ? p.value : Buffer.from(p.value ?? '', 'utf8'));
    out.push(Buffer.from('\r\n'));
  }
  out.push(Buffer.from(`--${boundary}--\r\n`));
  return { body: Buffer.concat(out), type: `multipart/form-data; boundary=${boundary}` };
}

function upload(
  agent: Agent,
  projectId: string,
  file: string | Buffer,
  fileName = 'upload.csv',
  fields: Record<string, string> = {},
  encodedFilename = false,
) {
  const form = { name: 'Hostile upload', kind: 'hindcast', dataPointDepth: 'deep', ...fields };
  const parts = [
    ...Object.entries(form).map(([name, value]) => ({ name, value })),
    { name: 'file', value: file, filename: fileName, encodedFilename },
  ];
  const { body, type } = multipart(parts);
  return agent.post(`/api/projects/${projectId}/datasets`).set('content-type', type).send(body);
}

/** The answer with its body as text (supertest buffers only some types, not text/calendar). */
function asText(req: request.Test) {
  return req.buffer(true).parse((r, cb) => {
    let s = '';
    r.setEncoding('utf8');
    r.on('data', (c: string) => (s += c));
    r.on('end', () => cb(null, s));
  });
}

async function health(): Promise<void> {
  const res = await request(ctx.t.app).get('/api/health');
  expect(res.status).toBe(200);
}

/** Runs `refused` and checks: the given status, the JSON error shape, nothing stored, the server answering. */
async function expectRefusedStoringNothing(refused: () => Promise<request.Response>, status: number) {
  const before = await storeCounts();
  const listBefore = (await ctx.as.coordinator.get(`/api/projects/${ctx.t.demo.projectId}/datasets`)).body;
  const res = await refused();
  expect(res.status, res.text.slice(0, 500)).toBe(status);
  expect(res.type).toBe('application/json');
  expect(Object.keys(res.body.error).sort()).toEqual(['code', 'details', 'message']);
  expect(typeof res.body.error.code).toBe('string');
  expect(typeof res.body.error.message).toBe('string');
  expect(await storeCounts()).toEqual({ ...before, orphans: 0 });
  expect((await ctx.as.coordinator.get(`/api/projects/${ctx.t.demo.projectId}/datasets`)).body).toEqual(listBefore);
  await health();
  return res;
}

describe('free text with SQL, markup and unusual Unicode is stored as text', () => {
  let projectId: string;
  const siteIds: string[] = [];
  const operationIds: string[] = [];

  it('keeps every string byte for byte in projects, worksites, operations, campaigns, datasets and users', async () => {
    const tablesBefore = await tableNames();
    expect(tablesBefore).toContain('worksite');

    for (const s of HOSTILE) {
      const created = await ctx.as.coordinator.post('/api/projects').send({ name: s, description: MULTILINE });
      expect(created.status, created.text).toBe(201);
      projectId ??= created.body.id;
      const read = await ctx.as.coordinator.get(`/api/projects/${created.body.id}`);
      expect(jsonString(read, (b: { name: string }) => b.name)).toBe(s);
      expect(read.body.description).toBe(MULTILINE);
    }

    const settings = {
      name: HOSTILE[1],
      description: MULTILINE,
      dataPointName: HOSTILE[0],
      dataPointLatitude: null,
      dataPointLongitude: null,
      dataPointDepthM: null,
      forecastSource: 'uploads',
    };
    const put = await ctx.as.coordinator.put(`/api/projects/${projectId}/settings`).send(settings);
    expect(put.status, put.text).toBe(200);
    expect(put.body).toMatchObject({ name: HOSTILE[1], description: MULTILINE, dataPointName: HOSTILE[0] });

    for (const s of HOSTILE) {
      const site = await ctx.as.coordinator.post(`/api/projects/${projectId}/sites`).send({ name: s, depth: 12, timeZone: 'UTC' });
      expect(site.status, site.text).toBe(201);
      siteIds.push(site.body.id);
      const read = await ctx.as.coordinator.get(`/api/projects/${projectId}/sites/${site.body.id}`);
      expect(jsonString(read, (b: { name: string }) => b.name)).toBe(s);
      // And in the table itself (read with a bound parameter, never spliced into SQL).
      const [row] = await ctx.t.deps.db.select({ name: worksite.name }).from(worksite).where(eq(worksite.id, site.body.id));
      expect(Buffer.from(row.name, 'utf8').equals(Buffer.from(s, 'utf8'))).toBe(true);
    }

    for (const [i, s] of HOSTILE.entries()) {
      const op = await ctx.as.coordinator.post(`/api/projects/${projectId}/operations`).send({
        name: s,
        description: MULTILINE,
        tpop: 6,
        tc: 0,
        weatherRestricted: false,
        limits: { hsMax: 2 },
        siteIds: [siteIds[i]],
      });
      expect(op.status, op.text).toBe(201);
      operationIds.push(op.body.id);
      const read = await ctx.as.coordinator.get(`/api/projects/${projectId}/operations/${op.body.id}`);
      expect(jsonString(read, (b: { name: string }) => b.name)).toBe(s);
      expect(read.body.description).toBe(MULTILINE);

      const campaign = await ctx.as.coordinator
        .post(`/api/projects/${projectId}/campaigns`)
        .send({ name: s, steps: [{ operationId: op.body.id, siteId: siteIds[i] }] });
      expect(campaign.status, campaign.text).toBe(201);
      const readCampaign = await ctx.as.coordinator.get(`/api/projects/${projectId}/campaigns/${campaign.body.id}`);
      expect(jsonString(readCampaign, (b: { name: string }) => b.name)).toBe(s);

      const data = await upload(ctx.as.coordinator, projectId, SMALL_CSV, 'small.csv', { name: s });
      expect(data.status, data.text).toBe(201);
      const readData = await ctx.as.coordinator.get(`/api/projects/${projectId}/datasets/${data.body.id}`);
      expect(jsonString(readData, (b: { name: string }) => b.name)).toBe(s);
      // The download's file name is built from the dataset name: only safe characters reach the header.
      const csv = await ctx.as.coordinator.get(`/api/projects/${projectId}/datasets/${data.body.id}/csv`);
      expect(csv.headers['content-disposition']).toMatch(/^attachment; filename="[A-Za-z0-9._-]+\.csv"$/);

      const email = `hostile-${i}@example.com`;
      const created = await ctx.as.admin.post('/api/admin/users').send({ name: s, email });
      expect(created.status, created.text).toBe(201);
      const users = await ctx.as.admin.get('/api/admin/users');
      expect(jsonString(users, (b: { email: string; name: string }[]) => b.find((u) => u.email === email)?.name)).toBe(s);
    }

    // The audit trail keeps the names too (text and jsonb columns).
    const audit = await ctx.as.coordinator.get(`/api/projects/${projectId}/audit?limit=200`);
    expect(audit.status, audit.text).toBe(200);
    const names = (audit.body as { entityName: string }[]).map((e) => e.entityName);
    for (const s of HOSTILE) expect(names).toContain(s);

    // No statement ran: every table is still there, and the worksites are all stored.
    expect(await tableNames()).toEqual(tablesBefore);
    const list = await ctx.as.coordinator.get(`/api/projects/${projectId}/sites`);
    expect((list.body as { name: string }[]).map((s) => s.name)).toEqual(expect.arrayContaining(HOSTILE));
  });

  it('carries them through a setup export and import into another project unchanged', async () => {
    const doc = (await ctx.as.coordinator.get(`/api/projects/${projectId}/export`)).body;
    const target = await ctx.as.coordinator.post('/api/projects').send({ name: 'Setup import target' });
    const imported = await ctx.as.coordinator.post(`/api/projects/${target.body.id}/import?mode=merge`).send(doc);
    expect(imported.status, imported.text).toBe(200);
    const again = (await ctx.as.coordinator.get(`/api/projects/${target.body.id}/export`)).body;
    const names = (d: {
      worksites: { name: string }[];
      operations: { name: string; description: string }[];
      campaigns: { name: string }[];
    }) => ({
      worksites: d.worksites.map((w) => w.name).sort(),
      operations: d.operations.map((o) => [o.name, o.description]).sort(),
      campaigns: d.campaigns.map((c) => c.name).sort(),
    });
    expect(names(again)).toEqual(names(doc));
    expect(names(again).worksites).toEqual([...HOSTILE].sort());
  });

  it('keeps a ledger note byte for byte', async () => {
    const obs = await upload(ctx.as.coordinator, projectId, CALM_CSV(Date.UTC(2026, 10, 29), 72), 'obs.csv', {
      kind: 'observation',
      name: 'Calm observation',
    });
    expect(obs.status, obs.text).toBe(201);
    const proposed = await ctx.as.coordinator.post(`/api/projects/${projectId}/ledger/propose?from=2026-11-30&to=2026-11-30`);
    expect(proposed.status, proposed.text).toBe(200);
    const days = (await ctx.as.coordinator.get(`/api/projects/${projectId}/ledger?from=2026-11-30&to=2026-11-30`)).body as { id: string }[];
    expect(days.length).toBeGreaterThan(0);
    const confirmed = await ctx.as.coordinator.post(`/api/projects/${projectId}/ledger/${days[0].id}/confirm`).send({ note: MULTILINE });
    expect(confirmed.status, confirmed.text).toBe(200);
    expect(jsonString(confirmed, (b: { note: string }) => b.note)).toBe(MULTILINE);
    const listed = await ctx.as.coordinator.get(`/api/projects/${projectId}/ledger?from=2026-11-30&to=2026-11-30`);
    expect((listed.body as { id: string; note: string }[]).find((d) => d.id === days[0].id)?.note).toBe(MULTILINE);
  });

  it('refuses NUL, other control characters and lone surrogates with a 400 naming the field, never a 500', async () => {
    const A = projectId;
    const site = siteIds[0];
    const cases: [string, () => Promise<request.Response>, string][] = [
      ['project name', () => ctx.as.coordinator.post('/api/projects').send({ name: 'a\u0000b' }), 'name'],
      ['project description', () => ctx.as.coordinator.post('/api/projects').send({ name: 'ok', description: 'x\u0000y' }), 'description'],
      ['project name, lone surrogate', () => ctx.as.coordinator.post('/api/projects').send({ name: 'lone \ud800 half' }), 'name'],
      [
        'data point name',
        () =>
          ctx.as.coordinator.put(`/api/projects/${A}/settings`).send({
            name: 'ok',
            description: '',
            dataPointName: 'bell\u0007',
            dataPointLatitude: null,
            dataPointLongitude: null,
            dataPointDepthM: null,
            forecastSource: 'uploads',
          }),
        'dataPointName',
      ],
      [
        'worksite name',
        () => ctx.as.coordinator.post(`/api/projects/${A}/sites`).send({ name: 'nul\u0000', depth: 10, timeZone: 'UTC' }),
        'name',
      ],
      ['worksite rename', () => ctx.as.coordinator.patch(`/api/projects/${A}/sites/${site}`).send({ name: '\udc00' }), 'name'],
      [
        'operation description',
        () =>
          ctx.as.coordinator
            .post(`/api/projects/${A}/operations`)
            .send({ name: 'ok op', description: 'esc \u001b[31m', tpop: 6, tc: 0, weatherRestricted: false, limits: { hsMax: 2 } }),
        'description',
      ],
      [
        'campaign name',
        () =>
          ctx.as.coordinator
            .post(`/api/projects/${A}/campaigns`)
            .send({ name: 'c\u0000', steps: [{ operationId: operationIds[0], siteId: site }] }),
        'name',
      ],
      ['user name', () => ctx.as.admin.post('/api/admin/users').send({ name: 'u\u0000', email: 'nul@example.com' }), 'name'],
      [
        'subscription time zone',
        () =>
          ctx.as.skipper.put(`/api/projects/${ctx.t.demo.projectId}/subscription`).send({
            operationIds: [],
            siteIds: [],
            immediate: true,
            digest: true,
            digestTime: '06:00',
            digestTimeZone: "Europe/Oslo'); DROP TABLE subscription;--",
            active: true,
          }),
        'digestTimeZone',
      ],
      [
        'subscription digest time',
        () =>
          ctx.as.skipper.put(`/api/projects/${ctx.t.demo.projectId}/subscription`).send({
            operationIds: ["'; DROP TABLE operation;--"],
            siteIds: [],
            immediate: true,
            digest: true,
            digestTime: '<script>',
            digestTimeZone: 'UTC',
            active: true,
          }),
        'digestTime',
      ],
      [
        'recurrence rule',
        () =>
          ctx.as.coordinator
            .put(`/api/projects/${A}/operations/${operationIds[0]}/recurrence`)
            .send({ start: '2027-01-01T06:00', timeZone: 'UTC', rule: 'FREQ=DAILY;X=1\nDTSTART:x' }),
        'rule',
      ],
    ];
    const doc = (await ctx.as.coordinator.get(`/api/projects/${A}/export`)).body;
    // A merge import of the exported setup with only its first campaign, one field of it replaced.
    const importCampaign = (change: Record<string, string>) => () =>
      ctx.as.coordinator
        .post(`/api/projects/${A}/import?mode=merge`)
        .send({ ...doc, worksites: [], operations: [], campaigns: [{ ...doc.campaigns[0], ...change }] });
    cases.push(
      ['setup campaign name', importCampaign({ name: 'n\u0000' }), 'campaigns.0.name'],
      ['setup campaign time zone', importCampaign({ timeZone: "UTC'--" }), 'campaigns.0.timeZone'],
    );
    const tablesBefore = await tableNames();
    for (const [label, send, field] of cases) {
      const res = await send();
      expect(res.status, `${label}: ${res.text}`).toBe(400);
      expect(res.body.error.code, label).toBe('validation');
      expect(
        (res.body.error.details as { field: string }[]).map((d) => d.field),
        label,
      ).toContain(field);
    }
    // Ids and mapping names are looked up, never stored as given: hostile ones are refused too.
    for (const skipperIds of [['x\u0000'], ["'); DROP TABLE operation;--"], ['\ud800']]) {
      const res = await ctx.as.coordinator
        .post(`/api/projects/${A}/operations`)
        .send({ name: 'Skipper probe', tpop: 6, tc: 0, weatherRestricted: false, limits: { hsMax: 2 }, skipperIds });
      expect([400, 409], `${JSON.stringify(skipperIds)}: ${res.text}`).toContain(res.status);
    }
    // A user id in the address is looked up with a bound parameter; one that cannot be an id is unknown.
    for (const [method, url] of [
      ['patch', '/api/admin/users/a%00b'],
      ['put', `/api/admin/users/a%00b/projects/${A}`],
      ['delete', `/api/admin/users/a%00b/projects/${A}`],
      ['patch', "/api/admin/users/x'%3B%20DROP%20TABLE%20%22user%22%3B--"],
    ] as const) {
      const res = await ctx.as.admin[method](url).send(method === 'put' ? { role: 'client' } : { active: false });
      expect(res.status, `${method} ${url}: ${res.text}`).toBe(404);
    }
    const mapping = await upload(ctx.as.coordinator, A, SMALL_CSV, 'small.csv', {
      columns: JSON.stringify({ time: 'time\u0000', hs: "hs'); DROP TABLE dataset;--" }),
      missingCodes: JSON.stringify(['\u0000', '<b>']),
    });
    expect(mapping.status, mapping.text).toBe(400);
    expect(mapping.body.error.code).toBe('bad_file');
    expect(mapping.body.error.details[0].value).toBe("time\u2400, hs'); DROP TABLE dataset;--");
    const nul = await upload(ctx.as.coordinator, A, SMALL_CSV, 'small.csv', { name: 'data\u0000set' });
    expect(nul.status, nul.text).toBe(400);
    expect(nul.body.error.details[0].field).toBe('name');
    expect(await tableNames()).toEqual(tablesBefore);
  });
});

describe('places that render names outside React', () => {
  let skipperOps: { id: string; name: string; siteIds: string[] }[];

  beforeAll(async () => {
    // Hostile names on everything the skipper hears about: the project, the skipper's operations
    // and every worksite.
    const A = ctx.t.demo.projectId;
    const project = (await ctx.as.coordinator.get(`/api/projects/${A}`)).body;
    const renamed = await ctx.as.coordinator
      .put(`/api/projects/${A}/settings`)
      .send({ ...project, name: `${HOSTILE[1]} & co`, description: project.description ?? '' });
    expect(renamed.status, renamed.text).toBe(200);
    const ops = (await ctx.as.coordinator.get(`/api/projects/${A}/operations`)).body as {
      id: string;
      name: string;
      siteIds: string[];
      skipperIds: string[];
    }[];
    skipperOps = ops.filter((o) => o.skipperIds.includes(ctx.t.demo.users.skipper));
    expect(skipperOps.length).toBeGreaterThan(0);
    for (const [i, op] of skipperOps.entries()) {
      const name = `<script>alert(${i})</script> " onmouseover="x ${i}`;
      expect((await ctx.as.coordinator.patch(`/api/projects/${A}/operations/${op.id}`).send({ name })).status).toBe(200);
      op.name = name;
    }
    for (const [i, id] of Object.values(ctx.t.demo.siteIds).entries()) {
      expect(
        (await ctx.as.coordinator.patch(`/api/projects/${A}/sites/${id}`).send({ name: `</p><img src=x onerror=alert(${i})> ${i}` }))
          .status,
      ).toBe(200);
    }
  });

  /** No hostile markup survives in an HTML document: only its escaped form. */
  function expectEscapedHtml(html: string) {
    expect(html).not.toMatch(/<script|<img|onmouseover="x|<\/p><img/);
    expect(html).toMatch(
      /&lt;script&gt;alert\(\d\)&lt;\/script&gt; &quot; onmouseover=&quot;x|&lt;\/p&gt;&lt;img src=x onerror=alert\(\d\)&gt;/,
    );
  }

  it('escapes names in alert e-mails (OWASP XSS Prevention: HTML-encode untrusted text)', async () => {
    for (const m of await planAndReadMail(ctx)) {
      expectEscapedHtml(m.html);
      expect(m.html).toContain('&lt;script&gt;alert(1)&lt;/script&gt; &amp; co'); // the project name
      // The plain-text part and the subject are text: the names appear as typed.
      expect(skipperOps.some((o) => m.subject.startsWith(`${HOSTILE[1]} & co: ${o.name} at `))).toBe(true);
      expect(m.text).toContain(`${HOSTILE[1]} & co`);
    }
  });

  it('escapes names in the daily digest', async () => {
    await subscribeSkipperToDigest(ctx, '00:00');
    expect(await queueDigests(ctx.t.deps)).toBeGreaterThan(0);
    const digests = await ctx.t.deps.db.select().from(outbox).where(like(outbox.idempotencyKey, 'digest:%'));
    expect(digests.length).toBeGreaterThan(0);
    for (const d of digests) {
      expectEscapedHtml(d.html);
      expect(d.html).toContain('&lt;script&gt;alert(1)&lt;/script&gt; &amp; co, daily summary');
    }
  });

  it('never reflects the unsubscribe link parameters into its HTML page', async () => {
    const res = await request(ctx.t.app)
      .get('/api/unsubscribe')
      .query({ u: '<script>alert(1)</script>', p: '"><svg onload=alert(1)>', sig: '<b>x</b>' });
    expect(res.status).toBe(400);
    expect(res.type).toBe('text/html');
    expect(res.text).not.toMatch(/<script|<svg|<b>/);
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
  });

  it('escapes RFC 5545 text specials in the .ics export and the calendar feed', async () => {
    // An operation that is always workable, so the forecast gives it windows.
    const A = ctx.t.demo.projectId;
    const name = 'Calm; a,b\\c "q" <b>x</b> 🌊';
    const siteId = ctx.t.demo.siteIds.route;
    const op = await ctx.as.coordinator
      .post(`/api/projects/${A}/operations`)
      .send({ name, tpop: 1, tc: 1, weatherRestricted: true, limits: { hsMax: 20 }, siteIds: [siteId] });
    expect(op.status, op.text).toBe(201);
    const siteName = (await ctx.as.coordinator.get(`/api/projects/${A}/sites/${siteId}`)).body.name as string;

    const summaries = (ics: string) => {
      const events = new ICAL.Component(ICAL.parse(ics)).getAllSubcomponents('vevent');
      return events.map((e) => String(e.getFirstPropertyValue('summary')));
    };
    const ics = await asText(ctx.as.skipper.get(`/api/projects/${A}/plan/windows.ics`).query({ operationId: op.body.id, siteId }));
    expect(ics.status, ics.body).toBe(200);
    expect(ics.headers['content-disposition']).toMatch(/^attachment; filename="[A-Za-z0-9._-]+-windows\.ics"$/);
    const list = summaries(ics.body);
    expect(list.length).toBeGreaterThan(0);
    for (const s of list) expect(s).toBe(`Window: ${name} at ${siteName}`);
    // RFC 5545 3.3.11 (from memory): in TEXT values '\', ';' and ',' are escaped with a backslash.
    const unfolded = (ics.body as string).replace(/\r\n[ \t]/g, '');
    expect(unfolded).toContain('SUMMARY:Window: Calm\\; a\\,b\\\\c "q" <b>x</b> 🌊');

    const feed = await ctx.as.skipper.post('/api/me/calendar');
    expect(feed.status).toBe(201);
    const body = await asText(request(ctx.t.app).get(new URL(feed.body.url).pathname));
    expect(body.status).toBe(200);
    expect(summaries(body.body)).toContain(`Window: ${name} at ${siteName}`);
  });

  it('neutralises spreadsheet formulas in the server CSV (OWASP "CSV Injection")', async () => {
    const A = ctx.t.demo.projectId;
    const hindcast = await upload(ctx.as.coordinator, A, CALM_CSV(Date.UTC(2025, 0, 1), 24 * 10), 'hindcast.csv', {
      name: '=cmd|"/C calc"!A0',
    });
    expect(hindcast.status, hindcast.text).toBe(201);
    const formulas = ['=HYPERLINK("http://x.invalid","y")', '@SUM(1+1)', "-2+3+cmd|' /C calc'!A0", '+1+1'];
    const site = await ctx.as.coordinator.post(`/api/projects/${A}/sites`).send({ name: '@SUM(A1:A9)', depth: 20, timeZone: 'UTC' });
    expect(site.status, site.text).toBe(201);
    for (const name of formulas) {
      const op = await ctx.as.coordinator
        .post(`/api/projects/${A}/operations`)
        .send({ name, tpop: 2, tc: 0, weatherRestricted: false, limits: { hsMax: 1 }, siteIds: [site.body.id] });
      expect(op.status, op.text).toBe(201);
    }
    const res = await ctx.as.client.get(`/api/projects/${A}/workability.csv`).query({ dataset: hindcast.body.id });
    expect(res.status, res.text.slice(0, 300)).toBe(200);
    const rows = Papa.parse<string[]>(res.text.trim(), { delimiter: ',' }).data;
    for (const row of rows) for (const cell of row) expect(isSafeCell(cell), cell).toBe(true);
    const cells = rows.flat();
    for (const name of formulas) expect(cells).toContain(`'${name}`);
    expect(cells).toContain("'@SUM(A1:A9)");
  });
});

/** A cell a spreadsheet would not run: no formula start, unless it is a plain number. */
function isSafeCell(cell: string): boolean {
  return !/^[=+\-@\t\r]/.test(cell) || /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/.test(cell);
}

describe('CSV fields written by the browser and the server (shared/csv-field.ts)', () => {
  it('prefixes formula starts with an apostrophe and quotes per RFC 4180, also around ";"', () => {
    // OWASP "CSV Injection" example (from memory): =1+2";=1+2 must come out as "'=1+2"";=1+2".
    expect(csvField('=1+2";=1+2')).toBe(`"'=1+2"";=1+2"`);
    expect(csvField('@SUM(1+1)')).toBe("'@SUM(1+1)");
    expect(csvField('+1')).toBe('+1');
    expect(csvField('-1.5')).toBe('-1.5');
    expect(csvField('-1+1')).toBe("'-1+1");
    expect(csvField('\t=1')).toBe(`"'\t=1"`);
    expect(csvField('a;=1+1')).toBe('"a;=1+1"');
    expect(csvField('line\nbreak')).toBe('"line\nbreak"');
    expect(csvField(-3)).toBe('-3');
    expect(csvField(Number.NaN)).toBe('');
    const doc = toCsv(['name', 'value'], [...HOSTILE.map((s) => [s, 1]), ['-x', -2]]);
    const parsed = Papa.parse<string[]>(doc.trim(), { delimiter: ',' }).data;
    expect(parsed.slice(1).map((r) => r[0].replace(/^'(?=[=+\-@\t\r])/, ''))).toEqual([...HOSTILE, '-x']);
    for (const row of parsed) for (const cell of row) expect(isSafeCell(cell), cell).toBe(true);
  });
});

describe('oversize bodies', () => {
  it('answers a JSON body over 1 MB with 413 in the JSON error shape, and keeps answering', async () => {
    const body = JSON.stringify({ name: 'x', description: 'y'.repeat(1_100_000) });
    const res = await ctx.as.coordinator.post('/api/projects').set('content-type', 'application/json').send(body);
    expect(res.status).toBe(413);
    expect(res.type).toBe('application/json');
    expect(res.body).toEqual({ error: { code: 'too_large', message: expect.any(String), details: null } });
    await health();
  });

  it('answers deeply nested JSON and a __proto__ key without harm', async () => {
    const deep = `{"name":${'['.repeat(200_000)}${']'.repeat(200_000)}}`;
    const res = await ctx.as.coordinator.post('/api/projects').set('content-type', 'application/json').send(deep);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    const proto = await ctx.as.coordinator
      .post('/api/projects')
      .set('content-type', 'application/json')
      .send('{"name":"Proto","__proto__":{"polluted":true},"constructor":{"prototype":{"polluted":true}}}');
    expect(proto.status).toBe(201);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    await health();
  });

  it('answers an upload over 100 MB with 413 and stores nothing', async () => {
    const big = Buffer.alloc(100 * 1024 * 1024 + 10, 0x31);
    const res = await expectRefusedStoringNothing(
      () =>
        ctx.as.coordinator
          .post(`/api/projects/${ctx.t.demo.projectId}/datasets`)
          .field('name', 'Huge')
          .field('kind', 'hindcast')
          .field('dataPointDepth', 'deep')
          .attach('file', big, 'huge.csv'),
      413,
    );
    expect(res.body.error.code).toBe('too_large');
    expect(res.body.error.message).toMatch(/100 MB/);
  });

  it('answers a form field over 64 kB with 413, and a malformed multipart body with 400', async () => {
    const long = await expectRefusedStoringNothing(
      () => upload(ctx.as.coordinator, ctx.t.demo.projectId, SMALL_CSV, 'a.csv', { units: 'x'.repeat(70 * 1024) }),
      413,
    );
    expect(long.body.error.message).toMatch(/units is longer than the limit of 64 kB/);
    const cut = multipart([
      { name: 'name', value: 'x' },
      { name: 'file', value: SMALL_CSV, filename: 'a.csv' },
    ]);
    const truncated = await expectRefusedStoringNothing(
      () =>
        ctx.as.coordinator
          .post(`/api/projects/${ctx.t.demo.projectId}/datasets`)
          .set('content-type', cut.type)
          .send(cut.body.subarray(0, cut.body.length - 40)),
      400,
    );
    expect(truncated.body.error.message).toMatch(/multipart/);
    const noBoundary = await expectRefusedStoringNothing(
      () =>
        ctx.as.coordinator
          .post(`/api/projects/${ctx.t.demo.projectId}/datasets`)
          .set('content-type', 'multipart/form-data')
          .send('--x\r\n\r\n'),
      400,
    );
    expect(noBoundary.body.error.code).toBe('validation');
    const twoFiles = multipart([
      { name: 'name', value: 'x' },
      { name: 'kind', value: 'hindcast' },
      { name: 'dataPointDepth', value: 'deep' },
      { name: 'file', value: SMALL_CSV, filename: 'a.csv' },
      { name: 'file', value: SMALL_CSV, filename: 'b.csv' },
    ]);
    await expectRefusedStoringNothing(
      () =>
        ctx.as.coordinator.post(`/api/projects/${ctx.t.demo.projectId}/datasets`).set('content-type', twoFiles.type).send(twoFiles.body),
      400,
    );
  });
});

describe('hostile uploads', () => {
  const A = () => ctx.t.demo.projectId;
  let uploadsBefore: Set<string>;

  beforeAll(() => {
    fs.mkdirSync(UPLOAD_DIR, { recursive: true });
    uploadsBefore = new Set(fs.readdirSync(UPLOAD_DIR));
  });

  it('refuses binary content whatever the file is called, naming line and column', async () => {
    const rng = crypto.createHash('sha256').update('lullwatch hostile bytes').digest();
    const random = Buffer.concat(Array.from({ length: 64 }, (_, i) => crypto.createHash('sha256').update(rng).update(String(i)).digest()));
    const files: [string, Buffer][] = [
      ['random.csv', random],
      ['image.csv', Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c489', 'hex')],
      ['data.csv.gz', Buffer.concat([Buffer.from([0x1f, 0x8b, 0x08, 0x08, 0x5a, 0x3b, 0x1b, 0x65, 0x02, 0x03]), Buffer.from('data.csv')])],
      ['archive.csv', Buffer.concat([Buffer.from('PK\u0003\u0004'), Buffer.from(SMALL_CSV)])],
      ['program.exe', Buffer.concat([Buffer.from('MZ\u0090\u0000\u0003'), random])],
      ['nul.csv', Buffer.from(SMALL_CSV.replace('0.5', '0\u00005'))],
    ];
    for (const [name, content] of files) {
      const res = await expectRefusedStoringNothing(() => upload(ctx.as.coordinator, A(), content, name), 400);
      expect(res.body.error.code, name).toBe('bad_file');
      expect(res.body.error.message, name).toMatch(
        /not a text file: it holds binary data \(control character U\+00[0-1][0-9A-F] at line \d+, column \d+\)/,
      );
      expect(res.body.error.details[0]).toMatchObject({ line: expect.any(Number), column: expect.stringMatching(/^\d+$/) });
    }
    // The NUL of nul.csv sits on line 2 (the first data row), 27th character.
    const nul = await upload(ctx.as.coordinator, A(), Buffer.from(SMALL_CSV.replace('0.5', '0\u00005')), 'nul.csv');
    expect(nul.body.error.details[0]).toMatchObject({ line: 2, column: '27' });
  });

  it('reads text by its content, not its name: markup is refused as a bad file, listed as text', async () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><script>alert(2)</script></svg>\n';
    const res = await expectRefusedStoringNothing(() => upload(ctx.as.coordinator, A(), svg, 'picture.svg'), 400);
    expect(res.body.error.code).toBe('bad_file');
    expect(typeof res.body.error.details[0].value).toBe('string');
    const html = await expectRefusedStoringNothing(
      () => upload(ctx.as.coordinator, A(), '<html><body onload=alert(1)>time,hs</body></html>\n', 'page.html'),
      400,
    );
    expect(html.body.error.code).toBe('bad_file');
  });

  it('keeps only a clean base name of the uploaded file, and never writes where the name points', async () => {
    const names: [string, string, boolean?][] = [
      ['../../etc/passwd', 'passwd'],
      ['..\\..\\x.csv', 'x.csv'],
      ['/etc/hostile-abs.csv', 'hostile-abs.csv'],
      ['C:\\Windows\\System32\\hostile.csv', 'hostile.csv'],
      ['C:hostile-drive.csv', 'hostile-drive.csv'],
      ['bell\u0007tab\tdel\u007f\u0085.csv', 'belltabdel.csv', true],
      ['../..%2F..\\encoded.csv', 'encoded.csv', true],
      ['gpj\u202E.csv', 'gpj.csv'],
      ['Ålesund ☃ 🌊.csv', 'Ålesund ☃ 🌊.csv'],
      [`${'🌊'.repeat(250)}.csv`, '🌊'.repeat(200)],
    ];
    for (const [sent, kept, encoded] of names) {
      const res = await upload(ctx.as.coordinator, A(), SMALL_CSV, sent, { name: `Path trick ${kept.slice(0, 20)}` }, encoded);
      expect(res.status, `${sent}: ${res.text}`).toBe(201);
      const detail = await ctx.as.coordinator.get(`/api/projects/${A()}/datasets/${res.body.id}`);
      expect(detail.body.source.fileName, sent).toBe(kept);
      expect(detail.body.importReport.originalFileName, sent).toBe(kept);
      expect(detail.body.name).toBe(`Path trick ${kept.slice(0, 20)}`);
    }
    // Raw control characters in the part header are malformed multipart: refused, nothing stored.
    const raw = await expectRefusedStoringNothing(() => upload(ctx.as.coordinator, A(), SMALL_CSV, 'bell\u0007.csv'), 400);
    expect(raw.body.error.message).toMatch(/multipart/);
    // A bare '..' leaves no name at all: multer's parser then reads the part as a plain field, and
    // the upload is refused for its missing file.
    const dots = await expectRefusedStoringNothing(() => upload(ctx.as.coordinator, A(), SMALL_CSV, '..'), 400);
    expect(dots.body.error.details[0].field).toBe('file');
    // Nothing was written under the names sent: multer stores uploads under random names in its
    // own folder, and each is removed once read.
    for (const dir of [os.tmpdir(), UPLOAD_DIR, path.dirname(os.tmpdir())]) {
      const entries = fs.readdirSync(dir);
      for (const n of ['passwd', 'x.csv', 'hostile-abs.csv', 'hostile.csv', 'hostile-drive.csv']) expect(entries, dir).not.toContain(n);
    }
    for (const n of fs.readdirSync(UPLOAD_DIR)) expect(n).toMatch(/^[0-9a-f]{32}$/);
  });

  it.each([
    ['../../etc/passwd', 'passwd'],
    ['..\\..\\x.csv', 'x.csv'],
    ['C:evil.csv', 'evil.csv'],
    ['..', 'upload'],
    ['a\u0000b\u001b[31m\u009b.csv', 'ab[31m.csv'],
    ['invoice\u202Egpj.exe', 'invoicegpj.exe'],
    [`${'x'.repeat(199)}🌊🌊`, `${'x'.repeat(199)}🌊`],
    ['\ud800.csv', '\ufffd.csv'],
  ])('cleans file names even where the multipart parser would not (a second line of defence): %j', (name, expected) => {
    expect(safeFileName(name)).toBe(expected);
  });

  it('finds the first control character that marks a binary file, and passes the ones a text file may hold', () => {
    expect(binaryMark('time,hs\r\n\f\u001a')).toBeNull();
    expect(binaryMark('time,hs\nab\u0001')).toEqual({ line: 2, column: 3, code: 1 });
  });

  it('refuses a header of two million delimiters at line 1, and one of 20,000 columns at the column past the limit', async () => {
    const wide = await expectRefusedStoringNothing(() => upload(ctx.as.coordinator, A(), ','.repeat(2_000_000), 'wide.csv'), 400);
    expect(wide.body.error.details[0]).toMatchObject({ line: 1, column: String(MAX_LINE_CHARS + 1) });
    expect(wide.body.error.message).toMatch(/line 1, column 1048577: a row longer than 1 MiB/);
    const columns = await expectRefusedStoringNothing(
      () => upload(ctx.as.coordinator, A(), `time,hs${',x'.repeat(20_000)}\n2026-01-01T00:00Z,1\n`, 'columns.csv'),
      400,
    );
    expect(columns.body.error.details[0]).toMatchObject({ line: 1, column: String(MAX_COLUMNS + 1) });
    expect(columns.body.error.message).toMatch(/20,002 fields in one row, more than the 16,384 columns/);
  });

  it('refuses a CSV or NDBC line over 1 MB, and 1 MB of blanks, naming line and column', async () => {
    const csv = await expectRefusedStoringNothing(
      () => upload(ctx.as.coordinator, A(), `time,hs\n2026-01-01T00:00Z,1\n${'9'.repeat(1_200_000)}\n`, 'long.csv'),
      400,
    );
    expect(csv.body.error.details[0]).toMatchObject({ line: 3, column: String(MAX_LINE_CHARS + 1) });
    // A quote left open is a bad row at its own line (issue 22), not a swallowed rest of the file.
    const quote = await expectRefusedStoringNothing(
      () => upload(ctx.as.coordinator, A(), `time,hs\n2026-01-01T00:00Z,1\n2026-01-01T01:00Z,"1\n${'2\n'.repeat(600_000)}`, 'quote.csv'),
      400,
    );
    expect(quote.body.error.details[0]).toMatchObject({ line: 3, column: '19' });
    expect(quote.body.error.message).toMatch(/quote opened here is not closed on its line/);
    const header = '#YY  MM DD hh mm WDIR WSPD GST  WVHT   DPD   APD MWD   PRES  ATMP  WTMP  DEWP  VIS  TIDE\n';
    const ndbc = await expectRefusedStoringNothing(
      () => upload(ctx.as.coordinator, A(), `${header}${'1 '.repeat(3_000_000)}`, '46026h2016.txt'),
      400,
    );
    expect(ndbc.body.error.details[0]).toMatchObject({ line: 2, column: String(MAX_LINE_CHARS + 1) });
    // Before the header scan became a plain loop, this held the server for hours.
    const blanks = await expectRefusedStoringNothing(() => upload(ctx.as.coordinator, A(), ' '.repeat(2_000_000), 'blank.csv'), 400);
    expect(blanks.body.error.details[0].line).toBe(1);
  });

  it('stores nothing on a refusal streamed as NDJSON either', async () => {
    const before = await storeCounts();
    const res = await upload(ctx.as.coordinator, A(), `time,hs\n${'1'.repeat(1_200_000)}\n`, 'stream.csv').set(
      'accept',
      'application/x-ndjson',
    );
    expect(res.status).toBe(200);
    const last = JSON.parse(res.text.trim().split('\n').at(-1)!);
    expect(last).toMatchObject({ status: 400, error: { code: 'bad_file', details: [{ line: 2 }] } });
    expect(await storeCounts()).toEqual({ ...before, orphans: 0 });
  });

  it('keeps bad values from a skipped row, NUL included, as shown text in the stored report', async () => {
    // The binary check reads the first 64 kB; past it, a NUL reaches the CSV reader as a value.
    const rows = CALM_CSV(Date.UTC(2026, 1, 1), 3000).split('\n');
    rows[2500] = rows[2500].replace('0.5', '0\u0000\u0007🌊');
    const res = await upload(ctx.as.coordinator, A(), rows.join('\n'), 'late-nul.csv', { onBadRows: 'skip', name: 'Late NUL' });
    expect(res.status, res.text).toBe(201);
    expect(res.body.skipped).toBe(1);
    const detail = await ctx.as.coordinator.get(`/api/projects/${A()}/datasets/${res.body.id}`);
    expect(detail.body.importReport.issues[0]).toMatchObject({ line: 2501, column: 'hs', value: '0\u2400\u2407🌊' });
  });

  it('leaves no upload behind in the temporary folder', async () => {
    await vi.waitFor(
      () => {
        const left = fs.readdirSync(UPLOAD_DIR).filter((n) => !uploadsBefore.has(n));
        expect(left).toEqual([]);
      },
      { timeout: 20_000, interval: 100 },
    );
    await health();
  });
});
