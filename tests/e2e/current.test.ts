// The predicted tidal current on the conditions page in a real browser against the built app and
// the seeded demo (docs/domain.md#tide): the coordinator places a worksite beside a reference
// current station of the public tide database and chooses that station in the worksite form; the
// conditions page then shows the current over time beside the tide,
// with flood and ebb towards the station's own directions, the station and the cautions.
import { stationsById } from '@neaps/tide-database';
import { describe, expect, it } from 'vitest';
import type { SiteResponse } from '../../shared/api-types-sites';
import { screenshot, useBrowserApp, waitOrScreenshot } from '../support/browser';

const { server, browser, signIn } = useBrowserApp();

/** Pollock Rip Channel (Butler Hole), a NOAA reference current station. */
const STATION_ID = 'noaa/ACT1616';

describe('the current on the conditions page', () => {
  it(
    'shows the chosen station’s predicted current: flood and ebb peaks in its directions, the station and the cautions',
    { timeout: 180_000 },
    async () => {
      const { page } = browser;
      const projectId = await signIn('coordinator');
      // The worksite form: a position beside the station, then the station among the nearest current stations.
      await page.goto(`${server.baseUrl}/projects/${projectId}/setup?tab=worksites`, { timeout: 120_000 });
      await page.getByRole('button', { name: 'Edit Cable route KP 4.5' }).click({ timeout: 60_000 });
      const form = page.getByRole('form', { name: 'Edit worksite Cable route KP 4.5' });
      await form.getByLabel(/^Latitude/).fill('41.56');
      await form.getByLabel(/^Longitude/).fill('-69.99');
      const field = form.getByTestId('current-station-field');
      const choice = field.getByRole('radio', { name: /Pollock Rip Channel \(Butler Hole\)/ });
      await waitOrScreenshot(page, choice, 'current-form', 60_000);
      // Shown with its distance and its flood and ebb directions (about 1.2 km: haversine, mean Earth radius 6371 km).
      expect(await field.textContent()).toMatch(
        /Pollock Rip Channel \(Butler Hole\), 1\.2 km away · US National Oceanic and Atmospheric Administration · flood towards 37°, ebb\s+towards 217°/,
      );
      await choice.check();
      await screenshot(page, 'worksite-form-current-station');
      await form.getByRole('button', { name: 'Save worksite' }).click();
      await form.waitFor({ state: 'detached', timeout: 60_000 });
      const sites: SiteResponse[] = await page.evaluate(async (p) => (await fetch(`/api/projects/${p}/sites`)).json(), projectId);
      const site = sites.find((s) => s.name === 'Cable route KP 4.5')!;
      expect(site.currentStationId).toBe(STATION_ID);

      await page.goto(`${server.baseUrl}/projects/${projectId}/conditions/${site.id}`, { timeout: 120_000 });
      const strip = page.getByTestId('current-strip');
      await waitOrScreenshot(page, strip, 'current-strip', 120_000);
      const station = stationsById.get(STATION_ID)!;
      // The station's own flood and ebb directions, as the database gives them (37° and 217° true).
      const flood = station.current!.flood_direction!;
      const ebb = station.current!.ebb_direction!;
      const peaks = await strip.getByTestId('current-peak').allTextContents();
      // A semi-diurnal stream over the forecast's days: about four peaks a day (M2 period 12.42 h, Schureman 1958).
      expect(peaks.length).toBeGreaterThanOrEqual(4);
      const floods = peaks.filter((p) => p.startsWith('Flood'));
      const ebbs = peaks.filter((p) => p.startsWith('Ebb'));
      expect(floods.length).toBeGreaterThan(0);
      expect(ebbs.length).toBeGreaterThan(0);
      for (const p of floods) expect(p).toMatch(new RegExp(`towards ${flood}°`));
      for (const p of ebbs) expect(p).toMatch(new RegExp(`towards ${ebb}°`));
      // Peak speeds within what the station's constituents allow: at most the mean flow plus the sum of all amplitudes, in knots × 1852/3600 (m/s).
      const bound =
        ((Math.abs(station.current!.mean_flow ?? 0) + station.harmonic_constituents.reduce((a, c) => a + c.amplitude, 0)) * 1852) / 3600;
      for (const p of peaks) {
        const speed = Number(/· ([\d.]+) m\/s/.exec(p)![1]);
        expect(speed).toBeGreaterThan(0);
        expect(speed).toBeLessThanOrEqual(bound);
      }
      expect(await strip.getByTestId('current-station').textContent()).toContain(station.name);
      expect(await strip.getByTestId('current-source').textContent()).toMatch(/predicted tidal current/);
      expect(await strip.textContent()).toMatch(/wind-driven/);
      expect(await strip.textContent()).toMatch(/Not for navigation/);
      await screenshot(page, 'conditions-current');
    },
  );
});
