// The forecast-skill page in the browser (issue 15, skill and calibrated alpha): the coordinator
// opens it from the project navigation and sees the bins, the charts and the calibrated alpha table
// beside the default, then adopts it through the confirm; the client sees no adopt button.
// The demo seeds 60 days of past forecast issues and an invented buoy record (seed/skill-archive.ts).
// Needs the built client (`npm run build`).
import { describe, expect, it } from 'vitest';
import { openDemoProject, screenshot, useBrowserApp, type DemoAccount } from '../support/browser';

const app = useBrowserApp();
const { browser } = app;

async function openSkill(account: DemoAccount): Promise<void> {
  const { page } = browser;
  await app.signIn(account);
  await openDemoProject(page, 'Forecast skill');
  await page.getByRole('heading', { name: 'Forecast skill', level: 1 }).waitFor({ timeout: 60_000 });
}

describe('the forecast-skill page', () => {
  it('shows the coordinator the calibrated table beside the default, and adopts it after a confirm', async () => {
    const { page } = browser;
    await openSkill('coordinator');
    const table = page.getByTestId('calibrated-alpha-table');
    await table.waitFor({ timeout: 120_000 });
    // Default values from docs/domain.md#weather-restricted (from memory of DNV-ST-N001): row 12 h
    // reads 0.65, 0.76, 0.79, 0.80 as the default beside each calibrated value.
    for (const [j, v] of ['0.65', '0.76', '0.79', '0.8'].entries()) {
      await expect.poll(() => page.getByTestId(`alpha-cell-0-${j}`).innerText()).toMatch(new RegExp(`/ ${v.replace('.', '\\.')}\\b`));
    }
    expect(await table.getByRole('columnheader', { name: /calibrated \/ default/ }).count()).toBe(4);
    // The demo archive pairs: counts are shown with each calibrated cell.
    expect(await table.getByText(/\d+ pairs · \d+ issues/).count()).toBeGreaterThan(0);
    await page.getByTestId('skill-bins').waitFor();
    await page.getByRole('img', { name: /Forecast against observed Hs/ }).waitFor();
    await page.getByRole('img', { name: /by lead time/ }).waitFor();
    await page.getByText(/is fragile/).waitFor();
    await page.getByText(/marine warranty approval decides/i).waitFor();
    await screenshot(page, 'forecast-skill-coordinator');

    await page.getByRole('button', { name: 'Adopt calibrated table…' }).click();
    await page.getByRole('alertdialog').waitFor();
    await page.getByRole('button', { name: 'Adopt calibrated table', exact: true }).click();
    await page.getByText(/now the project's alpha table/).waitFor({ timeout: 60_000 });
    await page.getByText(/The project's table in force is its own/).waitFor({ timeout: 60_000 });
  }, 300_000);

  it('shows the client the same figures without the adopt button', async () => {
    const { page } = browser;
    await openSkill('client');
    await page.getByTestId('calibrated-alpha-table').waitFor({ timeout: 120_000 });
    expect(await page.getByRole('button', { name: /Adopt/ }).count()).toBe(0);
  }, 200_000);
});
