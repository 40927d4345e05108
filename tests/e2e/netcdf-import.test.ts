// NetCDF import in the browser: the coordinator chooses the 3×3 grid fixture (written by Python's
// netCDF4, tests/fixtures/netcdf/make_fixtures.py), lists its points, keeps the nearest sea point
// to the demo data point (50.041 N 5.988 W: the nearest grid point is land, so (50.0 N, 6.5 W) at
// 36.86 km, haversine computed separately), imports it and sees the dataset's monthly summary.
// Needs the built client (`npx vite build`).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { openDemoProject, screenshot, signInAs, useBrowserApp } from '../support/browser';

const GRID = path.resolve(import.meta.dirname, '../fixtures/netcdf/grid-3x3.nc');

// No invented hindcast: this test brings its own dataset (and the machine is shared).
const { server, browser } = useBrowserApp({ env: { DEMO_HINDCAST_YEARS: '0' } });

describe('NetCDF import page', () => {
  it('imports the grid at the nearest sea point and shows the monthly summary', { timeout: 180_000 }, async () => {
    const { page } = browser;
    await signInAs(page, server.baseUrl, 'coordinator@example.com');
    await openDemoProject(page, 'Sea data');
    await page.getByRole('link', { name: 'Import a file' }).click();
    await page.getByRole('heading', { name: 'Import sea data' }).waitFor();
    await page.locator('#file').setInputFiles(GRID);
    await page.getByRole('heading', { name: '3. Point and water level' }).waitFor();
    expect(await page.locator('#name').inputValue()).toBe('grid-3x3');
    expect(await page.locator('#format option[value=auto]').innerText()).toContain('NetCDF found');

    await page.getByRole('button', { name: 'List the grid points' }).click();
    const table = page.getByTestId('netcdf-points');
    await table.waitFor();
    expect(await table.locator('tbody tr').count()).toBe(9);
    // Sorted by distance: the land point first (all missing, cannot be chosen), then the chosen sea point.
    const land = table.locator('tr[data-point="1,2"]');
    expect(await land.locator('input[type=radio]').isDisabled()).toBe(true);
    const nearest = table.locator('tr[data-point="1,1"]');
    expect((await nearest.innerText()).replace(/\s+/g, ' ')).toMatch(/50\.000° N, 6\.500° W 36\.86 km 0 % Nearest sea point/);
    expect(await nearest.locator('input[type=radio]').isChecked()).toBe(true);
    // Picking another point and back again.
    await table.locator('tr[data-point="2,0"] input[type=radio]').check();
    await page.getByText('Chosen point: index [2,0]').waitFor();
    await nearest.locator('input[type=radio]').check();
    await page.getByText('Point: the sea point nearest the data point').waitFor();
    await screenshot(page, 'netcdf-grid-points');

    await page.locator('#depth').fill('45');
    await page.getByRole('button', { name: 'Import the file' }).click();
    await page.waitForURL(/\/sea-data\/[0-9a-f-]{36}$/, { timeout: 60_000 });
    await page.getByRole('heading', { name: 'grid-3x3' }).waitFor();
    // 48 hourly records written by the script (2024-03-01 00:00 to 03-02 23:00 UTC).
    await page.getByText('Imported 48 records').waitFor();
    await page
      .getByText(/36\.86 km from the data point/)
      .first()
      .waitFor();
    const monthly = page.getByTestId('monthly-table');
    await monthly.waitFor({ timeout: 30_000 });
    expect(await monthly.innerText()).toMatch(/Mar/);
    await screenshot(page, 'netcdf-imported');
  });

  it('still imports a CSV through the same form (columns found, time zone changed, preview shown)', { timeout: 180_000 }, async () => {
    const { page } = browser;
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-e2e-csv-'));
    const csv = path.join(dir, 'small-hindcast.csv');
    // Three hourly rows written here; with the zone Europe/Oslo (UTC+1 in January) 01:00 local is 00:00 UTC.
    fs.writeFileSync(
      csv,
      'time,Hs [m],Tp (s),dir\n2024-01-01 01:00,1.2,8.5,270\n2024-01-01 02:00,1.3,8.6,275\n2024-01-01 03:00,1.4,8.7,280\n',
    );
    try {
      await page.goto(`${server.baseUrl}${new URL(page.url()).pathname.replace(/\/sea-data\/.*$/, '/sea-data/import')}`);
      await page.getByRole('heading', { name: 'Import sea data' }).waitFor();
      await page.locator('#file').setInputFiles(csv);
      await page.getByRole('heading', { name: '3. Columns and preview' }).waitFor();
      expect(await page.locator('#name').inputValue()).toBe('small-hindcast');
      await page.locator('#time-zone').fill('Europe/Oslo');
      await page.getByRole('button', { name: 'Import the file' }).click();
      await page.waitForURL(/\/sea-data\/[0-9a-f-]{36}$/, { timeout: 60_000 });
      await page.getByText('Imported 3 records').waitFor();
      await page
        .getByText(/Europe\/Oslo/)
        .first()
        .waitFor();
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
