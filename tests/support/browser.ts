// Browser tests: the built app started as a child process on a free port with a temporary
// database, driven by playwright-core in Debian's chromium (never a downloaded browser).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { ROOT, startServer as startChildServer } from './child-server';

export const SCREENSHOT_DIR = path.join(ROOT, 'tests/.artifacts/screenshots');
const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export interface RunningServer {
  baseUrl: string;
  dataDir: string;
  stop(): Promise<void>;
}

/** Starts the built app on a temporary data folder with a 5-year demo hindcast (the built client must exist: `npm test` builds it first). */
export async function startServer(env: Record<string, string> = {}): Promise<RunningServer> {
  if (!fs.existsSync(path.join(ROOT, 'dist/index.html'))) throw new Error('dist/ is missing: run `npm run build` first');
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-e2e-'));
  try {
    const server = await startChildServer(dataDir, { DEMO_HINDCAST_YEARS: '5', ...env });
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

export async function signInAs(page: Page, baseUrl: string, email: string, password = 'lullwatch-demo'): Promise<void> {
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
  const demo = projects.find((p) => /Varrow Reach/.test(p.name));
  if (!demo) throw new Error('the demo project is not in the list');
  return demo.id;
}
