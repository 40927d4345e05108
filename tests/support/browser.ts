// Browser tests: the built app started as a child process on a free port with a temporary
// database, driven by playwright-core in Debian's chromium (never a downloaded browser).
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { spawn, type ChildProcess } from 'node:child_process';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

const ROOT = path.resolve(import.meta.dirname, '../..');
export const SCREENSHOT_DIR = path.join(ROOT, 'tests/.artifacts/screenshots');
const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

export interface RunningServer {
  baseUrl: string;
  dataDir: string;
  child: ChildProcess;
  output: () => string;
  stop(): Promise<void>;
}

/** Starts `server/index.ts` (the built client must exist: `npm test` builds it first). */
export async function startServer(env: Record<string, string> = {}): Promise<RunningServer> {
  if (!fs.existsSync(path.join(ROOT, 'dist/index.html'))) throw new Error('dist/ is missing: run `npm run build` first');
  const port = await freePort();
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-e2e-'));
  let out = '';
  const child = spawn(path.join(ROOT, 'node_modules/.bin/tsx'), ['server/index.ts'], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: 'production', PORT: String(port), HOST: '127.0.0.1', DATA_DIR: dataDir, BASE_URL: `http://127.0.0.1:${port}`, DEMO_HINDCAST_YEARS: '5', JOBS_ENABLED: 'false', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const baseUrl = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 90_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${out}`);
    try {
      const res = await fetch(`${baseUrl}/api/health`);
      if (res.ok) break;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  if (Date.now() >= deadline) throw new Error(`server did not start:\n${out}`);
  return {
    baseUrl,
    dataDir,
    child,
    output: () => out,
    async stop() {
      if (child.exitCode === null) {
        const exited = new Promise((r) => child.once('exit', r));
        child.kill('SIGTERM');
        await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
        if (child.exitCode === null) child.kill('SIGKILL');
      }
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
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
