// The conditions page's governing vessel response in a real browser against the built app and the
// seeded demo (a forecast from the local fake service). The demo's cable lay has a roll limit on the
// lay barge (seed/scenario-sites.ts: roll, most probable maximum over 3 h, at most 4 deg), so its
// worksite's charts gain the response chart; what the page says in words is checked against the
// conditions answer of the API, worked here from its per-hour arrays.
import { describe, expect, it } from 'vitest';
import type { ConditionsAnswer } from '../../shared/api-types-plan';
import { screenshot, useBrowserApp } from '../support/browser';

const app = useBrowserApp({ signIn: 'coordinator' });
const { server, browser } = app;

describe('conditions: the governing vessel response', () => {
  it('draws R / R_lim for the operation with a response limit and says which response governs', async () => {
    const { page } = browser;
    const api = `${server.baseUrl}/api/projects/${app.projectId}`;
    const sites = (await (await page.request.get(`${api}/sites`)).json()) as { id: string; name: string }[];
    const route = sites.find((s) => s.name === 'Cable route KP 4.5')!;
    await page.goto(`${server.baseUrl}/projects/${app.projectId}/conditions/${route.id}`);
    await page.getByText(/, hourly\./).waitFor({ timeout: 120_000 });
    await page.getByText('Governing vessel response, R / R_lim').waitFor({ timeout: 60_000 });

    const answer = (await (await page.request.get(`${api}/conditions/${route.id}`)).json()) as ConditionsAnswer;
    const lay = answer.operations.find((o) => o.name === 'Cable lay, nearshore section')!;
    const r = lay.responses!;
    const hours = r.governing.filter((g) => g !== null).length;
    const over = r.ratio.filter((x) => x !== null && x > 1).length;
    const line = page.getByTestId('conditions-response-lines').getByRole('listitem');
    // One line per operation with response limits: only the cable lay has one at this worksite.
    await expect.poll(() => line.count()).toBe(1);
    const text = (await line.textContent()) ?? '';
    expect(text).toContain(`Cable lay, nearshore section: Roll governs ${hours} of ${r.governing.length} hours`);
    expect(text).toContain(`${over} h past the limit`);
    // The limit in words in the list of operations (seed/scenario-sites.ts).
    await page.getByText('Roll most probable max (3 h) ≤ 4 deg').first().waitFor();
    await page
      .getByTestId('conditions-charts')
      .locator('figure')
      .filter({ hasText: 'Governing vessel response' })
      .locator('svg')
      .first()
      .waitFor();
    await screenshot(page, 'conditions-response');
  });
});
