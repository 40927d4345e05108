// Browser tests: the built app started as a child process on a free port with a temporary
// database, driven by playwright-core in Debian's chromium (never a downloaded browser).
// An e2e file calls `useBrowserApp()` once at its top: one `beforeAll` starts the server and the
// browser (and signs in when asked), one `afterAll` closes them.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Locator, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { DEMO_PASSWORD, DEMO_PROJECT, DEMO_USERS } from '../../seed/scenario';
import { ROOT, startServer as startChildServer } from './child-server';

export const SCREENSHOT_DIR = path.join(ROOT, 'tests/.artifacts/screenshots');
const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export interface RunningServer {
  baseUrl: string;
  dataDir: string;
  stop(): Promise<void>;
}

/**
 * Starts the built app on a temporary data folder with a 5-year demo hindcast (the built client must
 * exist: `npm test` builds it first), waiting up to `startTimeoutMs` (120 s unless given) for it.
 */
export async function startServer(env: Record<string, string> = {}, startTimeoutMs?: number): Promise<RunningServer> {
  if (!fs.existsSync(path.join(ROOT, 'dist/index.html'))) throw new Error('dist/ is missing: run `npm run build` first');
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-e2e-'));
  try {
    const server = await startChildServer(dataDir, { DEMO_HINDCAST_YEARS: '5', ...env }, { startTimeoutMs });
    return {
      baseUrl: server.baseUrl,
      dataDir,
      async stop() {
        await server.stop();
        fs.rmSync(dataDir, { recursive: true, force: true });
      },
    };
  } catch (err) {
    fs.rmSync(dataDir, { recursive: true, force: true });
    throw err;
  }
}

export interface Browser {
  context: BrowserContext;
  page: Page;
  close(): Promise<void>;
}

export async function openBrowser(viewport = { width: 1280, height: 860 }): Promise<Browser> {
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    async close() {
      await context.close();
      fs.rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function screenshot(page: Page, name: string): Promise<void> {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), fullPage: true });
}

/**
 * Waits for `target` (30 s unless given); on failure keeps a screenshot `<name>-failure` and says
 * what the page's main part showed.
 */
export async function waitOrScreenshot(page: Page, target: Locator, name: string, timeout = 30_000): Promise<void> {
  try {
    await target.waitFor({ timeout });
  } catch (err) {
    await screenshot(page, `${name}-failure`);
    const shown = (
      (await page
        .locator('main')
        .textContent()
        .catch(() => '')) ?? ''
    ).slice(0, 600);
    throw new Error(`${name}: not shown on ${page.url()}: ${shown}`, { cause: err });
  }
}

export async function signInAs(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('signed-in-as').waitFor();
}

/** The demo project's id, read through the signed-in page's own session. */
export async function demoProjectId(page: Page, baseUrl: string): Promise<string> {
  const res = await page.request.get(`${baseUrl}/api/projects`);
  if (!res.ok()) throw new Error(`GET /api/projects answered ${res.status()}`);
  const projects = (await res.json()) as { id: string; name: string }[];
  const demo = projects.find((p) => p.name === DEMO_PROJECT.name);
  if (!demo) throw new Error('the demo project is not in the list');
  return demo.id;
}

/** From the projects list: opens the demo project and, if named, one section of its navigation. */
export async function openDemoProject(page: Page, section?: string): Promise<void> {
  await page.getByRole('link', { name: DEMO_PROJECT.name }).click();
  const nav = page.getByRole('navigation', { name: 'Project' });
  await nav.waitFor();
  if (section) await nav.getByRole('link', { name: section }).click();
}

/** Signs in with `email`, opens `section` of the demo project from the projects list and waits for its `heading`. */
export async function signInAndOpenSection(page: Page, baseUrl: string, email: string, section: string, heading: string): Promise<void> {
  await signInAs(page, baseUrl, email);
  await openDemoProject(page, section);
  await page.getByRole('heading', { name: heading }).waitFor();
}

/** The demo accounts of the seed (seed/scenario.ts), by role. */
export type DemoAccount = (typeof DEMO_USERS)[number]['key'];

export function demoEmail(account: DemoAccount): string {
  return DEMO_USERS.find((u) => u.key === account)!.email;
}

export interface BrowserAppOptions {
  /** More server environment, e.g. `{ DEMO_HINDCAST_YEARS: '0' }` for a file that brings its own data. */
  env?: Record<string, string>;
  /** Sign in as this demo account in the set-up; `projectId` then holds the demo project's id. */
  signIn?: DemoAccount;
  viewport?: { width: number; height: number };
  /** The set-up's time limit (the first start seeds the demo on a shared machine): 480 s unless given, 420 s of it for the server. */
  timeoutMs?: number;
}

export interface BrowserApp {
  /** The running server; its fields may be read inside tests and hooks, once the set-up has run. */
  server: RunningServer;
  /** The browser and its one page, likewise. */
  browser: Browser;
  /** The demo project's id, read by the last sign-in through `signIn` (or the set-up's). */
  readonly projectId: string;
  /** Signs out whoever was signed in (clears the cookies), signs in as a demo account and returns the demo project's id. */
  signIn(account: DemoAccount): Promise<string>;
  /** `signIn(account)`, then opens a section of the demo project (e.g. `'alerts'`); returns the project's id. */
  openProject(account: DemoAccount, section: string): Promise<string>;
}

/**
 * A stand-in for an object made later (in a hook): each field read, or method called, on it is read
 * from `current()` at that moment.
 */
function readLater<T extends object>(current: () => T): T {
  return new Proxy({} as T, {
    get(_, key) {
      const target = current();
      const value: unknown = Reflect.get(target, key);
      return typeof value === 'function' ? value.bind(target) : value;
    },
  });
}

/**
 * The shared set-up of a browser test file: registers one `beforeAll` (server on a temporary data
 * folder, chromium, and a sign-in when `options.signIn` says so) and one `afterAll` that closes
 * both. Call it once at the top of the file; read `server`, `browser` and `projectId` in tests.
 */
export function useBrowserApp(options: BrowserAppOptions = {}): BrowserApp {
  let running: RunningServer | undefined;
  let open: Browser | undefined;
  let project: string | undefined;
  const ready = <T>(value: T | undefined, what: string): T => {
    if (value === undefined) throw new Error(`${what} is not ready: read it inside a test or hook, after useBrowserApp's set-up`);
    return value;
  };
  const server = readLater<RunningServer>(() => ready(running, 'the server'));
  const browser = readLater<Browser>(() => ready(open, 'the browser'));
  async function signIn(account: DemoAccount): Promise<string> {
    const { page, context } = browser;
    await context.clearCookies();
    await signInAs(page, server.baseUrl, demoEmail(account));
    project = await demoProjectId(page, server.baseUrl);
    return project;
  }
  async function openProject(account: DemoAccount, section: string): Promise<string> {
    const projectId = await signIn(account);
    await browser.page.goto(`${server.baseUrl}/projects/${projectId}/${section}`);
    return projectId;
  }

  const timeoutMs = options.timeoutMs ?? 480_000;
  beforeAll(async () => {
    running = await startServer(options.env, timeoutMs - 60_000);
    open = await openBrowser(options.viewport);
    if (options.signIn) await signIn(options.signIn);
  }, timeoutMs);
  afterAll(async () => {
    await open?.close();
    await running?.stop();
  }, 60_000);

  return {
    server,
    browser,
    signIn,
    openProject,
    get projectId() {
      return ready(project, 'the demo project id (sign in first)');
    },
  };
}
