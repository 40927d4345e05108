// The project's setup is read once per write generation on the embedded database and shared
// (server/services/site-context.ts loadProjectSetup): checked against the real database, where any
// write, through the API or straight to the tables, must give the next reader what is stored now.
// On a PostgreSQL server (TEST_DATABASE_URL, `npm run test:postgres`) other instances write unseen,
// so every call reads afresh there: the same checks of what is read, without the sharing.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { worksite } from '../../server/db/schema';
import { loadProjectSetup } from '../../server/services/site-context';
import { createTestApp, signIn, type TestApp } from '../support/app';

let t: TestApp;
/** The embedded database (the memo applies); false on a PostgreSQL server. */
const embedded = !process.env.TEST_DATABASE_URL;

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('the project setup read once per write generation', () => {
  it('shares one read until something is written, then reads what is stored', async () => {
    const first = await loadProjectSetup(t.deps.db, t.demo.projectId);
    const again = await loadProjectSetup(t.deps.db, t.demo.projectId);
    if (embedded) expect(again).toBe(first);
    else expect(again).not.toBe(first);
    expect(again).toEqual(first);
    const site = first.sites[0]!;

    // A write straight to the table (as a job or a migration would) is seen by the next read.
    await t.deps.db
      .update(worksite)
      .set({ name: `${site.name} (renamed)` })
      .where(eq(worksite.id, site.id));
    const second = await loadProjectSetup(t.deps.db, t.demo.projectId);
    expect(second).not.toBe(first);
    expect(second.sites.find((s) => s.id === site.id)?.name).toBe(`${site.name} (renamed)`);

    // And through the API: an operation's limit changed by the coordinator.
    const coordinator = await signIn(t.app, 'coordinator@example.com');
    const op = second.operations.find((o) => typeof (o.limits as { hsMax?: number }).hsMax === 'number')!;
    const hsMax = (op.limits as { hsMax: number }).hsMax;
    const patched = await coordinator
      .patch(`/api/projects/${t.demo.projectId}/operations/${op.id}`)
      .send({ limits: { ...op.limits, hsMax: hsMax - 0.1 } });
    expect(patched.status, patched.text).toBe(200);
    const third = await loadProjectSetup(t.deps.db, t.demo.projectId);
    expect((third.operations.find((o) => o.id === op.id)!.limits as { hsMax: number }).hsMax).toBeCloseTo(hsMax - 0.1, 9);
  });

  it.runIf(embedded)('hands out a frozen setup, so no caller can change what the others read', async () => {
    const setup = await loadProjectSetup(t.deps.db, t.demo.projectId);
    expect(Object.isFrozen(setup)).toBe(true);
    expect(() => setup.sites.push(setup.sites[0]!)).toThrow(TypeError);
    expect(() => {
      (setup.operations[0]!.limits as Record<string, unknown>).hsMax = 99;
    }).toThrow(TypeError);
  });

  it('reads afresh every time inside a transaction (its handle has no generation)', async () => {
    await t.deps.db.transaction(async (tx) => {
      const a = await loadProjectSetup(tx, t.demo.projectId);
      const b = await loadProjectSetup(tx, t.demo.projectId);
      expect(b).not.toBe(a);
      expect(b).toEqual(a);
    });
  });
});
