import { describe, expect, it } from 'vitest';
import { openDemoProject, screenshot, signInAndOpenSection, signInAs, useBrowserApp } from '../support/browser';

const { server, browser } = useBrowserApp();

/** A date as the page writes it, e.g. 'Tue 15 Dec 2026'. */
const DATE = /^(Mon|Tue|Wed|Thu|Fri|Sat|Sun) \d{1,2} [A-Z][a-z]{2} \d{4}$/;

describe('the live campaign outlook in the browser', () => {
  it('shows the client the outlook dates and the history chart, with no progress controls', async () => {
    const { page } = browser;
    await signInAndOpenSection(page, server.baseUrl, 'client@example.com', 'Downtime', 'Live outlook: when will we finish?');

    const p50 = page.getByTestId('outlook-p50');
    await p50.waitFor({ timeout: 120_000 });
    const p50Text = (await p50.textContent())!.trim();
    const p90Text = (await page.getByTestId('outlook-p90').textContent())!.trim();
    expect(p50Text).toMatch(DATE);
    expect(p90Text).toMatch(DATE);
    // The P90 finish is not before the P50 finish.
    expect(Date.parse(p90Text.slice(4))).toBeGreaterThanOrEqual(Date.parse(p50Text.slice(4)));
    // The forecast and hindcast parts side by side.
    await page.getByTestId('outlook-parts').getByText('Hindcast alone, from the same start').waitFor();
    // The first step is done (the demo), the others are planned.
    const steps = page.getByTestId('outlook-steps');
    expect(await steps.getByText('Done', { exact: true }).count()).toBe(1);
    expect(await steps.getByText('Planned', { exact: true }).count()).toBe(2);

    // The drift chart: the P50 line through the stored runs, the band to P90 and the planned finish.
    const chart = page.getByTestId('outlook-history-chart');
    await chart.waitFor();
    const points = (await chart.getByTestId('drift-p50').getAttribute('points'))!.trim().split(/\s+/);
    expect(points.length).toBeGreaterThanOrEqual(14);
    expect(await chart.getByTestId('drift-band').count()).toBe(1);
    await chart.getByTestId('drift-planned').waitFor();
    expect(await chart.getByText(/^planned finish /).count()).toBe(1);

    // Clients read: no way to mark progress.
    expect(await page.getByRole('form', { name: 'Mark progress' }).count()).toBe(0);
    await page.getByTestId('outlook-section').scrollIntoViewIfNeeded();
    await screenshot(page, 'outlook-client');

    // On paper: the report states the outlook method, and the outlook prints with its history table.
    await page.emulateMedia({ media: 'print' });
    await page
      .getByTestId('print-report')
      .getByText(/Live outlook: from the time printed/)
      .waitFor();
    expect(await page.getByTestId('outlook-section').isVisible()).toBe(true);
    // Its "Limits used (OPLIM)" names every limit the schedule was worked from: the demo's cable lay
    // (seed/scenario-sites.ts) also has a long-period swell limit and a roll limit at a fixed heading.
    const cableLay = page
      .getByTestId('print-report')
      .getByRole('listitem')
      .filter({ hasText: /^Cable lay, nearshore section:/ });
    const cableLayText = (await cableLay.textContent())!.replace(/\u202f/g, ' ');
    expect(cableLayText).toContain('long-period sea (Tp ≥ 12 s) Hs ≤ 0.8 m');
    expect(cableLayText).toContain('roll most probable max over 3 h ≤ 4 deg');
    expect(cableLayText).toMatch(/vessel heading \d+° true/);
    const printed = page.getByTestId('outlook-history-table').last();
    expect(await printed.isVisible()).toBe(true);
    expect(await printed.locator('tbody tr').count()).toBeGreaterThanOrEqual(14);
    await page.emulateMedia({ media: 'screen' });
  }, 240_000);

  it('lets the coordinator mark the next step under way', async () => {
    const { page } = browser;
    await page.getByRole('button', { name: 'Sign out' }).click();
    await signInAs(page, server.baseUrl, 'coordinator@example.com');
    await openDemoProject(page, 'Downtime');
    const form = page.getByRole('form', { name: 'Mark progress' });
    await form.waitFor({ timeout: 60_000 });
    await form.getByLabel('Now').selectOption('started');
    await form.getByRole('button', { name: 'Save' }).click();
    const steps = page.getByTestId('outlook-steps');
    await steps.getByText('Under way', { exact: true }).waitFor();
    await page.getByTestId('outlook-section').scrollIntoViewIfNeeded();
    await screenshot(page, 'outlook-coordinator');
  }, 120_000);
});
