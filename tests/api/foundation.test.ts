import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { type Agent, signIn, TEST_ORIGIN, useSignedInApp } from '../support/app';

const ctx = useSignedInApp();

describe('health and sign-in', () => {
  it('answers health with the database reachable', async () => {
    const res = await request(ctx.t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true });
  });

  it('keeps sign-up closed: administrators create users', async () => {
    const res = await request(ctx.t.app)
      .post('/api/auth/sign-up/email')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'walk-in@example.com', password: 'a-long-password', name: 'Walk In' });
    expect(res.status).toBeGreaterThanOrEqual(400);
    const signin = await request(ctx.t.app)
      .post('/api/auth/sign-in/email')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'walk-in@example.com', password: 'a-long-password' });
    expect(signin.status).toBe(401);
  });

  it('refuses a wrong password with 401 and the same message as an unknown e-mail', async () => {
    const wrong = await request(ctx.t.app)
      .post('/api/auth/sign-in/email')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'coordinator@example.com', password: 'not-the-password' });
    const unknown = await request(ctx.t.app)
      .post('/api/auth/sign-in/email')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'nobody@example.com', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.message).toBe(unknown.body.message);
  });

  it("answers the renamed section's old address with a permanent redirect to the new one", async () => {
    // Issue 17: the section is the "Wave calculator"; a bookmark of the old address /wave-lab still works.
    const res = await request(ctx.t.app).get('/wave-lab?mode=table');
    expect(res.status).toBe(301);
    expect(res.headers.location).toBe('/wave-calculator?mode=table');
    const bare = await request(ctx.t.app).get('/wave-lab');
    expect(bare.headers.location).toBe('/wave-calculator');
  });

  it('stores passwords hashed, never in clear', async () => {
    const rows = await ctx.t.database.db.query.account.findMany();
    expect(rows.length).toBeGreaterThanOrEqual(4);
    for (const row of rows) {
      expect(row.password).toBeTruthy();
      expect(row.password).not.toContain('lullwatch-demo');
    }
  });

  it('answers /api/me with the global role and project roles', async () => {
    const res = await ctx.as.skipper.get('/api/me');
    expect(res.status).toBe(200);
    expect(res.body.email).toBe('skipper@example.com');
    expect(res.body.globalRole).toBe('user');
    const roles = Object.fromEntries(res.body.projects.map((p: { id: string; role: string }) => [p.id, p.role]));
    // The demo skipper is a skipper in the main project and a client in the second one.
    expect(roles[ctx.t.demo.projectId]).toBe('skipper');
    expect(roles[ctx.t.demo.secondProjectId]).toBe('client');
  });

  it('signs out and the session stops working', async () => {
    const agent = await signIn(ctx.t.app, 'client@example.com');
    expect((await agent.get('/api/me')).status).toBe(200);
    const out = await agent.post('/api/auth/sign-out').set('Origin', TEST_ORIGIN).send({});
    expect(out.status).toBe(200);
    expect((await agent.get('/api/me')).status).toBe(401);
  });
});

