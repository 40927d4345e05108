// Vessels and response limits in a real browser against the built app and the seeded demo project:
// the coordinator adds a vessel, imports its RAO table (an invented CSV written here), adds a roll
// limit to an operation through the form, and the board's chain behind an hour shows the roll
// figure; then the same import with the keyboard only (WCAG 2.1 success criterion 2.1.1 "Keyboard").
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import type { VesselRaosResponse, VesselResponse } from '../../shared/api-types-vessels';
import type { OperationResponse } from '../../shared/api-types-sites';
import { openDemoProject, screenshot, useBrowserApp } from '../support/browser';
import { chooseFileWithKeys, tabTo, typeInto } from '../support/keyboard';

const { server, browser, signIn, openProject } = useBrowserApp();

const OPERATION = 'ROV burial survey';

/**
 * An invented RAO table: heave 1 m/m and roll 2 deg/m at every period and heading, so that the
 * figures can be checked by hand whatever the sea: an RAO of 1 gives R_s = Hs/2 exactly
 * (docs/domain.md#vessel-response; R_s = 2√m0 with m0 = Hs²/16, DNV-RP-C205, from memory), hence
 * roll R_s = 2 × Hs/2 = Hs in degrees for Hs in metres, spreading and spectrum shape aside.
 */
const GOOD_CSV = [
  'period_s,heading_deg,heave_m_per_m,roll_deg_per_m',
  ...[4, 10, 20].flatMap((t) => [0, 90, 180].map((h) => `${t},${h},1,2`)),
].join('\n');

/** The same table with a negative roll amplitude on line 3 (refused: amplitudes are not negative). */
const BAD_CSV = GOOD_CSV.split('\n')
  .map((line, i) => (i === 2 ? line.replace(/,2$/, ',-2') : line))
  .join('\n');

