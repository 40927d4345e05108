// The watch board in a real browser against the built app and the seeded demo project (a forecast
// from the local fake service): the skipper opens the chain behind an hour, and a lower Hs limit
// set by the coordinator leaves fewer workable hours on the board.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { PlanAnswer } from '../../shared/api-types-plan';
import type { OperationResponse } from '../../shared/api-types-sites';
import { screenshot, useBrowserApp, waitOrScreenshot } from '../support/browser';

const { server, browser, signIn } = useBrowserApp();

async function openBoard(page: Page, projectId: string, query = ''): Promise<void> {
  await page.goto(`${server.baseUrl}/projects/${projectId}/board${query}`);
  await waitForCells(page);
}

/** Waits for the board's hour buttons; on failure keeps a screenshot and says what the page showed. */
const waitForCells = (page: Page) => waitOrScreenshot(page, page.getByTestId('hour-cell').first(), 'board');

/** Workable hour buttons in the rows of one operation (every worksite it is planned at). */
const workableCells = (page: Page, operationId: string) =>
  page.locator(`[data-testid="board-row"][data-operation-id="${operationId}"] [data-testid="hour-cell"][data-status="workable"]`).count();

describe('the watch board', () => {
  it('lets the skipper open the chain behind an hour', async () => {
    const { page } = browser;
    const projectId = await signIn('skipper');
    await openBoard(page, projectId);

    // A skipper starts on their own operations, and never sees the forecast fetch.
    await expect(page.getByTestId('mine-switch').getByRole('switch').isChecked()).resolves.toBe(true);
    expect(await page.getByRole('button', { name: 'Fetch latest forecast' }).count()).toBe(0);
    expect(await page.getByTestId('forecast-info').textContent()).toMatch(/Issued .* ago/);
    expect(await page.getByTestId('alpha-note').textContent()).toMatch(/OPWF = α × OPLIM/);

    // Every row says when the operation may start, in words.
    const words = await page.getByTestId('start-words').allTextContents();
    expect(words.length).toBeGreaterThan(0);
    for (const w of words)
      expect(w).toMatch(/^(▶ )?(May start now|Earliest start: \w{3} \d{1,2} \w{3}( \d{4})? \d{2}:\d{2}|No window in this forecast)/);
    // A row with a start also says when the work is planned to end: go-start + TPOP, and the
    // contingency's end, go-start + TR (docs/domain.md#weather-windows).
    const starting = words.filter((w) => !/No window in this forecast|Not weather-restricted/.test(w)).length;
    const finishes = await page.getByTestId('finish-words').allTextContents();
    expect(finishes.length).toBe(starting);
    for (const f of finishes) expect(f).toMatch(/^Planned finish \w{3} \d{1,2} \w{3}( \d{4})? \d{2}:\d{2}(, contingency to .+)?$/);

    const cell = page.getByTestId('hour-cell').first();
    const label = await cell.getAttribute('aria-label');
    expect(label).toMatch(/^(Mon|Tue|Wed|Thu|Fri|Sat|Sun) \d{1,2} [A-Z][a-z]{2} \d{2}:\d{2}, (workable|marginal|not workable|no data)/);
    await cell.click();

    const panel = page.getByTestId('chain-panel');
    await panel.getByTestId('limit-check').first().waitFor();
    const text = (await panel.textContent()) ?? '';
    expect(text).toContain('Ks');
    expect(text).toContain('Kr');
    expect(text).toMatch(/OPLIM/);
    // The Ks figure is a number, and each limit row names a value and a verdict.
    expect(await panel.getByTestId('chain-ks').textContent()).toMatch(/^\d+\.\d{3}$/);
    const limitRow = (await panel.getByTestId('limit-check').first().textContent()) ?? '';
    expect(limitRow).toMatch(/Value/);
    expect(limitRow).toMatch(/met|broken|no data/);
    // The panel speaks of the same hour as the cell that opened it.
    expect(await panel.getByRole('heading', { level: 2 }).textContent()).toContain(label!.split(',')[0]);
    await screenshot(page, 'board-skipper-chain');

    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForTimeout(300);
    await screenshot(page, 'board-skipper-chain-phone');
    await page.getByRole('button', { name: 'Close the hour’s details' }).click();
    expect(await page.getByTestId('chain-panel').count()).toBe(0);
    await screenshot(page, 'board-skipper-phone');
    await page.setViewportSize({ width: 1280, height: 860 });
  });

  it('shows fewer workable hours after the coordinator lowers an Hs limit', async () => {
    const { page } = browser;
    const projectId = await signIn('coordinator');
    const opsRes = await page.request.get(`${server.baseUrl}/api/projects/${projectId}/operations`);
    expect(opsRes.ok()).toBe(true);
    const op = ((await opsRes.json()) as OperationResponse[]).find((o) => o.name === 'ROV burial survey');
    expect(op?.limits.hsMax).toBe(2);

    // The whole forecast on screen, so the board's cells are all of the plan's hours.
    await openBoard(page, projectId, '?days=all');
    expect(await page.getByRole('button', { name: 'Fetch latest forecast' }).count()).toBe(1);
    const before = await workableCells(page, op!.id);
    expect(before).toBeGreaterThan(0);

    // The board draws what the plan says: the same count of workable hours as the API.
    const planRes = await page.request.get(`${server.baseUrl}/api/projects/${projectId}/plan?alpha=true`);
    const plan = (await planRes.json()) as PlanAnswer;
    const apiWorkable = plan.plans
      .filter((p) => p.operationId === op!.id)
      .reduce((n, p) => n + p.status.filter((s) => s === 'workable').length, 0);
    expect(before).toBe(apiWorkable);
    await screenshot(page, 'board-coordinator-before');

    // Recurring occurrences are drawn on the board, as the Alerts page promises ("Occurrences
    // appear on the board"): the demo's crew transfer recurs Mon, Wed and Fri at 06:00 London time,
    // so a forecast of a few days holds at least one. One mark per occurrence that overlaps the
    // forecast, with the plan's judgement.
    const crew = plan.plans.find((p) => p.operationName.startsWith('Crew transfer'));
    expect(crew).toBeDefined();
    const firstMs = Date.parse(crew!.times[0]);
    const lastMs = Date.parse(crew!.times[crew!.times.length - 1]);
    const inForecast = crew!.occurrences.filter(
      (o) => Date.parse(o.start) + crew!.tr * 3_600_000 > firstMs && Date.parse(o.start) <= lastMs,
    );
    expect(inForecast.length).toBeGreaterThan(0);
    const crewRow = page.locator(`[data-testid="board-row"][data-operation-id="${crew!.operationId}"][data-site-id="${crew!.siteId}"]`);
    const marks = crewRow.getByTestId('occurrence-mark');
    await expect.poll(() => marks.count()).toBe(inForecast.length);
    const drawn = await marks.evaluateAll((els) => els.map((e) => `${e.getAttribute('data-start')} ${e.getAttribute('data-status')}`));
    expect(drawn).toEqual(inForecast.map((o) => `${o.start} ${o.status}`));
    expect(await marks.first().getAttribute('aria-label')).toMatch(
      /^Occurrence (Mon|Wed|Fri) \d{1,2} [A-Z][a-z]{2} 06:00: (workable|marginal|not workable|no data)/,
    );
    // Every other row (no recurrence) has none.
    expect(await page.getByTestId('occurrence-mark').count()).toBe(inForecast.length);
    await crewRow.scrollIntoViewIfNeeded();
    await screenshot(page, 'board-occurrences');

    const patch = await page.request.patch(`${server.baseUrl}/api/projects/${projectId}/operations/${op!.id}`, {
      data: { limits: { ...op!.limits, hsMax: 0.8 } },
      headers: { origin: server.baseUrl },
    });
    expect(patch.status()).toBe(200);
    expect(((await patch.json()) as OperationResponse).limits.hsMax).toBe(0.8);

    await page.reload();
    await waitForCells(page);
    const after = await workableCells(page, op!.id);
    expect(after).toBeLessThan(before);
    await screenshot(page, 'board-coordinator-after');
  });
});
