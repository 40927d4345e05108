import { describe, expect, it } from 'vitest';
import type { LedgerEntry, LedgerMonthlyAnswer } from '../../shared/api-types-downtime';
import { formatDay } from '../../shared/dates';
import { demoProjectId, openDemoProject, screenshot, signInAs, useBrowserApp } from '../support/browser';

const { server, browser } = useBrowserApp();

/** A month with finished days the demo's earlier forecast issues cover (the seed stores the last three days' issues). */
const coveredMonth = () => new Date(Date.now() - 86_400_000).toISOString().slice(0, 7);

async function openDowntime(email: string): Promise<void> {
  const { page } = browser;
  await signInAs(page, server.baseUrl, email);
  await openDemoProject(page, 'Downtime');
  await page.getByRole('heading', { name: 'Downtime schedule' }).waitFor();
  await page.goto(`${page.url().split('?')[0]}?month=${coveredMonth()}`);
}

async function signOut(): Promise<void> {
  const { page } = browser;
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.getByRole('button', { name: 'Sign in' }).waitFor();
}

describe('the downtime schedule in the browser', () => {
  it('lets the coordinator propose the ledger for a month and confirm a day', async () => {
    const { page } = browser;
    await openDowntime('coordinator@example.com');
    // The demo's ledger is kept up to the day before yesterday (seed/demo.ts, seedLedger).
    const month = coveredMonth();
    const base = `${server.baseUrl}/api/projects/${await demoProjectId(page, server.baseUrl)}`;
    const range = `from=${month}-01&to=${month}-31`;
    const confirmedIn = async () =>
      ((await (await page.request.get(`${base}/ledger?${range}`)).json()) as LedgerEntry[]).filter((r) => r.status === 'confirmed');
    const before = (await confirmedIn()).length;
    await page.getByRole('button', { name: 'Propose from data' }).click();
    await page.getByText(/days? proposed/).waitFor({ timeout: 60_000 });
    const confirm = page.getByRole('button', { name: /^Confirm \d{4}-\d{2}-\d{2},/ }).first();
    await confirm.waitFor();
    const label = (await confirm.getAttribute('aria-label'))!;
    await confirm.click();
    await page.getByRole('form', { name: label }).waitFor();
    await page.getByRole('button', { name: 'Confirm day' }).click();
    await page.getByRole('form', { name: label }).waitFor({ state: 'detached' });
    const confirmed = await confirmedIn();
    expect(confirmed).toHaveLength(before + 1);
    const day = confirmed.find((r) => label === `Confirm ${r.day}, ${r.operationName} at ${r.siteName}`)!;
    expect(day).toBeDefined();
    const table = page.getByTestId('ledger-table');
    await expect.poll(() => table.getByText(/Confirmed/).count(), { timeout: 30_000 }).toBe(confirmed.length);
    // The monthly totals count the confirmed day (they refetch after the confirmation).
    const monthly = (await (await page.request.get(`${base}/ledger/monthly?${range}`)).json()) as LedgerMonthlyAnswer;
    const row = monthly.rows.find((r) => r.operationId === day.operationId && r.siteId === day.siteId && r.month === month)!;
    expect(row.confirmedDays).toBe(confirmed.filter((r) => r.operationId === day.operationId && r.siteId === day.siteId).length);
    const rowCells = page
      .getByTestId('ledger-monthly-table')
      .locator('tr')
      .filter({ has: page.locator('th', { hasText: day.operationName }) })
      .filter({ hasText: `at ${day.siteName}` });
    await expect
      .poll(() => rowCells.getByText(`${row.confirmedDays} of ${row.days}`, { exact: true }).count(), { timeout: 30_000 })
      .toBe(1);
    // The rest of that day confirmed in one go, as proposed, after a question.
    const waiting = page.getByTestId('days-waiting');
    const proposedLeft = ((await (await page.request.get(`${base}/ledger?from=${day.day}&to=${day.day}`)).json()) as LedgerEntry[]).filter(
      (r) => r.status === 'proposed',
    );
    // The demo day holds one entry per operation and worksite: the rest are still proposed.
    expect(proposedLeft.length).toBeGreaterThan(0);
    await waiting
      .getByRole('button', { name: `Confirm ${formatDay(day.day, 'day')} as proposed (${proposedLeft.length})`, exact: true })
      .click();
    await page.getByRole('button', { name: 'Confirm the day' }).click();
    await expect
      .poll(async () =>
        ((await (await page.request.get(`${base}/ledger?from=${day.day}&to=${day.day}`)).json()) as LedgerEntry[]).every(
          (r) => r.status === 'confirmed',
        ),
      )
      .toBe(true);
    for (const r of proposedLeft) {
      const now = ((await (await page.request.get(`${base}/ledger?from=${day.day}&to=${day.day}`)).json()) as LedgerEntry[]).find(
        (x) => x.id === r.id,
      )!;
      expect(now).toMatchObject({ status: 'confirmed', lostHours: r.proposedLostHours });
    }
    await screenshot(page, 'downtime-coordinator-ledger');
    await signOut();
  }, 150_000);

  it('shows the client the heat map, the table and the confirmed ledger, without edit controls', async () => {
    const { page } = browser;
    await openDowntime('client@example.com');
    // The first statistics of the 20-year hindcast are computed cold on this request.
    const heatmap = page.getByTestId('downtime-heatmap');
    await heatmap.locator('svg').first().waitFor({ timeout: 90_000 });
    // Every operation at each worksite has a row of 12 month cells with their values written in.
    expect(
      await heatmap
        .locator('svg text')
        .filter({ hasText: /^\d{1,3}$/ })
        .count(),
    ).toBeGreaterThanOrEqual(8 * 12);
    const table = page.getByTestId('workability-table');
    await table.waitFor();
    // One January row per (operation, worksite) pair the plan lists (9 in the demo since the tide-window operation).
    const pairs = (await (
      await page.request.get(`${server.baseUrl}/api/projects/${await demoProjectId(page, server.baseUrl)}/plan`)
    ).json()) as {
      plans: unknown[];
    };
    expect(pairs.plans.length).toBeGreaterThan(0);
    expect(await table.getByRole('row', { name: /^January/ }).count()).toBe(pairs.plans.length);
    expect(await page.getByRole('button', { name: /Propose|New campaign|Edit campaign|Delete|^Confirm/ }).count()).toBe(0);
    // The day the coordinator confirmed; nothing merely proposed.
    const ledger = page.getByTestId('ledger-table');
    await ledger.waitFor();
    // The confirmed days of the month (the demo's kept ledger and the day the coordinator confirmed);
    // nothing merely proposed.
    const month = coveredMonth();
    const all = (await (
      await page.request.get(
        `${server.baseUrl}/api/projects/${await demoProjectId(page, server.baseUrl)}/ledger?from=${month}-01&to=${month}-31`,
      )
    ).json()) as LedgerEntry[];
    expect(all.every((r) => r.status === 'confirmed')).toBe(true);
    expect(all.length).toBeGreaterThan(0);
    expect(await ledger.getByText('Confirmed').count()).toBe(all.length);
    // The campaign's start months read in the order they come, from the planned start's month on:
    // twelve starts within a year, each later than the one above.
    const campaign = page.getByTestId('campaign-table');
    await campaign.waitFor({ timeout: 120_000 });
    const starts = await campaign.locator('tbody th[scope="row"]').allTextContents();
    const ms = starts.map((t) => Date.parse(`${/\d{1,2} [A-Z][a-z]{2} \d{4}/.exec(t)?.[0]} 12:00 UTC`));
    expect(ms).toHaveLength(12);
    expect(ms.every((t, i) => Number.isFinite(t) && (i === 0 || t > ms[i - 1]))).toBe(true);
    expect(ms[11] - ms[0]).toBeLessThan(366 * 86_400_000);
    expect(await ledger.getByText('Proposed').count()).toBe(0);
    await screenshot(page, 'downtime-client');
    await signOut();
  }, 150_000);
});
