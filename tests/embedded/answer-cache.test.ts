// Unchanged answers served again without the database (server/http/answer-cache.ts): a change made
// through any route is seen at once, another user's answer is never served, and the HTTP
// semantics hold. ETag and If-None-Match: RFC 9110 sections 8.8.3 and 13.1.2 (a weak validator
// matches by weak comparison, and a match answers 304 with no body); Content-Encoding gzip:
// RFC 9110 section 8.4.1.3. The real app on a real embedded database, no mocks. The cache works on
// the embedded database only (it counts that database's writes), so this file sits outside tests/api,
// which `npm run test:postgres` runs again on a PostgreSQL server.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { answerCache } from '../../server/http/answer-cache';
import { createTestApp, signIn, type TestApp } from '../support/app';

let t: TestApp;
let app: ReturnType<typeof createApp>;

beforeAll(async () => {
  t = await createTestApp();
  app = createApp(t.deps, { answerCacheMs: 60_000 });
});
afterAll(async () => {
  await t.close();
});

describe('answers kept while the data stay the same', () => {
  it('the embedded database counts every statement that may write, and no read', async () => {
    const gen = t.database.writeGeneration!;
    const g0 = gen();
    await t.database.db.execute('select 1');
    expect(gen()).toBe(g0);
    const coordinator = await signIn(app, 'coordinator@example.com');
    const g1 = gen();
    // A rename through the API is an UPDATE.
    const res = await coordinator.put(`/api/projects/${t.demo.projectId}/settings`).send(await settingsOf(coordinator));
    expect(res.status, res.text).toBe(200);
    expect(gen()).toBeGreaterThan(g1);
  });

  it('a change through the API is seen at once (the kept answer is retired)', async () => {
    const coordinator = await signIn(app, 'coordinator@example.com');
    const url = `/api/projects/${t.demo.projectId}/sites`;
    const before = await coordinator.get(url);
    expect(before.status).toBe(200);
    const again = await coordinator.get(url);
    expect(again.body).toEqual(before.body);
    const site = before.body[0] as { id: string; name: string };
    const renamed = `${site.name} (renamed)`;
    expect((await coordinator.patch(`${url}/${site.id}`).send({ name: renamed })).status).toBe(200);
    const after = await coordinator.get(url);
    expect((after.body as { id: string; name: string }[]).find((s) => s.id === site.id)?.name).toBe(renamed);
  });

  it('never serves one user the answer kept for another', async () => {
    const client = await signIn(app, 'client@example.com');
    const skipper = await signIn(app, 'skipper@example.com');
    const a = await client.get('/api/me');
    const b = await skipper.get('/api/me');
    expect(a.body.email).toBe('client@example.com');
    expect(b.body.email).toBe('skipper@example.com');
  });

  it('answers 304 to a matching If-None-Match, and gzip to a client that accepts it', async () => {
    const coordinator = await signIn(app, 'coordinator@example.com');
    const url = `/api/projects/${t.demo.projectId}/operations`;
    const first = await coordinator.get(url);
    const etag = first.headers.etag as string;
    expect(etag).toMatch(/^W\/".+"$/);
    const revalidated = await coordinator.get(url).set('If-None-Match', etag);
    expect(revalidated.status).toBe(304);
    expect(revalidated.text ?? '').toBe('');
    // supertest (superagent) inflates a gzip body itself, so equal bodies show the bytes were valid gzip.
    const zipped = await coordinator.get(url).set('Accept-Encoding', 'gzip');
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.body).toEqual(first.body);
  });

  it('keeps an answer that depends on the clock (the plan) at most the given time, others at most 12 times as long', async () => {
    let now = 1_000_000;
    let gen = 7;
    const mw = answerCache({ writeGeneration: () => gen, ttlMs: 5000, now: () => now });
    const express = (await import('express')).default;
    const { setRequestUser } = await import('../../server/http/context');
    let computed = 0;
    const tiny = express();
    tiny.use((req, _res, next) => {
      setRequestUser(req, { id: 'u1', name: 'U', email: 'u@example.com', role: 'user' });
      next();
    });
    tiny.use(mw);
    for (const route of ['plan', 'sites']) {
      tiny.get(`/api/projects/:id/${route}`, (_req, res) => {
        computed++;
        res.json({ computed });
      });
    }
    /** How many answers had been computed when this one was: a cached answer repeats its count. */
    const countIn = async (url: string) => ((await request(tiny).get(url)).body as { computed: number }).computed;
    /** Asks for `url` (answer number `count`), again 1 ms before `keptMs` has passed (the same answer), and at `keptMs` (a new one). */
    const expectKeptFor = async (url: string, keptMs: number, count: number) => {
      expect(await countIn(url)).toBe(count);
      now += keptMs - 1;
      expect(await countIn(url)).toBe(count);
      now += 1;
      expect(await countIn(url)).toBe(count + 1);
    };
    const plan = '/api/projects/p1/plan?alpha=true';
    await expectKeptFor(plan, 5000, 1);
    // A write (a new generation) drops it at once.
    gen++;
    expect(await countIn(plan)).toBe(3);
    await expectKeptFor('/api/projects/p1/sites', 12 * 5000, 4);
  });
});

async function settingsOf(agent: Awaited<ReturnType<typeof signIn>>): Promise<Record<string, unknown>> {
  const p = (await agent.get(`/api/projects/${t.demo.projectId}`)).body as Record<string, unknown>;
  return {
    name: p.name,
    description: p.description ?? '',
    dataPointName: p.dataPointName ?? '',
    dataPointLatitude: p.dataPointLatitude ?? null,
    dataPointLongitude: p.dataPointLongitude ?? null,
    dataPointDepthM: p.dataPointDepthM ?? null,
    forecastSource: p.forecastSource ?? 'uploads',
  };
}
