// The project Overview in a real browser against the built app and the seeded demo project, as
// each role: the coordinator's lines against the plan API, the map on the built-in coastline with
// no request leaving the app, the skipper's cards on a 390 px phone, the client's month.
// What the page must show is the issue's own list (issue 17, "What to build" and "Tests").
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { PlanAnswer } from '../../shared/api-types-plan';
import type { SiteResponse } from '../../shared/api-types-sites';
import type { LedgerEntry, LedgerMonthlyAnswer } from '../../shared/api-types-downtime';
import type { MeResponse } from '../../shared/api-types';
import { formatInstant } from '../../shared/dates';
import { DEMO_SECOND_PROJECT } from '../../seed/scenario';
import { demoProjectId, openBrowser, screenshot, signInAs, useBrowserApp, waitOrScreenshot } from '../support/browser';

const { server, browser, signIn } = useBrowserApp();

const getJson = async <T>(page: Page, path: string): Promise<T> => {
  const res = await page.request.get(`${server.baseUrl}${path}`);
  if (!res.ok()) throw new Error(`GET ${path} answered ${res.status()}`);
  return (await res.json()) as T;
};

describe('the project Overview', () => {
  it('lists every operation for the coordinator with the plan API’s earliest start', async () => {
    const { page } = browser;
    const projectId = await signIn('coordinator');
    await page.goto(`${server.baseUrl}/projects/${projectId}`);
    await waitOrScreenshot(page, page.getByTestId('overview-line').first(), 'overview-coordinator');

    const plan = await getJson<PlanAnswer>(page, `/api/projects/${projectId}/plan?alpha=true`);
    expect(plan.plans.length).toBeGreaterThan(0);
    const lines = page.getByTestId('overview-line');
    expect(await lines.count()).toBe(plan.plans.length);
    let dated = 0;
    for (const p of plan.plans) {
      const line = page.locator(`[data-testid="overview-line"][data-operation-id="${p.operationId}"][data-site-id="${p.siteId}"]`);
      expect(await line.count()).toBe(1);
      expect(await line.getAttribute('data-earliest-start')).toBe(p.earliestStart ?? '');
      const words = (await line.getByTestId('plain-line').textContent()) ?? '';
      if (p.informationOnly) expect(words).toMatch(/not weather-restricted/);
      else if (p.startNow) expect(words).toMatch(/^may start now/);
      else if (p.earliestStart) {
        // The issue's wording: "next go-start Thu 4 Dec 14:00 (in 20 h), window 35 h", the date in the worksite's zone.
        expect(words).toContain(`next go-start ${formatInstant(p.earliestStart, p.timeZone, 'dateTime')} (in `);
        const w = p.windows.find((x) => x.start <= p.earliestStart! && p.earliestStart! < x.end);
        // Hours as the README states them: plain below 72 h ("35 h"), days and hours from there ("3 days 12 h").
        const days = Math.floor((w?.hours ?? 0) / 24);
        const rest = Math.round((w?.hours ?? 0) - days * 24);
        if (w)
          expect(words).toContain(
            `window ${w.hours < 72 ? `${Math.round(w.hours * 10) / 10} h` : rest ? `${days} days ${rest} h` : `${days} days`}`,
          );
        dated++;
      } else expect(words).toMatch(/^no window in this forecast \(to (Mon|Tue|Wed|Thu|Fri|Sat|Sun) \d{1,2} [A-Z][a-z]{2}\)/);
    }
    // The demo forecast has at least one operation waiting for a later window (seed/scenario.ts limits).
    expect(dated + plan.plans.filter((p) => p.startNow).length).toBeGreaterThan(0);

    // The coordinator's own part: the ledger days, failed e-mails and dataset warnings, in words.
    const attention = page.getByTestId('coordinator-attention');
    expect(await attention.getByTestId('ledger-waiting').textContent()).toMatch(/ledger days? waiting for confirmation/);
    expect(await attention.getByTestId('failed-emails').textContent()).toMatch(/alert e-mail/);
    expect(await page.getByTestId('forecast-age').textContent()).toMatch(
      /^Forecast issued (Mon|Tue|Wed|Thu|Fri|Sat|Sun) \d{1,2} [A-Z][a-z]{2} \d{2}:\d{2}, .* old/,
    );
    // The demo project has every set-up step done: no set-up list.
    expect(await page.getByTestId('setup-steps').count()).toBe(0);
    await screenshot(page, 'overview-coordinator');
  }, 120_000);

  it('lists the set-up steps of the coordinator’s empty second project, each linking to its page', async () => {
    const { page } = browser;
    await signIn('coordinator');
    const projects = await getJson<{ id: string; name: string }[]>(page, '/api/projects');
    const second = projects.find((p) => p.name === DEMO_SECOND_PROJECT.name)!;
    expect(second).toBeDefined();
    await page.goto(`${server.baseUrl}/projects/${second.id}`);
    const steps = page.getByTestId('setup-steps');
    await waitOrScreenshot(page, steps, 'overview-setup-steps');
    // Its parts as the routes list them (the seed gives it no worksite, operation or sea data).
    const [sites, datasets] = await Promise.all([
      getJson<unknown[]>(page, `/api/projects/${second.id}/sites`),
      getJson<unknown[]>(page, `/api/projects/${second.id}/datasets`),
    ]);
    expect(await steps.locator('[data-testid="setup-step-worksites"]').getAttribute('data-done')).toBe(String(sites.length > 0));
    expect(await steps.locator('[data-testid="setup-step-forecasts"]').getAttribute('data-done')).toBe('false');
    expect(datasets).toHaveLength(0);
    expect(await steps.locator('li').count()).toBe(5);
    await steps.getByRole('link', { name: 'Add a worksite' }).click();
    await page.waitForURL(/\/setup\?tab=worksites$/);
    await page.getByRole('button', { name: 'Add worksite' }).waitFor();
  }, 120_000);

  it('draws the map on the built-in coastline with one marker per worksite and no request outside the app', async () => {
    const { page, context } = browser;
    const outside: string[] = [];
    const onRequest = (r: { url(): string }) => {
      const url = r.url();
      if (!url.startsWith(server.baseUrl) && !url.startsWith('data:') && !url.startsWith('blob:')) outside.push(url);
    };
    context.on('request', onRequest);
    try {
      const projectId = await signIn('coordinator');
      await page.goto(`${server.baseUrl}/projects/${projectId}`);
      const map = page.getByTestId('site-map');
      await map.scrollIntoViewIfNeeded();
      await map.locator('canvas.maplibregl-canvas').waitFor({ timeout: 30_000 });
      const sites = await getJson<SiteResponse[]>(page, `/api/projects/${projectId}/sites`);
      const placed = sites.filter((s) => s.latitude !== null && s.longitude !== null);
      expect(placed.length).toBeGreaterThan(0);
      await map.getByTestId('map-site-marker').first().waitFor();
      expect(await map.getByTestId('map-site-marker').count()).toBe(placed.length);
      for (const s of placed) expect(await map.locator(`[data-testid="map-site-marker"][data-site-id="${s.id}"]`).count()).toBe(1);
      expect(await map.getByTestId('map-data-point').count()).toBe(1);
      // The canvas has a size, so the map is drawn, not only created.
      const box = await map.locator('canvas.maplibregl-canvas').boundingBox();
      expect(box?.width ?? 0).toBeGreaterThan(100);
      expect(box?.height ?? 0).toBeGreaterThan(100);
      await page.waitForLoadState('networkidle');
      await screenshot(page, 'overview-map');

      // Click to set a worksite's position: choose it, click the map, and the worksite moves there.
      const target = placed[0];
      await page.getByLabel('Click the map to set the position of').selectOption(target.id);
      const canvas = map.locator('canvas.maplibregl-canvas');
      const cb = (await canvas.boundingBox())!;
      await canvas.click({ position: { x: Math.round(cb.width * 0.3), y: Math.round(cb.height * 0.6) } });
      await page.getByText(new RegExp(`^${target.name} now at`)).waitFor();
      const after = (await getJson<SiteResponse[]>(page, `/api/projects/${projectId}/sites`)).find((s) => s.id === target.id)!;
      expect(after.latitude).not.toBe(target.latitude);
      expect(after.longitude).not.toBe(target.longitude);
      expect(await map.getByTestId('map-site-marker').count()).toBe(placed.length);
    } finally {
      context.off('request', onRequest);
    }
    expect(outside).toEqual([]);
  }, 120_000);

  it('shows the skipper their operations as cards on a 390 × 844 phone with no sideways scroll', async () => {
    const phone = await openBrowser({ width: 390, height: 844 });
    try {
      const { page } = phone;
      await signInAs(page, server.baseUrl, 'skipper@example.com');
      const projectId = await demoProjectId(page, server.baseUrl);
      await page.goto(`${server.baseUrl}/projects/${projectId}`);
      await waitOrScreenshot(page, page.getByTestId('my-operation-card').first(), 'overview-skipper');
      const me = await getJson<MeResponse>(page, '/api/me');
      const plan = await getJson<PlanAnswer>(page, `/api/projects/${projectId}/plan?alpha=true`);
      const mine = plan.plans.filter((p) => p.skipperIds.includes(me.id));
      expect(mine.length).toBeGreaterThan(0);
      const cards = page.getByTestId('my-operation-card');
      expect(await cards.count()).toBe(mine.length);
      for (const p of mine) {
        const card = page.locator(`[data-testid="my-operation-card"][data-operation-id="${p.operationId}"][data-site-id="${p.siteId}"]`);
        expect(await card.count()).toBe(1);
        expect(await card.getByTestId('card-now').textContent()).toMatch(
          /^(may start now|workable, but not for TR = [\d.]+ h from now|marginal|not workable|no data|for information only)$/,
        );
        // With a go-start, the planned finish: go-start + TPOP, and the contingency's end at go-start + TR.
        if (p.earliestStart && !p.informationOnly) {
          const goMs = Date.parse(p.earliestStart);
          const finish = (await card.getByTestId('card-finish').textContent())!;
          // The year is written only when it is not this year (as every go-start on the page).
          const when = (ms: number) =>
            formatInstant(ms, p.timeZone, new Date(ms).getUTCFullYear() === new Date().getUTCFullYear() ? 'dateTime' : 'dateTimeYear');
          const planned = when(goMs + p.tpop * 3_600_000);
          expect(finish).toBe(p.tr > p.tpop ? `${planned}, contingency to ${when(goMs + p.tr * 3_600_000)}` : planned);
        } else expect(await card.getByTestId('card-finish').count()).toBe(0);
        // The next 48 hours as a strip: one cell per forecast hour ahead (at most 48).
        expect(await card.getByTestId('hour-strip').locator('span').count()).toBeGreaterThan(0);
        expect(await card.getByTestId('hour-strip').locator('span').count()).toBeLessThanOrEqual(48);
        expect(await card.getByRole('link', { name: /Hour by hour/ }).getAttribute('href')).toMatch(
          new RegExp(`^/projects/${projectId}/board\\?op=${p.operationId}&site=${p.siteId}&hour=`),
        );
      }
      await page.getByTestId('site-map').locator('canvas.maplibregl-canvas').waitFor({ timeout: 30_000 });
      const widths = await page.evaluate(() => ({
        scroll: document.documentElement.scrollWidth,
        client: document.documentElement.clientWidth,
      }));
      expect(widths.scroll).toBeLessThanOrEqual(widths.client);
      await screenshot(page, 'overview-skipper-phone');
      // The card's link opens the board with the chain behind the card's first hour already open.
      const first = mine[0];
      const firstCard = page.locator(
        `[data-testid="my-operation-card"][data-operation-id="${first.operationId}"][data-site-id="${first.siteId}"]`,
      );
      await firstCard.getByRole('link', { name: /Hour by hour/ }).click();
      await page.getByRole('dialog', { name: /./ }).waitFor({ timeout: 30_000 });
      expect(await page.locator('#hour-chain-title').textContent()).not.toBe('');
      await page.goto(`${server.baseUrl}/projects/${projectId}`);
      // Installable: the page links a web app manifest with our icons.
      const manifestHref = await page.locator('link[rel="manifest"]').getAttribute('href');
      const manifest = (await (await page.request.get(`${server.baseUrl}${manifestHref}`)).json()) as {
        icons: { src: string; sizes: string }[];
        start_url: string;
      };
      expect(manifest.start_url).toBe('/');
      for (const icon of manifest.icons) expect((await page.request.get(`${server.baseUrl}${icon.src}`)).status()).toBe(200);
      expect(manifest.icons.some((i) => i.sizes === '512x512')).toBe(true);
    } finally {
      await phone.close();
    }
  }, 120_000);

  it('shows the client this month’s confirmed downtime against P50 and P90', async () => {
    const { page } = browser;
    // The coordinator proposes the finished days of the last three (the demo stores their forecasts) and confirms one of this month.
    const projectId = await signIn('coordinator');
    const sites = await getJson<SiteResponse[]>(page, `/api/projects/${projectId}/sites`);
    const zone = sites[0].timeZone;
    const today = formatInstant(Date.now(), zone, 'date');
    const isoDay = (ms: number) =>
      new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(ms);
    const from = isoDay(Date.now() - 3 * 86_400_000);
    const to = isoDay(Date.now() - 86_400_000);
    const propose = await page.request.post(`${server.baseUrl}/api/projects/${projectId}/ledger/propose?from=${from}&to=${to}`, {
      headers: { origin: server.baseUrl },
    });
    expect(propose.status()).toBe(200);
    const month = isoDay(Date.now()).slice(0, 7);
    const entries = await getJson<LedgerEntry[]>(page, `/api/projects/${projectId}/ledger?from=${from}&to=${to}`);
    const ofMonth = entries.filter((e) => e.day.startsWith(month) && e.status === 'proposed');
    if (ofMonth.length > 0) {
      const confirm = await page.request.post(`${server.baseUrl}/api/projects/${projectId}/ledger/${ofMonth[0].id}/confirm`, {
        data: {},
        headers: { origin: server.baseUrl },
      });
      expect(confirm.status()).toBe(200);
    }

    await signIn('client');
    await page.goto(`${server.baseUrl}/projects/${projectId}`);
    await waitOrScreenshot(page, page.getByTestId('month-row').first(), 'overview-client');
    const card = page.getByTestId('month-card');
    expect(await card.getByRole('heading', { level: 2 }).textContent()).toMatch(/^Downtime in [A-Z][a-z]+ \d{4}$/);
    // The client sees no coordinator part.
    expect(await page.getByTestId('coordinator-attention').count()).toBe(0);

    // The month's figures are the ledger's own (GET …/ledger/monthly, the client's confirmed days only).
    const monthly = await getJson<LedgerMonthlyAnswer>(
      page,
      `/api/projects/${projectId}/ledger/monthly?from=${month}-01&to=${to < `${month}-01` ? `${month}-01` : to}`,
    );
    const row = monthly.rows.find((r) => r.month === month);
    if (ofMonth.length > 0) {
      expect(row).toBeDefined();
      const text =
        (await card
          .locator(`[data-testid="month-row"]`)
          .filter({ hasText: row!.operationName })
          .filter({ hasText: row!.siteName })
          .first()
          .getByTestId('month-words')
          .textContent()) ?? '';
      const h = (x: number) => `${Math.round(x * 10) / 10} h`;
      expect(text).toContain(`${h(row!.confirmedLostHours)} lost on ${row!.confirmedDays} confirmed day`);
      expect(row!.expectedP50Hours).not.toBeNull();
      // The month's expectation in whole hours (P50, P90 over the hindcast years).
      expect(text).toContain(`P50 ${Math.round(row!.expectedP50Hours!)} h`);
      expect(text).toContain(`P90 ${Math.round(row!.expectedP90Hours!)} h`);
    } else {
      // Today is the first of the month in the worksite's zone: nothing of this month is over yet.
      expect(today).toMatch(/^1 /);
    }
    await screenshot(page, 'overview-client');
  }, 180_000);
});
