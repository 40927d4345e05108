import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { WAVE_RANGES } from '../../shared/schemas/wave';
import { screenshot, signInAs, useBrowserApp } from '../support/browser';

// The wave calculator in the browser: typed inputs reach the page's results, the table view lists the
// rows asked for and downloads them. Expected values are computed here, independently of the
// product's physics core.

const G = 9.81; // m/s2, the product's default (common practice, no source)

/**
 * Wavenumber k (rad/m) from the dispersion relation omega^2 = g*k*tanh(k*d) (linear theory,
 * common practice), by plain Newton iteration from a lower bound of the root: both
 * omega^2/g and omega/sqrt(g*d) are below k, since tanh(kd) <= 1 and tanh(kd) <= kd.
 */
function dispersionK(periodS: number, depthM: number): number {
  const omega = (2 * Math.PI) / periodS;
  let k = Math.max((omega * omega) / G, omega / Math.sqrt(G * depthM));
  for (let i = 0; i < 50; i++) {
    const t = Math.tanh(k * depthM);
    const f = G * k * t - omega * omega;
    const df = G * t + G * k * depthM * (1 - t * t);
    k -= f / df;
  }
  const residual = Math.abs(G * k * Math.tanh(k * depthM) - omega * omega) / (omega * omega);
  if (!(residual < 1e-12)) throw new Error(`test solver did not converge (residual ${residual})`);
  return k;
}

/** kd from the dimensionless dispersion relation kd*tanh(kd) = 2*pi*d/L0 (common practice), by Newton. */
function kdFromDOverL0(dOverL0: number): number {
  const target = 2 * Math.PI * dOverL0;
  let x = Math.max(target, Math.sqrt(target));
  for (let i = 0; i < 50; i++) {
    const t = Math.tanh(x);
    x -= (x * t - target) / (t + x * (1 - t * t));
  }
  return x;
}

/** A number as the page prints it ("1,234.5", "−0.25") back to a JS number. */
const shown = (text: string | null) => Number((text ?? '').replace(/,/g, '').replace('−', '-').trim());

const { server, browser } = useBrowserApp();

describe('wave calculator in the browser', () => {
  it('shows the wavelength of a 10 s wave in 10 m of water as typed', async () => {
    const { page } = browser;
    await signInAs(page, server.baseUrl, 'skipper@example.com');
    await page.getByRole('link', { name: 'Wave calculator' }).click();
    await page.getByRole('tab', { name: 'Regular wave' }).waitFor();

    const caption = page.getByTestId('result-caption');
    // Type something else first, so the final figures are surely from the typed inputs.
    await page.getByLabel('Wave period T').fill('8');
    await expect.poll(() => caption.textContent(), { timeout: 15_000 }).toMatch(/^T = 8 s/);

    await page.getByLabel('Wave period T').fill('10');
    await page.getByLabel('Wave height H').fill('2');
    await page.getByLabel('Water depth d').fill('10');
    await expect.poll(() => caption.textContent(), { timeout: 15_000 }).toBe('T = 10 s · H = 2 m · d = 10 m');
    await page.getByText('Updating').waitFor({ state: 'detached' });

    const k = dispersionK(10, 10);
    const wavelength = (2 * Math.PI) / k; // about 92.37 m
    const celerity = wavelength / 10;
    const shownL = shown(await page.getByTestId('quantity-wavelength').getByTestId('value').textContent());
    const shownC = shown(await page.getByTestId('quantity-celerity').getByTestId('value').textContent());
    // The page prints 4 significant figures: at most half a unit of the 4th figure off.
    expect(Math.abs(shownL - wavelength) / wavelength).toBeLessThan(1e-4);
    expect(Math.abs(shownC - celerity) / celerity).toBeLessThan(1e-4);
    // d/L = 10/92.4 = 0.108: intermediate depth (shallow below 1/20, deep above 1/2; common practice).
    expect(await page.getByTestId('depth-class').textContent()).toMatch(/Intermediate depth/);
    await page.getByTestId('linear-caution').waitFor(); // fails the test if it never appears
    await page.locator('figure svg').first().waitFor(); // the lazily loaded profile chart
    await screenshot(page, 'wave-calculator-regular');

    // Out of range: the message from the shared schema, before any request.
    await page.getByLabel('Wave period T').fill('45');
    const message = page.locator('#rw-period-error');
    await message.waitFor();
    expect(await message.textContent()).toContain(`between ${WAVE_RANGES.periodS.min} and ${WAVE_RANGES.periodS.max} s`);
    await page.getByText('For the last valid inputs').waitFor();
  });

  it('lists the wave table rows asked for, sorts them and downloads them as CSV', async () => {
    const { page } = browser;
    await page.getByRole('tab', { name: 'Wave table' }).click();
    const rows = page.getByTestId('wave-table').locator('tbody tr');
    const from = 0.01;
    const to = 0.5;
    let step = 0.01;
    const count = (s: number) => Math.floor((to - from) / s + 1e-9) + 1;
    await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(count(step)); // 50

    // d/L at d/L0 = 0.1 against an independent solve; SPM 1984 Table C-1 lists 0.1410 there (from memory).
    const row = rows.filter({ has: page.locator('td:first-child', { hasText: /^0\.1$/ }) });
    const dOverL = shown(await row.locator('td').nth(1).textContent());
    expect(Math.abs(dOverL - kdFromDOverL0(0.1) / (2 * Math.PI))).toBeLessThan(1e-5);

    step = 0.02;
    await page.getByLabel('Step of d/L0').fill(String(step));
    await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(count(step)); // 25

    // Clicking the d/L0 heading turns the order round: the largest relative depth comes first.
    await page.getByRole('button', { name: /d\/L0/ }).click();
    await expect
      .poll(async () => shown(await rows.first().locator('td').first().textContent()))
      .toBeCloseTo(from + (count(step) - 1) * step, 10);

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download CSV' }).click()]);
    const csv = fs
      .readFileSync((await download.path())!, 'utf8')
      .trim()
      .split(/\r?\n/);
    expect(csv[0]).toBe('d/L0,d/L,L/L0,kd,tanh(kd),sinh(kd),cosh(kd),n,Cg/C0,Ks,Kp_bed');
    expect(csv).toHaveLength(count(step) + 1);
    expect(csv[1].split(',')).toHaveLength(11);
    await screenshot(page, 'wave-calculator-table');
  });

  it('sends the old address of the section to the new one', async () => {
    const { page } = browser;
    // Typed in the address bar: the server answers 301 (issue 17 renamed the section).
    const answer = await page.goto(`${server.baseUrl}/wave-lab`);
    expect(answer?.request().redirectedFrom()?.url()).toBe(`${server.baseUrl}/wave-lab`);
    expect(new URL(page.url()).pathname).toBe('/wave-calculator');
    await page.getByRole('heading', { name: 'Wave calculator' }).waitFor();
    // Followed inside the app (no page load): the client's router redirects as well.
    await page.evaluate(() => {
      window.history.pushState({}, '', '/wave-lab');
      window.dispatchEvent(new PopStateEvent('popstate'));
    });
    await expect.poll(() => new URL(page.url()).pathname, { timeout: 10_000 }).toBe('/wave-calculator');
  });
});
