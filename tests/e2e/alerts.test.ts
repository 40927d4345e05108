// Alerts in a real browser against the built app and the seeded demo project (forecast from the
// local fake service, e-mail to the local mailbox): the coordinator presses "Re-plan now" and
// reads what the run did; the skipper (subscribed to their operations by default) is e-mailed, and
// the administrator reads that e-mail in the Mailbox. Clients see no coordinator tools.
import { describe, expect, it } from 'vitest';
import { screenshot, useBrowserApp, waitOrScreenshot } from '../support/browser';

const { server, browser, signIn, openProject } = useBrowserApp();

describe('alerts', () => {
  it('lets the coordinator re-plan now and see what the run did', async () => {
    const { page } = browser;
    await openProject('coordinator', 'alerts');
    await page.getByRole('heading', { name: 'What I hear about' }).waitFor({ timeout: 30_000 });

    await page.getByTestId('replan-button').click();
    const result = page.getByTestId('replan-result');
    await waitOrScreenshot(page, result, 'alerts-replan', 90_000);
    const text = (await result.textContent()) ?? '';
    // The demo project uses the forecast service: the run names the forecast, the plans and the outbox.
    expect(text).toMatch(/Planned at \d{2}:\d{2}:\d{2}/);
    expect(text).toMatch(/Forecast issued/);
    expect(text).toMatch(/\d+ plans? \(operation × worksite\)/);
    expect(text).toMatch(/\d+ alert e-mails? written to the outbox/);
    expect(text).toMatch(/E-mail delivery after the run: \d+ e-mails? due, \d+ sent, \d+ not sent this time/);

    // The first run has no previous plan, so every usable window is new: the recent alerts list them.
    await page.getByTestId('alerts-list').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('alerts-list').locator('li').count()).toBeGreaterThan(0);

    // The recurrence form builds the rule and shows its RFC 5545 text.
    await page.getByRole('button', { name: 'Make it recur' }).first().click();
    const rule = await page.getByTestId('rule-text').first().textContent();
    expect(rule).toMatch(/^DTSTART;TZID=[A-Za-z_/]+:\d{8}T\d{6}\s*RRULE:FREQ=WEEKLY;BYDAY=(MO|TU|WE|TH|FR|SA|SU)$/);
    await screenshot(page, 'alerts-coordinator');
  }, 180_000);

  it('shows the admin the e-mail the skipper was sent, in the Mailbox', async () => {
    const { page } = browser;
    await signIn('admin');
    await page.goto(`${server.baseUrl}/admin/mailbox`);
    const list = page.getByTestId('mailbox-list');
    await list.waitFor({ timeout: 30_000 });
    const toSkipper = list.locator('li').filter({ hasText: 'skipper@example.com' });
    expect(await toSkipper.count()).toBeGreaterThan(0);

    await toSkipper.first().getByRole('button').click();
    const view = page.getByTestId('message-view');
    await view.waitFor();
    // The HTML part is shown in an iframe with an empty sandbox; the text part on its own tab.
    expect(await view.locator('iframe').getAttribute('sandbox')).toBe('');
    await view.getByRole('tab', { name: 'Plain text' }).click();
    expect(await view.locator('pre').textContent()).toMatch(/Decision support only/);
    await screenshot(page, 'alerts-mailbox');
  }, 60_000);

  it('gives a client their own choices but no coordinator tools', async () => {
    const { page } = browser;
    await openProject('client', 'alerts');
    await page.getByTestId('subscription-form').waitFor({ timeout: 30_000 });
    await page.getByRole('heading', { name: 'Recent alerts' }).waitFor();
    expect(await page.getByTestId('replan-button').count()).toBe(0);
    expect(await page.getByRole('heading', { name: 'Outbox' }).count()).toBe(0);
    expect(await page.getByRole('heading', { name: 'Recurring operations' }).count()).toBe(0);
  }, 60_000);
});
