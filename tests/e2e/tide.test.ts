// The tide strip of the watch board in a real browser against the built app and the seeded demo:
// the coordinator gives the landfall cofferdam a tide of harmonic constants (through the same API the
// setup page uses), and the board's tide strip under the rows shows its high and low waters.
import { describe, expect, it } from 'vitest';
import type { SiteResponse } from '../../shared/api-types-sites';
import { screenshot, useBrowserApp, waitOrScreenshot } from '../support/browser';

const { server, browser, signIn } = useBrowserApp();

/** The level of a high- or low-water label, which ends with it: "... 3.50 m". */
const levelOf = (label: string) => Number(/([\d.]+) m$/.exec(label)![1]);

/** Every high- or low-water label gives a level within [min, max] m. */
function expectLevelsWithin(labels: string[], min: number, max: number) {
  for (const label of labels) {
    expect(levelOf(label), label).toBeGreaterThanOrEqual(min);
    expect(levelOf(label), label).toBeLessThanOrEqual(max);
  }
}

describe('the tide strip', () => {
  it('shows highs and lows under the board after the coordinator gives the landfall site a tide', async () => {
    const { page } = browser;
    const projectId = await signIn('coordinator');
    const sites: SiteResponse[] = await page.evaluate(async (p) => (await fetch(`/api/projects/${p}/sites`)).json(), projectId);
    const landfall = sites.find((s) => s.name === 'Landfall cofferdam')!;
    // M2 alone, 1.5 m about Z0 2 m: two highs and two lows a day, one M2 period (12.42 h, Schureman 1958) apart.
    const status = await page.evaluate(
      async ({ p, s }) =>
        (
          await fetch(`/api/projects/${p}/sites/${s}`, {
            method: 'PATCH',
            headers: { 'content-type': 'application/json' },
            body: JSON.stringify({
              tide: { source: 'constants', constituents: [{ name: 'M2', amplitude: 1.5, phase: 120 }], z0: 2, datum: 'LAT' },
            }),
          })
        ).status,
      { p: projectId, s: landfall.id },
    );
    expect(status).toBe(200);

    await page.goto(`${server.baseUrl}/projects/${projectId}/board?site=${landfall.id}`);
    const strip = page.getByTestId('tide-strip').first();
    await waitOrScreenshot(page, strip, 'tide-strip');
    expect(await strip.textContent()).toContain('Tide at Landfall cofferdam');
    const highs = await strip.getByTestId('tide-high').allTextContents();
    const lows = await strip.getByTestId('tide-low').allTextContents();
    // At least a day is shown: at least one high and one low water.
    expect(highs.length).toBeGreaterThanOrEqual(1);
    expect(lows.length).toBeGreaterThanOrEqual(1);
    // Highs at Z0 + f·H and lows at Z0 - f·H, f(M2) within 0.96-1.04 (from memory): 3.44-3.56 m and 0.44-0.56 m.
    expectLevelsWithin(highs, 3.44, 3.56);
    expectLevelsWithin(lows, 0.44, 0.56);
    expect(await strip.textContent()).toMatch(/not for navigation/i);
    await screenshot(page, 'board-tide-strip');
  });

  it('the worksite form previews the constants typed: a 3-day curve with highs and lows, before saving', async () => {
    const { page } = browser;
    const projectId = await signIn('coordinator');
    await page.goto(`${server.baseUrl}/projects/${projectId}/setup?tab=worksites`);
    await page.getByRole('button', { name: 'Edit Nearshore trench' }).click({ timeout: 60_000 });
    const form = page.getByRole('form', { name: 'Edit worksite Nearshore trench' });
    await form.getByLabel('Tide from').selectOption('constants');
    // Leave one row: M2 alone, 1.2 m about Z0 1.8 m (invented; the demo's own constants are replaced in the form only).
    while ((await form.getByRole('button', { name: /^Remove constituent/ }).count()) > 1) {
      await form
        .getByRole('button', { name: /^Remove constituent/ })
        .last()
        .click();
    }
    await form.getByLabel('Constituent 1 name').fill('M2');
    await form.getByLabel('Constituent 1 amplitude, m').fill('1.2');
    await form.getByLabel('Constituent 1 phase lag, degrees referred to UTC').fill('40');
    await form.getByLabel(/^Z0, mean sea level above chart datum/).fill('1.8');
    const preview = form.getByTestId('tide-preview');
    try {
      await preview.getByTestId('tide-low').first().waitFor({ timeout: 60_000 });
      await preview.getByRole('img', { name: /Predicted water level at this worksite/ }).waitFor({ timeout: 10_000 });
    } catch (err) {
      await screenshot(page, 'tide-form-failure');
      throw err;
    }
    // Wait for the preview of these constants (an earlier one may still show while the new one loads).
    await expect
      .poll(
        async () => {
          const highs = await preview.getByTestId('tide-high').allTextContents();
          return highs.length > 0 && highs.every((h) => Math.abs(levelOf(h) - 3.0) < 0.06);
        },
        { timeout: 30_000 },
      )
      .toBe(true);
    const highs = await preview.getByTestId('tide-high').allTextContents();
    const lows = await preview.getByTestId('tide-low').allTextContents();
    // 3 days of M2 (one high every 12.42 h, M2 speed 28.9841042 deg/h, Schureman 1958): 5 or 6 highs and lows.
    expect(highs.length).toBeGreaterThanOrEqual(5);
    expect(highs.length).toBeLessThanOrEqual(6);
    expect(lows.length).toBeGreaterThanOrEqual(5);
    // Highs at Z0 + f·H, lows at Z0 - f·H, f(M2) within 0.96-1.04 (from memory): 2.95-3.05 m and 0.55-0.65 m.
    expectLevelsWithin(lows, 0.55, 0.65);
    expect(await preview.textContent()).toMatch(/not for navigation/i);
    expect(await preview.textContent()).toMatch(/surge/i);
    await screenshot(page, 'setup-tide-form');
  });
});