describe('projects and roles', () => {
  it('lists only the caller’s projects; admins see all', async () => {
    const client = await ctx.as.client.get('/api/projects');
    expect(client.body).toEqual([{ id: ctx.t.demo.projectId, name: expect.any(String), role: 'client' }]);
    const admin = await ctx.as.admin.get('/api/projects');
    expect(admin.body.map((p: { id: string }) => p.id).sort()).toEqual([ctx.t.demo.projectId, ctx.t.demo.secondProjectId].sort());
  });

  it('refuses anonymous callers on every project route with 401', async () => {
    const anon = request(ctx.t.app);
    for (const [method, url] of [
      ['get', '/api/me'],
      ['get', '/api/projects'],
      ['post', '/api/projects'],
      ['get', `/api/projects/${ctx.t.demo.projectId}`],
      ['put', `/api/projects/${ctx.t.demo.projectId}/settings`],
      ['get', '/api/admin/users'],
    ] as const) {
      const res = await anon[method](url).send({});
      expect(res.status, `${method} ${url}`).toBe(401);
      expect(res.body.error.code).toBe('unauthenticated');
    }
  });

  it('gives a client of project A 404 on project B and 403 on coordinator actions', async () => {
    expect((await ctx.as.client.get(`/api/projects/${ctx.t.demo.secondProjectId}`)).status).toBe(404);
    const settings = await ctx.as.client.get(`/api/projects/${ctx.t.demo.projectId}`);
    expect(settings.status).toBe(200);
    const body = { ...settings.body };
    const res = await ctx.as.client.put(`/api/projects/${ctx.t.demo.projectId}/settings`).send({
      name: body.name,
      description: body.description,
      dataPointName: body.dataPointName,
      dataPointLatitude: body.dataPointLatitude,
      dataPointLongitude: body.dataPointLongitude,
      dataPointDepthM: body.dataPointDepthM,
      forecastSource: body.forecastSource,
    });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/coordinator/);
    // A client coordinates nothing, so may not open projects.
    expect((await ctx.as.client.post('/api/projects').send({ name: 'Mine' })).status).toBe(403);
  });

  it('answers 404, not 500, for ids that are not ids', async () => {
    expect((await ctx.as.coordinator.get('/api/projects/not-a-uuid')).status).toBe(404);
    expect((await ctx.as.coordinator.get('/api/projects/00000000-0000-4000-8000-000000000000')).status).toBe(404);
  });

  it('validates input with the field named', async () => {
    const res = await ctx.as.coordinator.post('/api/projects').send({ name: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(res.body.error.details[0].field).toBe('name');
  });

  it('lets a coordinator open a project and become its coordinator', async () => {
    const res = await ctx.as.coordinator.post('/api/projects').send({ name: 'Test trench works' });
    expect(res.status).toBe(201);
    expect(res.body.role).toBe('coordinator');
    const mine = await ctx.as.coordinator.get('/api/projects');
    expect(mine.body.map((p: { id: string }) => p.id)).toContain(res.body.id);
  });
});

describe('administration', () => {
  it('refuses admin routes to everyone but administrators', async () => {
    for (const agent of [ctx.as.coordinator, ctx.as.skipper, ctx.as.client] as Agent[]) {
      expect((await agent.get('/api/admin/users')).status).toBe(403);
      expect((await agent.post('/api/admin/users').send({ name: 'X', email: 'x@example.com' })).status).toBe(403);
    }
  });

  it('creates a user with a temporary password, assigns a role, and deactivates them', async () => {
    const created = await ctx.as.admin.post('/api/admin/users').send({ name: 'New Deckhand', email: 'deck@example.com' });
    expect(created.status).toBe(201);
    const { user, temporaryPassword } = created.body;
    expect(temporaryPassword.length).toBeGreaterThanOrEqual(12);

    const assign = await ctx.as.admin.put(`/api/admin/users/${user.id}/projects/${ctx.t.demo.projectId}`).send({ role: 'skipper' });
    expect(assign.status).toBe(200);
    const agent = await signIn(ctx.t.app, 'deck@example.com', temporaryPassword);
    const me = await agent.get('/api/me');
    expect(me.body.projects).toEqual([{ id: ctx.t.demo.projectId, name: expect.any(String), role: 'skipper' }]);

    const change = await ctx.as.admin.put(`/api/admin/users/${user.id}/projects/${ctx.t.demo.projectId}`).send({ role: 'client' });
    expect(change.status).toBe(200);
    expect((await agent.get('/api/me')).body.projects[0].role).toBe('client');

    const off = await ctx.as.admin.patch(`/api/admin/users/${user.id}`).send({ active: false });
    expect(off.status).toBe(200);
    expect((await agent.get('/api/me')).status).toBe(401);
    const again = await request(ctx.t.app)
      .post('/api/auth/sign-in/email')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'deck@example.com', password: temporaryPassword });
    expect(again.status).toBeGreaterThanOrEqual(400);

    const list = await ctx.as.admin.get('/api/admin/users');
    const row = list.body.find((u: { email: string }) => u.email === 'deck@example.com');
    expect(row.active).toBe(false);
  });

  it('refuses a duplicate e-mail with 409', async () => {
    const res = await ctx.as.admin.post('/api/admin/users').send({ name: 'Dup', email: 'client@example.com' });
    expect(res.status).toBe(409);
  });
});