const csvFile = (name: string, text: string) => ({ name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') });

const getJson = async <T>(page: Page, path: string): Promise<T> => {
  const res = await page.request.get(`${server.baseUrl}${path}`);
  expect(res.ok(), `GET ${path}`).toBe(true);
  return (await res.json()) as T;
};

/** The first number in a text ("1.23 deg" → 1.23). */
const firstNumber = (text: string | null) => Number(/-?\d+(\.\d+)?/.exec(text ?? '')?.[0]);

describe('vessels and response limits', () => {
  it('imports an RAO table, adds a roll limit through the operation form, and the board chain shows the roll figure', async () => {
    const { page } = browser;
    const projectId = await signIn('coordinator');
    await page.goto(`${server.baseUrl}/`);
    await openDemoProject(page, 'Vessels');
    await page.getByRole('heading', { name: 'Vessels', level: 1 }).waitFor({ timeout: 60_000 });

    // A new vessel.
    await page.getByLabel('Vessel name').fill('Trial workboat');
    await page.getByRole('button', { name: 'Add vessel' }).click();
    await page.getByRole('link', { name: 'Open it to import its RAOs' }).click();
    await page.getByRole('heading', { name: 'Trial workboat', level: 1 }).waitFor({ timeout: 60_000 });

    // The heading convention in words and as a picture (docs/domain.md#vessel-response).
    const convention = page.getByTestId('heading-convention');
    expect(await convention.textContent()).toContain('0° = waves from ahead (head seas), 90° = from starboard, 180° = from astern');
    expect(await convention.getByRole('img', { name: /Relative wave heading/ }).count()).toBe(1);

    // A bad file: every problem by line and column, and no import.
    const fileInput = page.getByLabel('RAO table (CSV)');
    await fileInput.setInputFiles(csvFile('bad-raos.csv', BAD_CSV));
    const problems = page.getByTestId('rao-problems');
    await problems.waitFor({ timeout: 30_000 });
    const row = problems.locator('tbody tr').first();
    expect(await row.locator('td').allTextContents()).toEqual(['3', 'roll_deg_per_m', 'An amplitude cannot be negative']);
    expect(await page.getByRole('button', { name: 'Import this table' }).isDisabled()).toBe(true);

    // The good file: previewed (a plot per response, the responses and points listed), then imported.
    await fileInput.setInputFiles(csvFile('trial-raos.csv', GOOD_CSV));
    const form = page.getByTestId('rao-import-form');
    await form.getByTestId('rao-plot').nth(1).waitFor({ timeout: 30_000 });
    expect(await form.getByTestId('rao-responses').textContent()).toMatch(/Heave.*Roll/);
    expect(await form.getByTestId('rao-points').textContent()).toMatch(/^none/);
    await screenshot(page, 'vessel-import-preview');
    await page.getByRole('button', { name: 'Import this table' }).click();
    await page.getByText('Imported: 2 responses, 3 periods, 3 headings.').waitFor({ timeout: 60_000 });
    // The stored table is shown as the vessel's own.
    await page.getByRole('heading', { name: 'RAO table', exact: true, level: 2 }).waitFor({ timeout: 30_000 });
    const vessels = await getJson<VesselResponse[]>(page, `/api/projects/${projectId}/vessels`);
    const vessel = vessels.find((v) => v.name === 'Trial workboat')!;
    const raos = await getJson<VesselRaosResponse>(page, `/api/projects/${projectId}/vessels/${vessel.id}/raos`);
    expect(raos.periods).toEqual([4, 10, 20]);
    expect(raos.responses.find((r) => r.response === 'roll_deg_per_m')?.values).toEqual([
      [2, 2, 2],
      [2, 2, 2],
      [2, 2, 2],
    ]);
    await screenshot(page, 'vessel-page');

    // A roll limit on an operation, through the form.
    await page.goto(`${server.baseUrl}/projects/${projectId}/setup?tab=operations`);
    await page.getByRole('button', { name: `Edit ${OPERATION}` }).click({ timeout: 60_000 });
    const opForm = page.getByRole('form', { name: `Edit operation ${OPERATION}` });
    await opForm.getByLabel('Vessel', { exact: true }).selectOption({ label: 'Trial workboat' });
    await opForm.getByLabel(/^Vessel heading/).fill('40');
    await opForm.getByRole('button', { name: 'Add a response limit' }).click();
    const limit = opForm.getByTestId('response-limit');
    await limit.getByLabel('Response', { exact: true }).selectOption({ label: 'Roll' });
    await limit.getByLabel('Statistic').selectOption({ label: 'Significant amplitude R_s' });
    // No max yet: refused beside the field by the shared schema, nothing sent.
    await opForm.getByRole('button', { name: 'Save operation' }).click();
    await limit.getByRole('alert').first().waitFor({ timeout: 30_000 });
    await limit.getByLabel(/^Max/).fill('6');
    expect(await limit.textContent()).toContain('(deg)');
    await opForm.getByRole('button', { name: 'Save operation' }).click();
    await page.getByText(`Operation “${OPERATION}” saved.`).waitFor({ timeout: 60_000 });
    // The card says it in words (non-breaking spaces before units are white space to \s).
    const card = page.getByTestId('operation-card').filter({ hasText: OPERATION });
    expect(await card.getByTestId('operation-vessel').textContent()).toBe('Vessel: Trial workboat, heading 40° true');
    expect(await card.getByTestId('limits-summary').textContent()).toMatch(/roll significant ≤ 6\sdeg/);
    const ops = await getJson<OperationResponse[]>(page, `/api/projects/${projectId}/operations`);
    const op = ops.find((o) => o.name === OPERATION)!;
    expect(op.vesselId).toBe(vessel.id);
    expect(op.heading).toBe(40);
    expect(op.limits.responses).toEqual([expect.objectContaining({ response: 'roll_deg_per_m', statistic: 'significant', max: 6 })]);
    expect(op.limits.hsMax).toBe(2); // the other limits kept

    // The board's chain behind an hour of that operation shows the roll figure.
    await page.goto(`${server.baseUrl}/projects/${projectId}/board?days=all`);
    const cell = page.locator(
      `[data-testid="board-row"][data-operation-id="${op.id}"] [data-testid="hour-cell"]:not([data-status="no_data"])`,
    );
    await cell.first().waitFor({ timeout: 60_000 });
    await cell.first().click();
    const panel = page.getByTestId('chain-panel');
    const roll = panel.getByTestId('limit-check').filter({ hasText: 'Roll significant' });
    await roll.waitFor({ timeout: 60_000 });
    const rs = firstNumber(await roll.getByTestId('response-significant').textContent());
    const hs = firstNumber(await roll.getByTestId('response-hs').textContent());
    expect(await roll.getByTestId('response-significant').textContent()).toMatch(/^\d+\.\d{2} deg$/);
    // Roll RAO 2 deg/m everywhere: R_s = 2 × Hs/2 = Hs (see GOOD_CSV), both shown to 0.01.
    expect(hs).toBeGreaterThan(0);
    expect(Math.abs(rs - hs)).toBeLessThanOrEqual(0.011);
    const rowText = (await roll.textContent()) ?? '';
    expect(rowText).toMatch(/6\.0 deg/); // OPLIM in the row, in the response's unit
    expect(rowText).toMatch(/met|broken|no data/);
    expect(await roll.getByTestId('response-driven-by').textContent()).toMatch(/^Driven by the (wind sea|swell)/);
    await roll.scrollIntoViewIfNeeded();
    await screenshot(page, 'vessel-board-chain');
  }, 300_000);

  it('imports an RAO table with the keyboard only', async () => {
    const { page } = browser;
    const projectId = await openProject('coordinator', 'vessels');
    await typeInto(page, page.getByLabel('Vessel name'), 'Keyboard barge');
    await page.keyboard.press('Enter');
    const open = page.getByRole('link', { name: 'Open it to import its RAOs' });
    await tabTo(page, open);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'Keyboard barge', level: 1 }).waitFor({ timeout: 60_000 });

    const fileInput = page.getByLabel('RAO table (CSV)');
    // Space on a file input opens the system's chooser; the test answers it with the file.
    await chooseFileWithKeys(page, fileInput, csvFile('keyboard-raos.csv', GOOD_CSV));
    await page.getByTestId('rao-plot').first().waitFor({ timeout: 30_000 });
    // The values behind a plot open with the keyboard too.
    const summary = page.locator('summary', { hasText: 'Values of roll as a table' });
    await tabTo(page, summary);
    await page.keyboard.press('Enter');
    await page.getByRole('table', { name: /Roll \(deg per m\)/ }).waitFor({ timeout: 10_000 });
    await tabTo(page, page.getByRole('button', { name: 'Import this table' }));
    await page.keyboard.press('Enter');
    await page.getByText('Imported: 2 responses, 3 periods, 3 headings.').waitFor({ timeout: 60_000 });
    await screenshot(page, 'vessel-keyboard-import');
    const vessels = await getJson<VesselResponse[]>(page, `/api/projects/${projectId}/vessels`);
    expect(vessels.find((v) => v.name === 'Keyboard barge')?.responses).toEqual(['heave_m_per_m', 'roll_deg_per_m']);
  }, 240_000);
});
