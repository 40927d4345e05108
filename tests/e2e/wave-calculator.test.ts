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

const { server, browser, signIn } = useBrowserApp();

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

  it('gives a vessel’s roll in a sea state as the API computes it, total and in partitions', async () => {
    const { page } = browser;
    await signIn('skipper'); // a member of the demo project, which has the demo's vessels
    await page.goto(`${server.baseUrl}/wave-calculator?mode=response`);
    await page.getByRole('tab', { name: 'Vessel response', selected: true }).waitFor({ timeout: 60_000 });
    // The demo's lay barge (seed/demo-vessels.ts: invented RAOs, roll peak near 9 s in beam seas).
    await page.getByLabel('Vessel', { exact: true }).selectOption({ label: 'Lay barge Kestrel Reach' });
    const vesselId = await page.getByLabel('Vessel', { exact: true }).inputValue();
    const caption = page.getByTestId('result-caption');
    const rollShown = async () => {
      await page.getByText('Updating').waitFor({ state: 'detached', timeout: 30_000 });
      return shown(await page.getByTestId('response-row-roll_deg_per_m').getByTestId('response-significant').textContent());
    };
    const rollFromApi = (query: Record<string, string>) =>
      page.evaluate(async (q) => {
        const res = await fetch(`/api/wave/response?${new URLSearchParams(q)}`);
        const body = (await res.json()) as { responses: { response: string; significant: number }[] };
        return body.responses.find((r) => r.response === 'roll_deg_per_m')!.significant;
      }, query);

    // Beam seas: waves from 95° on a vessel heading 5° (relative heading 90° = from starboard).
    await page.getByLabel('Vessel heading').fill('5');
    await page.getByLabel('Significant wave height Hs').fill('2.5');
    await page.getByLabel('Peak period Tp').fill('9.5');
    await page.getByLabel('Wave direction').fill('95');
    await expect.poll(() => caption.textContent(), { timeout: 30_000 }).toBe('Lay barge Kestrel Reach heading 5°');
    const beamApi = await rollFromApi({ vesselId, heading: '5', hs: '2.5', tp: '9.5', dir: '95' });
    // The page prints 3 significant figures: at most half a unit of the third figure off the API's answer.
    await expect.poll(async () => Math.abs((await rollShown()) - beamApi) / beamApi, { timeout: 30_000 }).toBeLessThan(5e-3);

    // Head seas roll the vessel less than beam seas (docs/domain.md#vessel-response: beam seas give the roll peak).
    // The demo's roll RAO goes with |sin| of the relative heading (seed/demo-vessels.ts); under cos^2 spreading
    // (n = 2 for a wind sea, docs/domain.md#vessel-response) the mean sin^2 is 1/4 in head seas and 3/4 on the
    // beam, so head-sea roll is about sqrt(1/3) = 0.58 of beam-sea roll (worked by hand).
    await page.getByLabel('Wave direction').fill('5');
    const headApi = await rollFromApi({ vesselId, heading: '5', hs: '2.5', tp: '9.5', dir: '5' });
    expect(headApi / beamApi).toBeGreaterThan(0.45);
    expect(headApi / beamApi).toBeLessThan(0.7);
    await expect.poll(async () => Math.abs((await rollShown()) - headApi) / headApi, { timeout: 30_000 }).toBeLessThan(5e-3);

    // Partitions: a 1.5 m, 6 s wind sea from ahead and a 1 m, 12 s swell on the beam.
    await page.getByLabel(/^Partitions/).check();
    await page.getByLabel('Wind sea Hs').fill('1.5');
    await page.getByLabel('Wind sea Tp').fill('6');
    await page.getByLabel('Wind sea direction').fill('0');
    await page.getByLabel('Swell 1 Hs').fill('1');
    await page.getByLabel('Swell 1 Tp').fill('12');
    await page.getByLabel('Swell 1 direction').fill('90');
    for (const k of ['Hs', 'Tp', 'direction']) await page.getByLabel(`Swell 2 ${k}`).fill('');
    const partitions = [
      { kind: 'windSea', hs: 1.5, tp: 6, dir: 0 },
      { kind: 'swell', hs: 1, tp: 12, dir: 90 },
    ];
    const partApi = await rollFromApi({ vesselId, heading: '5', partitions: JSON.stringify(partitions) });
    await expect.poll(async () => Math.abs((await rollShown()) - partApi) / partApi, { timeout: 30_000 }).toBeLessThan(5e-3);
    await page.locator('[data-testid="spectrum-roll_deg_per_m"] svg').first().waitFor(); // the lazily loaded spectra
    await screenshot(page, 'wave-calculator-response');

    // A swell given in part: the missing value named in words, before any request.
    await page.getByLabel('Swell 1 Tp').fill('');
    const message = page.locator('#rs-swell1-tp-error');
    await message.waitFor();
    expect(await message.textContent()).toContain('Enter the swell 1 Tp');
    await page.getByText('For the last valid inputs').waitFor();
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
