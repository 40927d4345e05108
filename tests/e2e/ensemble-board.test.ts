// The board shows the ensemble's chances beside the deterministic status (docs/domain.md#forecast-uncertainty),
// readable without colour: a bar along each hour cell with its words in the cell's label, the
// chance to hold TR on the next window, and the runs' Hs spread in the chain behind an hour. The
// demo's latest forecast comes from the local fake with 20 members beside the control.
import { describe, expect, it } from 'vitest';
import type { PlanAnswer } from '../../shared/api-types-plan';
import { screenshot, useBrowserApp } from '../support/browser';

// One year of demo hindcast is enough here: the board plans on the forecast.
const app = useBrowserApp({ env: { DEMO_HINDCAST_YEARS: '1' }, signIn: 'coordinator' });

describe('ensemble chances on the board', () => {
  it('gives every hour its chance in a bar and in words, each window its chance, and the chain the spread', async () => {
    const { server, browser } = app;
    const { page } = browser;
    const projectId = app.projectId;
    await page.goto(`${server.baseUrl}/projects/${projectId}/board?days=all`);
    await page.getByTestId('hour-cell').first().waitFor({ timeout: 90_000 });

    const plan = (await (await page.request.get(`${server.baseUrl}/api/projects/${projectId}/plan?alpha=true`)).json()) as PlanAnswer;
    expect(plan.ensemble).toEqual({ runs: 21 });

    // One bar per hour cell, and the bar's length is the plan's chance.
    const cells = page.getByTestId('hour-cell');
    const bars = page.getByTestId('chance-bar');
    expect(await bars.count()).toBe(await cells.count());

    // The first row's cells against the plan row it draws: the label says the chance in words.
    const row = page.getByTestId('board-row').first();
    const operationId = await row.getAttribute('data-operation-id');
    const siteId = await row.getAttribute('data-site-id');
    const p = plan.plans.find((x) => x.operationId === operationId && x.siteId === siteId)!;
    const rowCells = row.getByTestId('hour-cell');
    const n = await rowCells.count();
    expect(n).toBe(p.times.length);
    for (const i of [0, Math.floor(n / 2), n - 1]) {
      const label = (await rowCells.nth(i).getAttribute('aria-label')) ?? '';
      expect(label).toContain(`chance workable ${Math.round(p.chance![i] * 100)} %`);
      expect(Number(await rowCells.nth(i).getByTestId('chance-bar').getAttribute('data-chance'))).toBe(p.chance![i]);
    }

    // The next window of some row, with its chance to hold TR as a figure.
    const withWindow = plan.plans.filter((x) => x.windows.length > 0 && x.windows[0].chance !== null);
    expect(withWindow.length).toBeGreaterThan(0);
    const texts = await page.getByTestId('window-chance').allTextContents();
    expect(texts.length).toBe(withWindow.length);
    for (const t of texts) expect(t).toMatch(/^Next window .+: chance to hold TR \d{1,3} %$/);

    // The chain behind an hour lists the runs' Hs spread at the worksite.
    await rowCells.first().click();
    const panel = page.getByTestId('chain-panel');
    await panel.getByTestId('chain-spread').waitFor({ timeout: 60_000 });
    const spread = (await panel.getByTestId('chain-spread').textContent()) ?? '';
    for (const k of ['Hs min', 'Hs P10', 'Hs P50', 'Hs P90', 'Hs max']) expect(spread).toContain(k);
    const values = (await panel.getByTestId('chain-spread').locator('dd').allTextContents()).map((x) => Number(x.replace(' m', '')));
    expect(values).toHaveLength(5);
    // Order statistics never decrease (min <= P10 <= P50 <= P90 <= max).
    for (let k = 1; k < 5; k++) expect(values[k]).toBeGreaterThanOrEqual(values[k - 1]);
    expect(await panel.getByTestId('chain-chance').textContent()).toContain(`chance workable ${Math.round(p.chance![0] * 100)} %`);
    await screenshot(page, 'board-ensemble-chances');
  }, 240_000);
});
