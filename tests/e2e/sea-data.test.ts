// Sea data in the browser: a coordinator imports a real NDBC buoy file through the import page;
// a client reads the list and the dataset but sees no import, fetch or delete controls.
// Needs the built client (`npx vite build`).
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { screenshot, signInAndOpenSection, signInAs, useBrowserApp } from '../support/browser';

// NOAA NDBC station 44014, 2017 historical stdmet file (public domain), kept in the shared test data.
const NDBC_FILE = path.resolve(import.meta.dirname, '../fixtures/ndbc/44014h2017.txt');
// Data rows of that file: 8654, from the table in tests/fixtures/ndbc/README.md (two header lines
// excluded); every row there has a time and a wave height, so every row is a record.
const NDBC_ROWS = '8,654';

const { server, browser } = useBrowserApp();
let seaDataPath = '';
let datasetPath = '';

describe('sea data pages', () => {
  it('lets the coordinator import an NDBC file with a progress bar and opens the new dataset', async () => {
    const { page } = browser;
    await signInAndOpenSection(page, server.baseUrl, 'coordinator@example.com', 'Sea data', 'Sea data');
    seaDataPath = new URL(page.url()).pathname;

    await page.getByRole('link', { name: 'Import a file' }).click();
    await page.getByRole('heading', { name: 'Import sea data' }).waitFor();
    await page.locator('#file').setInputFiles(NDBC_FILE);
    // Detected as NDBC in the browser; the preview shows the first record of the file's first row
    // ("2016 12 31 23 50 205  9.9 11.5  1.38  5.00  4.22 198 ...": WVHT 1.38 m, DPD 5.00 s, APD 4.22 s).
    const preview = page.getByTestId('ndbc-preview');
    await preview.waitFor();
    const firstRow = (await preview.locator('tbody tr').first().innerText()).replace(/\s+/g, ' ');
    expect(firstRow).toContain('31 Dec 2016 23:50'); // the one date style of shared/dates.ts
    expect(firstRow).toContain('1.38');
    expect(firstRow).toContain('5.00');
    expect(firstRow).toContain('4.22');
    expect(await page.locator('#name').inputValue()).toBe('44014h2017');
    expect(await page.locator('#kind').inputValue()).toBe('observation');
    // Buoy wind needs its anemometer height before the import is allowed (limits are for wind at 10 m).
    await expect.poll(() => page.getByRole('button', { name: 'Import the file' }).isDisabled()).toBe(true);
    await page.locator('#anemometer').fill('4.1');

    // Record what the progress view shows, however fast the upload is.
    await page.evaluate(() => {
      const seen = { shown: false, maxSentPct: 0 };
      (window as unknown as { __progress: typeof seen }).__progress = seen;
      new MutationObserver(() => {
        const el = document.querySelector('[data-testid=upload-progress]');
        if (!el) return;
        seen.shown = true;
        const bar = el.querySelector('[role=progressbar][aria-label="Sending the file"]');
        seen.maxSentPct = Math.max(seen.maxSentPct, Number(bar?.getAttribute('aria-valuenow') ?? 0));
      }).observe(document.body, { subtree: true, childList: true, attributes: true });
    });
    await page.getByRole('button', { name: 'Import the file' }).click();
    await page.waitForURL(/\/sea-data\/[0-9a-f-]{36}$/, { timeout: 60_000 });
    datasetPath = new URL(page.url()).pathname;
    const progress = await page.evaluate(() => (window as unknown as { __progress: { shown: boolean; maxSentPct: number } }).__progress);
    expect(progress.shown).toBe(true);
    expect(progress.maxSentPct).toBe(100);

    await page.getByRole('heading', { name: '44014h2017' }).waitFor();
    await page.getByText(`Imported ${NDBC_ROWS} records`).waitFor(); // fails the test if it never appears
    await page.getByText(`${NDBC_ROWS}, every 1 h`).waitFor(); // fails the test if it never appears
    await page.getByText('44014h2017.txt (NDBC text)').first().waitFor(); // fails the test if it never appears
    // The lazily loaded chart and the monthly summary appear.
    await page.getByTestId('series-chart').waitFor({ timeout: 30_000 });
    await page.getByTestId('monthly-table').waitFor();
    expect(await page.getByRole('link', { name: 'Download CSV' }).getAttribute('href')).toMatch(/\/csv$/);
    expect(await page.getByRole('button', { name: 'Delete…' }).count()).toBe(1);
    await screenshot(page, 'sea-data-imported-ndbc');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
  });

  it('shows the client the datasets but no import, fetch or delete controls', async () => {
    const { page } = browser;
    expect(seaDataPath).not.toBe('');
    await signInAs(page, server.baseUrl, 'client@example.com');
    await page.goto(`${server.baseUrl}${seaDataPath}`);
    await page.getByRole('heading', { name: 'Sea data' }).waitFor();
    await page.getByRole('link', { name: '44014h2017' }).waitFor();
    expect(await page.getByRole('link', { name: 'Import a file' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Fetch latest forecast' }).count()).toBe(0);
    await screenshot(page, 'sea-data-client-list');
    // The forecast issues (the demo keeps weeks of them, four a day) show the newest 12 until asked for all.
    const forecastRows = page.locator('section[aria-labelledby="forecast-heading"] tbody tr');
    const showAll = page.getByRole('button', { name: /^Show all \d+ forecasts$/ });
    await showAll.waitFor();
    const total = Number((await showAll.innerText()).match(/\d+/)![0]);
    expect(total).toBeGreaterThan(12);
    expect(await forecastRows.count()).toBe(12);
    expect(await forecastRows.first().innerText()).toMatch(/Latest issue/);
    await showAll.click();
    await expect.poll(() => forecastRows.count()).toBe(total);
    await page.getByRole('button', { name: 'Show the newest 12 only' }).waitFor();

    await page.goto(`${server.baseUrl}${datasetPath}`);
    await page.getByRole('heading', { name: '44014h2017' }).waitFor();
    expect(await page.getByRole('link', { name: 'Download CSV' }).count()).toBe(1);
    expect(await page.getByRole('button', { name: /Delete/ }).count()).toBe(0);

    await page.goto(`${server.baseUrl}${seaDataPath}/import`);
    await page.getByRole('heading', { name: /Importing sea data is for marine coordinators/ }).waitFor();
    expect(await page.locator('input[type=file]').count()).toBe(0);
  });
});
