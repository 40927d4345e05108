// Keyboard-only use (WCAG 2.1 success criterion 2.1.1 "Keyboard": all functionality operable through
// a keyboard interface): the coordinator opens the chain behind an hour on the board, moves between
// hours and rows with the arrow keys, steps on and closes the panel with keys; then adds a worksite,
// adds an operation and imports a buoy file with Tab, typing, Space and Enter only (no clicks).
// Addresses are typed into the browser (page.goto) as a keyboard user would.
import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { screenshot, useBrowserApp } from '../support/browser';
import { chooseFileWithKeys, chooseWithKeys, isFocused, tabTo, typeInto } from '../support/keyboard';

const app = useBrowserApp({ signIn: 'coordinator' });
const { server, browser } = app;

// NDBC station 44013, 21 Apr to 5 Jun 2022, a public-domain NOAA file (tests/fixtures/ndbc/README.md).
const NDBC_FILE = path.resolve(import.meta.dirname, '../fixtures/ndbc/44013.txt');

/** "row:col" of the focused hour button of the board. */
const focusedCell = (page: Page) => page.evaluate(() => (document.activeElement as HTMLElement | null)?.dataset.cell ?? null);

describe('keyboard only', () => {
  it('opens the chain behind an hour on the board, moves, steps on and closes it with keys', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}/projects/${app.projectId}/board`);
    // The board is one tab stop (a roving tabindex): the hour that holds it.
    const stop = page.locator('[data-testid="hour-cell"][tabindex="0"]');
    await tabTo(page, stop);
    const [row, col] = (await focusedCell(page))!.split(':').map(Number);

    await page.keyboard.press('ArrowRight');
    expect(await focusedCell(page)).toBe(`${row}:${col + 1}`);
    const rows = await page.getByTestId('board-row').count();
    if (rows > 1) {
      await page.keyboard.press('ArrowDown');
      expect(await focusedCell(page)).toBe(`${row + 1}:${col + 1}`);
      await page.keyboard.press('ArrowUp');
    }
    await page.keyboard.press('ArrowLeft');
    expect(await focusedCell(page)).toBe(`${row}:${col}`);
    await page.keyboard.press('End');
    expect(await focusedCell(page)).not.toBe(`${row}:${col}`);
    await page.keyboard.press('Home');
    expect(await focusedCell(page)).toBe(`${row}:${col}`);

    // Enter opens the chain; the focus moves to its heading, which names the same hour.
    const hourLabel = (await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))) ?? '';
    await page.keyboard.press('Enter');
    const panel = page.getByTestId('chain-panel');
    await panel.getByTestId('limit-check').first().waitFor({ timeout: 60_000 });
    const heading = panel.getByRole('heading', { level: 2 });
    expect(await isFocused(heading)).toBe(true);
    const first = (await heading.textContent()) ?? '';
    expect(first).toContain(hourLabel.split(',')[0]);

    // Step on to the next hour with the panel's own button, by Tab and Enter.
    await tabTo(page, panel.getByRole('button', { name: 'Next hour ›' }));
    await page.keyboard.press('Enter');
    await expect.poll(() => heading.textContent()).not.toBe(first);
    await screenshot(page, 'keyboard-board-chain');

    // Escape closes it, and the focus comes back to the board's hour (WCAG 2.4.3 "Focus Order").
    await page.keyboard.press('Escape');
    await expect.poll(() => panel.count()).toBe(0);
    expect(await focusedCell(page)).toMatch(/^\d+:\d+$/);
  }, 240_000);

  // The setup forms, each filled and sent with keys; the saved values are read back from the API.
  const SETUP_FORMS = [
    {
      what: 'a worksite',
      tab: 'worksites',
      open: 'Add worksite',
      form: 'New worksite',
      fields: [
        [/^Name/, 'Keyboard point'],
        [/^Water depth/, '14'],
        [/^Shore normal/, '200'],
      ],
      submit: 'Add worksite',
      api: 'sites',
      saved: { name: 'Keyboard point', depth: 14, shoreNormal: 200 },
    },
    {
      what: 'an operation',
      tab: 'operations',
      open: 'Add operation',
      form: 'New operation',
      fields: [
        [/^Name/, 'Keyboard survey'],
        [/^Planned duration TPOP/, '6'],
        [/^Contingency TC/, '2'],
        [/^Hs max/, '1.25'],
      ],
      submit: 'Add operation',
      api: 'operations',
      saved: { name: 'Keyboard survey', tpop: 6, tc: 2, limits: expect.objectContaining({ hsMax: 1.25 }) },
    },
  ] as const;

  for (const f of SETUP_FORMS) {
    it(`adds ${f.what} with the keyboard only`, async () => {
      const { page } = browser;
      await page.goto(`${server.baseUrl}/projects/${app.projectId}/setup?tab=${f.tab}`);
      await tabTo(page, page.getByRole('button', { name: f.open }));
      await page.keyboard.press('Enter');
      const form = page.getByRole('form', { name: f.form });
      for (const [label, text] of f.fields) await typeInto(page, form.getByRole('textbox', { name: label }), text);
      await tabTo(page, form.getByRole('button', { name: f.submit }));
      await page.keyboard.press('Enter');
      await expect.poll(() => form.count(), { timeout: 60_000 }).toBe(0);

      const rows = (await (await page.request.get(`${server.baseUrl}/api/projects/${app.projectId}/${f.api}`)).json()) as {
        name: string;
      }[];
      expect(rows.find((r) => r.name === f.saved.name)).toEqual(expect.objectContaining(f.saved));
    }, 240_000);
  }

  it('imports a buoy file with the keyboard only (the file chosen in the chooser the keyboard opens)', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}/projects/${app.projectId}/sea-data/import`);
    const fileInput = page.locator('#file');
    // Space on a file input opens the system's chooser; the test answers it with the file.
    await chooseFileWithKeys(page, fileInput, NDBC_FILE);
    await page.getByTestId('ndbc-preview').waitFor({ timeout: 60_000 });

    await typeInto(page, page.locator('#name'), 'Keyboard buoy 44013');
    await chooseWithKeys(page, page.locator('#kind'), 'Hindcast');
    const anemometer = page.locator('#anemometer');
    // NDBC stdmet anemometers stand about 4-5 m above the sea on a 3 m discus buoy (NDBC station pages, from memory).
    if ((await anemometer.count()) > 0) await typeInto(page, anemometer, '4.1');
    const submit = page.getByRole('button', { name: 'Import the file' });
    await expect.poll(() => submit.isEnabled(), { timeout: 30_000 }).toBe(true);
    await tabTo(page, submit);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/sea-data\/[0-9a-f-]{36}$/, { timeout: 120_000 });
    await screenshot(page, 'keyboard-import-done');

    const datasets = (await (await page.request.get(`${server.baseUrl}/api/projects/${app.projectId}/datasets`)).json()) as {
      name: string;
      kind: string;
    }[];
    expect(datasets.find((d) => d.name === 'Keyboard buoy 44013')?.kind).toBe('hindcast');
  }, 300_000);
});
