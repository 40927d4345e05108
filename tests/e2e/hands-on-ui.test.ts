// Issue 22, what users hit across the UI: the printed downtime report on A4, a skipper's phone at
// 390 px, the heat map's colour key in both themes, tooltips inside the window, and the People
// page asking before it removes someone or changes a role.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, openDemoProject, screenshot, useBrowserApp, type Browser } from '../support/browser';

const { server, browser } = useBrowserApp();

// ISO 216: A4 is 210 mm × 297 mm, i.e. 595.28 × 841.89 PostScript points (1 pt = 1/72 in).
const A4_PT = { w: 595.28, h: 841.89 };
// The report's own page rule: 12 mm margins, so 186 mm of text width = 703 CSS px (96 px per inch).
const A4_TEXT_PX = Math.floor((186 / 25.4) * 96);

/** Every page's /MediaBox [x0 y0 x1 y1] of a PDF, as width and height in points (PDF 1.7, ISO 32000-1 §7.7.3.3). */
function pdfPageSizes(pdf: Buffer): { w: number; h: number }[] {
  const text = pdf.toString('latin1');
  const out: { w: number; h: number }[] = [];
  for (const m of text.matchAll(/\/Type\s*\/Page[^s][\s\S]*?\/MediaBox\s*\[\s*([-\d.]+)\s+([-\d.]+)\s+([-\d.]+)\s+([-\d.]+)\s*\]/g)) {
    out.push({ w: Number(m[3]) - Number(m[1]), h: Number(m[4]) - Number(m[2]) });
  }
  return out;
}

async function signOut(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.getByRole('button', { name: 'Sign in' }).waitFor();
}

