import request from 'supertest';
import type { Response as SuperagentResponse } from 'superagent';
import { afterAll, beforeAll, expect } from 'vitest';
import type { Express } from 'express';
import { createApp } from '../../server/app';
import { createAuth } from '../../server/auth';
import type { Database } from '../../server/db/client';
import { silentLogger, type AppDeps } from '../../server/deps';
import { seedDemo, type DemoIds } from '../../seed/demo';
import { DEMO_PASSWORD } from '../../seed/scenario';
import { createTestDatabase } from './db';
import { createForecastProvider, type ForecastSetup } from '../../server/forecast';
import { createMailer, type Mailer } from '../../server/mail/mailer';
import type { CaughtMessage } from '../../server/mail/fake-smtp';

export const TEST_ORIGIN = 'http://localhost:3000';

export interface TestApp {
  app: Express;
  deps: AppDeps;
  database: Database;
  demo: DemoIds;
  forecast: ForecastSetup;
  mailer: Mailer;
  close(): Promise<void>;
}

export interface TestAppOptions {
  clock?: () => Date;
  signInPerMinute?: number;
  enforceOriginCheck?: boolean;
  secureCookies?: boolean;
  /** Years of invented hindcast to seed (default none: fast). */
  hindcastYears?: number;
  /** Seed a forecast from the fake service (default no). */
  forecast?: boolean;
  /** Earlier forecast issues, one a day back (default none). */
  pastForecastDays?: number;
  /** Days of forecast archive and observation for the skill page (default none; needs `forecast`). */
  skillArchiveDays?: number;
}

/** The real app on a fresh in-memory database with the demo scenario seeded. */
export async function createTestApp(options: TestAppOptions = {}): Promise<TestApp> {
  const database = await createTestDatabase();
  const clock = options.clock ?? (() => new Date());
  const forecast = await createForecastProvider({ timeoutMs: 2000, fake: { clock: () => clock().getTime() } });
  const mailer = await createMailer({ from: 'Lullwatch tests <alerts@lullwatch.invalid>' });
  const deps: AppDeps = {
    db: database.db,
    auth: createAuth(database.db, {
      secret: 'test-secret-test-secret-test-secret-0123',
      baseURL: TEST_ORIGIN,
      trustedOrigins: [TEST_ORIGIN],
      secureCookies: options.secureCookies ?? false,
      signInPerMinute: options.signInPerMinute ?? 1000,
      enforceOriginCheckInTests: options.enforceOriginCheck,
    }),
    clock,
    log: silentLogger,
    forecast: forecast.provider,
    mailer,
    database,
    config: {
      baseUrl: TEST_ORIGIN,
      trustedOrigins: [TEST_ORIGIN],
      linkSecret: 'test-link-secret',
      earliestMoveAlertHours: 6,
      mailMaxAttempts: 3,
    },
  };
  const demo = await seedDemo(deps, {
    hindcastYears: options.hindcastYears ?? 0,
    forecast: options.forecast ?? false,
    pastForecastDays: options.pastForecastDays ?? 0,
    skillArchiveDays: options.skillArchiveDays ?? 0,
  });
  const app = createApp(deps);
  return {
    app,
    deps,
    database,
    demo,
    forecast,
    mailer,
    async close() {
      await forecast.close();
      await mailer.close();
      await database.close();
    },
  };
}

export type Agent = ReturnType<typeof request.agent>;

/** A supertest agent that keeps the session cookie of a signed-in user. */
export async function signIn(app: Express, email: string, password = DEMO_PASSWORD): Promise<Agent> {
  const agent = request.agent(app);
  const res = await agent.post('/api/auth/sign-in/email').set('Origin', TEST_ORIGIN).send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${res.text}`);
  return agent;
}

export async function signInAll(app: Express) {
  const [admin, coordinator, skipper, client] = await Promise.all([
    signIn(app, 'admin@example.com'),
    signIn(app, 'coordinator@example.com'),
    signIn(app, 'skipper@example.com'),
    signIn(app, 'client@example.com'),
  ]);
  return { admin, coordinator, skipper, client };
}

export type SignedIn = Awaited<ReturnType<typeof signInAll>>;

/** What `useSignedInApp` hands a test file: read its fields inside tests and hooks. */
export interface SignedInApp {
  /** The app on its own database (`createTestApp`). */
  readonly t: TestApp;
  /** One agent a demo account, each signed in. */
  readonly as: SignedIn;
  /** `/api/projects/<the demo project's id>` followed by the `path` given. */
  readonly base: string;
}

/**
 * A test file's API set-up in one call at its top: one `beforeAll` makes the app
 * (`createTestApp(options)`) and signs in every demo account (within `timeoutMs`, 120 s by default: the
 * machine may be loaded), one `afterAll` closes it.
 */
export function useSignedInApp(
  options: TestAppOptions = {},
  { path = '', timeoutMs = 120_000 }: { path?: string; timeoutMs?: number } = {},
): SignedInApp {
  let app: TestApp | undefined;
  let agents: SignedIn | undefined;
  const ready = <T>(value: T | undefined): T => {
    if (value === undefined) throw new Error('the test app is not ready: read it inside a test or hook');
    return value;
  };
  beforeAll(async () => {
    app = await createTestApp(options);
    agents = await signInAll(app.app);
  }, timeoutMs);
  afterAll(async () => {
    await app?.close();
  });
  return {
    get t() {
      return ready(app);
    },
    get as() {
      return ready(agents);
    },
    get base() {
      return `/api/projects/${ready(app).demo.projectId}${path}`;
    },
  };
}

/**
 * Runs the planning job on the demo project as the admin (it must answer 200) and returns the
 * e-mails the fake SMTP server has caught, at least one.
 */
export async function planAndReadMail(ctx: SignedInApp): Promise<CaughtMessage[]> {
  const res = await ctx.as.admin.post('/api/admin/jobs/plan').send({ projectId: ctx.t.demo.projectId });
  expect(res.status, res.text).toBe(200);
  const mails = ctx.t.mailer.fake!.messages;
  expect(mails.length).toBeGreaterThan(0);
  return mails;
}

/** Subscribes the demo skipper to immediate alerts and to a daily digest at this UTC time (it must answer 200). */
export async function subscribeSkipperToDigest(ctx: SignedInApp, digestTime: string): Promise<void> {
  const sub = await ctx.as.skipper.put(`/api/projects/${ctx.t.demo.projectId}/subscription`).send({
    operationIds: [],
    siteIds: [],
    immediate: true,
    digest: true,
    digestTime,
    digestTimeZone: 'UTC',
    active: true,
  });
  expect(sub.status, sub.text).toBe(200);
}

/** A supertest body parser that keeps the answer as text (CSV, iCalendar): `.buffer(true).parse(textBody)`. */
export function textBody(r: SuperagentResponse, cb: (err: Error | null, body: string) => void): void {
  let s = '';
  r.on('data', (c: Buffer) => (s += c));
  r.on('end', () => cb(null, s));
}

/**
 * POSTs a multipart form as the agent: each field, then `file` (a path, or content with `fileName`)
 * in the field "file".
 */
export function postForm(agent: Agent, url: string, fields: Record<string, string>, file: string | Buffer, fileName?: string) {
  let req = agent.post(url);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return typeof file === 'string' ? req.attach('file', file) : req.attach('file', file, fileName);
}
