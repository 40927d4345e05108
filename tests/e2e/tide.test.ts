// The tide strip of the watch board in a real browser against the built app and the seeded demo:
// the coordinator gives the landfall cofferdam a tide of harmonic constants (through the same API the
// setup page uses), and the board's tide strip under the rows shows its high and low waters.
import { describe, expect, it } from 'vitest';
import type { SiteResponse } from '../../shared/api-types-sites';
import { screenshot, useBrowserApp } from '../support/browser';

const { server, browser, signIn } = useBrowserApp();

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
    try {
      await strip.waitFor({ timeout: 30_000 });
    } catch (err) {
      await screenshot(page, 'tide-strip-failure');
      throw err;
    }
    expect(await strip.textContent()).toContain('Tide at Landfall cofferdam');
    const highs = await strip.getByTestId('tide-high').allTextContents();
    const lows = await strip.getByTestId('tide-low').allTextContents();
    // At least a day is shown: at least one high and one low water.
    expect(highs.length).toBeGreaterThanOrEqual(1);
    expect(lows.length).toBeGreaterThanOrEqual(1);
    // Highs at Z0 + f·H and lows at Z0 - f·H, f(M2) within 0.96-1.04 (from memory): 3.44-3.56 m and 0.44-0.56 m.
    for (const h of highs) {
      const level = Number(/([\d.]+) m$/.exec(h)![1]);
      expect(level).toBeGreaterThanOrEqual(3.44);
      expect(level).toBeLessThanOrEqual(3.56);
    }
    for (const l of lows) {
      const level = Number(/([\d.]+) m$/.exec(l)![1]);
      expect(level).toBeGreaterThanOrEqual(0.44);
      expect(level).toBeLessThanOrEqual(0.56);
    }
    expect(await strip.textContent()).toMatch(/not for navigation/i);
    await screenshot(page, 'board-tide-strip');
  });
});