/** Signs in afresh (whatever a failed test before left) and waits for the project list, on any screen width. */
async function freshSignIn(page: Page, email: string): Promise<void> {
  await page.context().clearCookies();
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill('lullwatch-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { name: 'Projects' }).waitFor();
}

async function openSection(page: Page, email: string, section: string): Promise<void> {
  await freshSignIn(page, email);
  await openDemoProject(page, section);
}

describe('the printed downtime report (issue 22, item 6)', () => {
  it('fits A4 portrait with every column, and the heat map inside its card', async () => {
    const { page } = browser;
    await openSection(page, 'client@example.com', 'Downtime');
    await page.getByTestId('workability-table').waitFor({ timeout: 120_000 });
    await page.getByTestId('campaign-table').waitFor({ timeout: 120_000 });

    // Lay the page out as the printer does: print media at the width of the A4 text column.
    await page.setViewportSize({ width: A4_TEXT_PX, height: 1000 });
    await page.emulateMedia({ media: 'print' });
    const overflow = await page.evaluate(() => {
      const width = document.documentElement.clientWidth;
      const out: string[] = [];
      for (const el of Array.from(document.querySelectorAll<HTMLElement>('main *'))) {
        const r = el.getBoundingClientRect();
        if (r.width === 0 || getComputedStyle(el).visibility === 'hidden') continue;
        if (r.right > width + 1)
          out.push(`${el.tagName.toLowerCase()} "${(el.textContent ?? '').trim().slice(0, 30)}" ends at ${Math.round(r.right)} px`);
      }
      for (const t of Array.from(document.querySelectorAll<HTMLElement>('main table'))) {
        if (t.getBoundingClientRect().width > 0 && t.scrollWidth > t.clientWidth + 1) out.push(`table ${t.dataset.testid ?? ''} scrolls`);
      }
      return { width, out: out.slice(0, 10) };
    });
    expect(overflow.width).toBe(A4_TEXT_PX);
    expect(overflow.out).toEqual([]);
    // The columns the hands-on run lost on paper are there, inside the text column.
    for (const name of [/Censored \(records\)/, /Censored years/, /^\s*Status\s*$/]) {
      const header = page.locator('main th').filter({ hasText: name }).first();
      if (name.source.includes('Status') && (await header.count()) === 0) continue; // no ledger rows this month
      const box = await header.boundingBox();
      expect(box, String(name)).not.toBeNull();
      expect(box!.x + box!.width, String(name)).toBeLessThanOrEqual(A4_TEXT_PX + 1);
    }
    // Paper gets the heat map as a table that fits, with its colour key; the chart is not printed.
    const heatTables = page.locator('[data-testid="downtime-heatmap"] [data-testid="heat-table"]');
    const shown = await heatTables.evaluateAll((els) =>
      els.filter((e) => e.getBoundingClientRect().width > 0).map((e) => e.getBoundingClientRect().right),
    );
    expect(shown.length).toBe(1);
    expect(shown[0]).toBeLessThanOrEqual(A4_TEXT_PX + 1);
    expect(
      await page
        .locator('[data-testid="downtime-heatmap"] svg')
        .evaluateAll((els) => els.filter((e) => e.getBoundingClientRect().width > 0).length),
    ).toBe(0);
    expect(await page.getByTestId('heat-legend').first().isVisible()).toBe(true);

    // The PDF itself: every page A4 portrait (the report asks for no landscape page).
    const pdf = await page.pdf({ preferCSSPageSize: true, printBackground: true });
    const sizes = pdfPageSizes(pdf);
    expect(sizes.length).toBeGreaterThanOrEqual(2);
    for (const s of sizes) {
      expect(Math.abs(s.w - A4_PT.w)).toBeLessThan(1.5);
      expect(Math.abs(s.h - A4_PT.h)).toBeLessThan(1.5);
    }
    await page.emulateMedia({ media: 'screen' });
    await page.setViewportSize({ width: 1280, height: 860 });
    await signOut(page);
  }, 240_000);
});

describe('a skipper on a 390 px phone (issue 22, phone and looks)', () => {
  let phone: Browser;
  beforeAll(async () => {
    // iPhone 12-15 class screens are 390 × 844 CSS px (common practice, no source).
    phone = await openBrowser({ width: 390, height: 844 });
  }, 60_000);
  afterAll(async () => {
    await phone?.close();
  });

  it('shows a cue that the project tabs scroll, and the next starts on the first screen', async () => {
    const { page } = phone;
    await openSection(page, 'skipper@example.com', 'Watch board');
    const nav = page.getByRole('navigation', { name: 'Project' });
    expect(await nav.evaluate((n) => n.scrollWidth > n.clientWidth)).toBe(true);
    await page.getByTestId('tabs-cue-right').waitFor();
    await nav.evaluate((n) => n.scrollTo({ left: n.scrollWidth }));
    await page.getByTestId('tabs-cue-left').waitFor();

    const first = page.getByTestId('next-starts').locator('li').first();
    await first.waitFor({ timeout: 60_000 });
    const box = (await first.boundingBox())!;
    expect(box.y + box.height).toBeLessThanOrEqual(844);
    const firstText = (await first.textContent())!;
    expect(firstText).toMatch(/May start now|Earliest start: \w{3} \d{1,2} \w{3} \d{2}:\d{2}|No window in this forecast/);
    // With a start, the planned finish too (go-start + TPOP), as on the row.
    if (!/No window in this forecast/.test(firstText)) expect(firstText).toMatch(/Planned finish \w{3} \d{1,2} \w{3} \d{2}:\d{2}/);

    // The "now" tag overlaps no hour label.
    const now = page.getByTestId('now-tag').first();
    if ((await now.count()) > 0) {
      const n = (await now.boundingBox())!;
      const labels = await page.locator('[data-testid="board-scroll"] span.tabular-nums').evaluateAll((els) =>
        els.map((e) => {
          const r = e.getBoundingClientRect();
          return { x: r.x, y: r.y, w: r.width, h: r.height };
        }),
      );
      const hits = labels.filter((l) => l.x < n.x + n.width && n.x < l.x + l.w && l.y < n.y + n.height && n.y < l.y + l.h);
      expect(hits).toEqual([]);
    }
    await screenshot(page, 'phone-board');
  }, 120_000);

  it('keeps heat-map row labels readable and tooltips inside the window', async () => {
    const { page } = phone;
    await page.getByRole('navigation', { name: 'Project' }).getByRole('link', { name: 'Downtime' }).click();
    const table = page.locator('[data-testid="downtime-heatmap"] [data-testid="heat-table"]').first();
    await table.waitFor({ timeout: 120_000 });
    const labels = await table.locator('tbody th').evaluateAll((els) =>
      els.map((e) => ({
        size: parseFloat(getComputedStyle(e).fontSize),
        cut: e.scrollWidth > e.clientWidth + 1,
        text: e.textContent ?? '',
      })),
    );
    expect(labels.length).toBeGreaterThan(0);
    for (const l of labels) {
      // 12 px (0.75 rem) as the smallest text size in the product's type scale (src/index.css).
      expect(l.size, l.text).toBeGreaterThanOrEqual(12);
      expect(l.cut, l.text).toBe(false);
      expect(l.text).not.toMatch(/…/);
    }
    // Every term button near the right edge opens a box that stays inside the 390 px window.
    const buttons = page.locator('button[data-term]');
    const count = await buttons.count();
    expect(count).toBeGreaterThan(0);
    for (let i = 0; i < Math.min(count, 6); i++) {
      const b = buttons.nth(i);
      await b.scrollIntoViewIfNeeded();
      await b.click();
      const tip = page.getByRole('tooltip');
      await tip.waitFor();
      const r = (await tip.boundingBox())!;
      expect(r.x).toBeGreaterThanOrEqual(0);
      expect(r.x + r.width).toBeLessThanOrEqual(390);
      expect(r.y).toBeGreaterThanOrEqual(0);
      expect(r.y + r.height).toBeLessThanOrEqual(844);
      expect((await tip.textContent())!.length).toBeGreaterThan(30);
      await page.keyboard.press('Escape');
      await tip.waitFor({ state: 'detached' });
    }
    await screenshot(page, 'phone-downtime');
  }, 180_000);
});

describe('the heat map colour key in light and dark themes', () => {
  it('shows a key with its ends in each theme', async () => {
    const { page } = browser;
    await openSection(page, 'client@example.com', 'Downtime');
    const legend = page.getByTestId('heat-legend').first();
    await legend.waitFor({ timeout: 120_000 });
    const read = () =>
      legend.evaluate((el) => ({
        text: el.textContent ?? '',
        ramp: getComputedStyle(el.querySelector('span[aria-hidden]')!).backgroundImage,
      }));
    const light = await read();
    expect(light.text).toMatch(/0 %.*100 %.*no data/);
    expect(light.ramp).toMatch(/linear-gradient/);
    const toDark = page.getByRole('button', { name: 'Switch to dark theme' });
    if ((await toDark.count()) > 0) await toDark.click();
    await page.waitForFunction(() => document.documentElement.classList.contains('dark'));
    const dark = await read();
    expect(dark.text).toBe(light.text);
    expect(dark.ramp).not.toBe(light.ramp);
    await screenshot(page, 'downtime-dark-legend');
    await page.getByRole('button', { name: 'Switch to light theme' }).click();
    await signOut(page);
  }, 180_000);
});

describe('the People page asks first (issue 22, role changes)', () => {
  it('asks before removing someone and before changing a role', async () => {
    const { page } = browser;
    await freshSignIn(page, 'admin@example.com');
    await page.getByRole('link', { name: 'People & access' }).click();
    const role = page.getByRole('combobox', { name: /^Role of .* in Varrow Reach/ }).first();
    await role.waitFor();
    const label = (await role.getAttribute('aria-label'))!;
    const before = await role.inputValue();
    const other = before === 'skipper' ? 'client' : 'skipper';

    // A role change waits for a yes.
    await role.selectOption(other);
    const ask = page.getByRole('alertdialog');
    await ask.waitFor();
    expect(await ask.textContent()).toMatch(/Change .* role in .* from .* to /);
    await ask.getByRole('button', { name: 'Cancel' }).click();
    await ask.waitFor({ state: 'detached' });
    expect(await page.getByRole('combobox', { name: label }).inputValue()).toBe(before);
    await page.getByRole('combobox', { name: label }).selectOption(other);
    await page.getByRole('alertdialog').getByRole('button', { name: 'Change role' }).click();
    await page.getByRole('alertdialog').waitFor({ state: 'detached' });
    await expect.poll(() => page.getByRole('combobox', { name: label }).inputValue()).toBe(other);

    // Removing waits for a yes too; Escape keeps the membership.
    const row = page.getByRole('listitem').filter({ has: page.getByRole('combobox', { name: label }) });
    await row.getByRole('button', { name: 'Remove' }).click();
    await page.getByRole('alertdialog').waitFor();
    expect(await page.getByRole('alertdialog').textContent()).toMatch(/^Remove .* from .*\?/);
    await page.keyboard.press('Escape');
    await page.getByRole('alertdialog').waitFor({ state: 'detached' });
    expect(await page.getByRole('combobox', { name: label }).count()).toBe(1);
    // Put the role back as it was.
    await page.getByRole('combobox', { name: label }).selectOption(before);
    await page.getByRole('alertdialog').getByRole('button', { name: 'Change role' }).click();
    // The select already shows the old role while the change is saved; the dialog closes when it is.
    await page.getByRole('alertdialog').waitFor({ state: 'detached' });
    await expect.poll(() => page.getByRole('combobox', { name: label }).inputValue()).toBe(before);

    // A new temporary password asks first too, in the page (no browser pop-up); Cancel issues none.
    await page.getByRole('button', { name: 'New temporary password' }).first().click();
    const askPassword = page.getByRole('alertdialog');
    await askPassword.waitFor();
    expect(await askPassword.textContent()).toMatch(/^Give .* a new temporary password\?.*signed out everywhere/);
    await askPassword.getByRole('button', { name: 'Cancel' }).click();
    await askPassword.waitFor({ state: 'detached' });
    expect(
      await page
        .getByText(/temporary password/i)
        .filter({ hasText: /^[A-Za-z0-9-]{12,}$/ })
        .count(),
    ).toBe(0);
    await screenshot(page, 'people-confirm');
    await signOut(page);
  }, 120_000);
});
