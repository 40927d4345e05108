// Issue 22, "Dates": one time-zone statement per page. Every page that shows times states its zone
// once, under the project's name (the layout's one place for it), on screen and on paper; no section
// repeats a zone beside its times. The demo's worksites are in Europe/London (seed/scenario-sites.ts),
// and sea data are stored in UTC.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, useBrowserApp } from '../support/browser';

const app = useBrowserApp({ signIn: 'coordinator' });
const { server, browser } = app;

/** Zone names as pages write them: IANA names (IANA time zone database naming rules) and UTC. */
const ZONE_NAME =
  /\b(?:Africa|America|Antarctica|Asia|Atlantic|Australia|Europe|Indian|Pacific|Etc)\/[A-Za-z_]+|\bUTC\b|\bGMT(?:[+-]\d+)?\b|\bBST\b/g;

/** The per-section zone words the pages carried before, one per section. */
const OLD_MENTIONS = [
  /Times in the worksites/,
  /All times are UTC/,
  /\(UTC\)/,
  /Times are yours/,
  /\(local\)/,
  /Dates in /,
  /worksite times in/,
  /your local time/i,
  /time zone Europe/,
];

/**
 * Visible text outside form controls and settings (a zone chosen in a select, or the zone a file was
 * read in, marked `data-setting`, is a value, not a statement of the page's times).
 */
async function visibleText(page: Page): Promise<string> {
  return page.evaluate(() => {
    const out: string[] = [];
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    for (let n = walker.nextNode(); n; n = walker.nextNode()) {
      const el = n.parentElement;
      if (!el || el.closest('select, option, datalist, script, style, [aria-hidden="true"], [data-setting]')) continue;
      if (el.getClientRects().length === 0 || getComputedStyle(el).visibility === 'hidden') continue;
      out.push(n.textContent ?? '');
    }
    return out.join(' ');
  });
}

async function expectOneStatement(page: Page, where: string, zone: RegExp): Promise<void> {
  const statement = page.getByTestId('zone-statement');
  await statement.first().waitFor({ timeout: 90_000 });
  expect(await statement.count(), where).toBe(1);
  const said = (await statement.innerText()).trim();
  expect(said, where).toMatch(/^Times are /);
  expect(said, where).toMatch(zone);
  // Dataset names are the user's data (the forecast service's default name says "… UTC"): left out.
  const text = (await visibleText(page)).replace(/Forecast issued \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/g, 'Forecast issued (name)');
  expect(text.match(/Times are /g)?.length, `${where}: "Times are" once`).toBe(1);
  for (const old of OLD_MENTIONS) expect(text, `${where}: ${old}`).not.toMatch(old);
  // Every zone name on the page is the statement's own.
  const inStatement = said.match(ZONE_NAME) ?? [];
  const onPage = text.match(ZONE_NAME) ?? [];
  expect(onPage.length, `${where}: zone names on the page ${JSON.stringify(onPage)}`).toBe(inStatement.length);
}

describe('one time-zone statement per page (issue 22, dates)', () => {
  it('states the zone once on the board, conditions, downtime with its report, alerts, sea data and setup', async () => {
    const { page } = browser;
    const base = `${server.baseUrl}/projects/${app.projectId}`;
    const london = /Europe\/London \((GMT|BST)\), the worksites?’ local time/;

    await page.goto(`${base}/board`);
    await page.getByTestId('hour-cell').first().waitFor({ timeout: 90_000 });
    await expectOneStatement(page, 'board', london);
    await screenshot(page, 'zone-board');

    const sites = (await (await page.request.get(`${server.baseUrl}/api/projects/${app.projectId}/sites`)).json()) as { id: string }[];
    await page.goto(`${base}/conditions/${sites[0].id}`);
    await page.getByText(/, hourly\./).waitFor({ timeout: 90_000 });
    await expectOneStatement(page, 'conditions', /Europe\/London \((GMT|BST)\), the worksite’s local time/);

    await page.goto(`${base}/downtime`);
    await page.getByTestId('workability-table').waitFor({ timeout: 120_000 });
    await page.getByTestId('campaign-table').waitFor({ timeout: 120_000 });
    await expectOneStatement(page, 'downtime', london);
    // The printed report carries the same one statement.
    await page.emulateMedia({ media: 'print' });
    await expectOneStatement(page, 'downtime, printed', london);
    await page.emulateMedia({ media: 'screen' });

    await page.goto(`${base}/alerts`);
    await page.getByRole('heading', { name: 'Recent alerts' }).waitFor();
    await page.getByRole('heading', { name: 'Outbox' }).waitFor();
    await expectOneStatement(page, 'alerts', london);

    await page.goto(`${base}/sea-data`);
    const first = page.locator('a[href*="/sea-data/"]:not([href$="/import"])').first();
    await first.waitFor({ timeout: 60_000 });
    await expectOneStatement(page, 'sea data', /^Times are in UTC, /);
    await first.click();
    await page
      .getByRole('heading', { name: /Import report/ })
      .or(page.getByText(/Per calendar month/))
      .first()
      .waitFor({ timeout: 60_000 });
    await expectOneStatement(page, 'a dataset', /^Times are in UTC, /);
    // Native date pickers display in the browser's locale: each picked date is read back beside
    // its picker in the one date style ("Tue 8 Dec 2026", issue text's own example style).
    const echoes = page.locator('[data-date-echo]');
    await echoes.first().waitFor({ timeout: 30_000 });
    expect(await echoes.count()).toBe(2);
    for (const text of await echoes.allTextContents()) {
      expect(text).toMatch(/^(Mon|Tue|Wed|Thu|Fri|Sat|Sun) \d{1,2} (Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) \d{4}$/);
    }
    await page.goto(`${base}/sea-data/import`);
    await expectOneStatement(page, 'import', /^Times are in UTC, /);

    await page.goto(`${base}/setup?tab=audit`);
    await expectOneStatement(page, 'setup, audit trail', /your own clock/);
  }, 600_000);
});
