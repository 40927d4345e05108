// Accessibility of every page, for each role of the demo (coordinator, skipper, client, admin), in
// the light and the night theme: axe-core (Deque's rules for WCAG 2.0/2.1 A and AA) finds no serious
// or critical violation. The impact levels are axe-core's own (minor, moderate, serious, critical).
import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { screenshot, useBrowserApp, type DemoAccount } from '../support/browser';

const { server, browser, signIn } = useBrowserApp();

/** WCAG 2.0 and 2.1, levels A and AA, as axe-core tags its rules (axe-core API documentation). */
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
const BLOCKING = new Set(['serious', 'critical']);

/** The pages a role reaches, relative to the server, from the sections each role sees (src/app/sections.ts). */
async function pagesFor(page: Page, account: DemoAccount, projectId: string): Promise<string[]> {
  const get = async <T>(url: string): Promise<T> => {
    const res = await page.request.get(`${server.baseUrl}${url}`);
    if (!res.ok()) throw new Error(`GET ${url} answered ${res.status()}`);
    return (await res.json()) as T;
  };
  const sites = await get<{ id: string }[]>(`/api/projects/${projectId}/sites`);
  const datasets = await get<{ id: string }[]>(`/api/projects/${projectId}/datasets`);
  const project = `/projects/${projectId}`;
  const pages = [
    '/',
    '/account',
    '/wave-calculator',
    '/wave-calculator?mode=sea-state',
    '/wave-calculator?mode=table',
    project,
    `${project}/board`,
    `${project}/conditions/${sites[0].id}`,
    ...['worksites', 'operations', 'alpha', 'audit', 'exchange'].map((tab) => `${project}/setup?tab=${tab}`),
    `${project}/downtime`,
    `${project}/forecast-skill`,
    `${project}/alerts`,
    `${project}/sea-data`,
    `${project}/sea-data/${datasets[0].id}`,
  ];
  if (account === 'coordinator' || account === 'admin') pages.push(`${project}/settings`, `${project}/sea-data/import`);
  if (account === 'admin') pages.push('/admin/people', '/admin/mailbox');
  return pages;
}

/** Waits for the page's data: the network quiet and no spinner left (a page still loading after 90 s is checked as it is). */
async function settle(page: Page): Promise<void> {
  await page.locator('main').first().waitFor({ timeout: 60_000 });
  await page.waitForLoadState('networkidle', { timeout: 90_000 }).catch(() => undefined);
  await page
    .waitForFunction(() => document.querySelectorAll('.animate-spin').length === 0, undefined, { timeout: 90_000 })
    .catch(() => undefined);
}

/** Serious and critical violations on the page as it is, one line each with the elements' selectors. */
async function blockingViolations(page: Page, where: string): Promise<string[]> {
  // Only violations are reported in full (axe-core's resultTypes), which keeps a run short on a big page.
  const result = await new AxeBuilder({ page })
    .withTags(WCAG_TAGS)
    .options({ resultTypes: ['violations'] })
    .analyze();
  return result.violations
    .filter((v) => BLOCKING.has(v.impact ?? ''))
    .map(
      (v) =>
        `${where}: ${v.impact} ${v.id} (${v.help}) at ${v.nodes
          .slice(0, 4)
          .map((n) => n.target.join(' '))
          .join(' | ')}${v.nodes.length > 4 ? ` and ${v.nodes.length - 4} more` : ''}`,
    );
}

/** Sets the theme through the header's own toggle and checks the page follows it. */
async function useTheme(page: Page, theme: 'light' | 'dark'): Promise<void> {
  const isDark = () => page.evaluate(() => document.documentElement.classList.contains('dark'));
  if ((await isDark()) !== (theme === 'dark')) await page.getByRole('button', { name: /^Switch to (light|dark) theme$/ }).click();
  expect(await isDark()).toBe(theme === 'dark');
  // Colours change through CSS transitions (about 150 ms): axe must read the settled colours, not a
  // tab half-way between the two themes, so wait until no transition runs (Web Animations API).
  await page
    .waitForFunction(() => document.getAnimations().every((a) => !(a instanceof CSSTransition) || a.playState !== 'running'), undefined, {
      timeout: 10_000,
    })
    .catch(() => undefined);
}

async function checkPages(account: DemoAccount): Promise<void> {
  const { page } = browser;
  const projectId = await signIn(account);
  const found: string[] = [];
  for (const url of await pagesFor(page, account, projectId)) {
    await page.goto(`${server.baseUrl}${url}`);
    await settle(page);
    for (const theme of ['light', 'dark'] as const) {
      await useTheme(page, theme);
      const violations = await blockingViolations(page, `${account} ${url} (${theme})`);
      if (violations.length > 0) await screenshot(page, `a11y-${account}-${url.replace(/[^a-z0-9]+/gi, '-')}-${theme}`);
      // Said as they are found, so a long run shows its progress.
      for (const v of violations) console.log(v);
      found.push(...violations);
    }
  }
  expect(found, found.join('\n')).toEqual([]);
}

describe('accessibility of every page, each role, both themes (axe-core)', () => {
  it('has no serious or critical violation on the sign-in page', async () => {
    const { page, context } = browser;
    await context.clearCookies();
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    const found: string[] = [];
    for (const theme of ['light', 'dark'] as const) {
      await page.emulateMedia({ colorScheme: theme });
      await page.evaluate(() => localStorage.removeItem('lullwatch-theme'));
      await page.reload();
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      expect(await page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(theme === 'dark');
      found.push(...(await blockingViolations(page, `/sign-in (${theme})`)));
    }
    await page.emulateMedia({ colorScheme: 'light' });
    expect(found, found.join('\n')).toEqual([]);
  }, 120_000);

  for (const account of ['coordinator', 'skipper', 'client', 'admin'] as const) {
    it(`has no serious or critical violation on the pages the ${account} sees`, () => checkPages(account), 1_200_000);
  }
});
