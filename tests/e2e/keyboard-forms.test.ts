// Every form reachable by keyboard alone (WCAG 2.1 success criterion 2.1.1 "Keyboard": all
// functionality operable through a keyboard interface, and 2.1.2 "No Keyboard Trap"): on each page
// that holds a form, each visible control the page offers (fields, selects, buttons, links) is
// reached by pressing Tab from the top of the page, and Tab goes on past the last one (no trap).
// Forms that open from a button are opened with Enter on that button, reached by Tab too.
// A radio group is one tab stop (its arrows move inside it), so one radio of a group stands for it.
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp, type DemoAccount } from '../support/browser';

const { server, browser, signIn } = useBrowserApp();

/** Marks every visible, enabled control in `main` that is in the tab order, and returns their descriptions by mark. */
function markControls(page: Page): Promise<Record<string, string>> {
  return page.evaluate(() => {
    const out: Record<string, string> = {};
    const seenRadio = new Set<string>();
    const selector = 'input, select, textarea, button, a[href], summary, [tabindex]';
    let k = 0;
    for (const el of Array.from(document.querySelectorAll<HTMLElement>(`main ${selector.split(', ').join(', main ')}`))) {
      delete el.dataset.kbd;
      if (el.tabIndex < 0 || (el as HTMLInputElement).disabled || el.closest('[inert], [aria-hidden="true"]')) continue;
      if (el instanceof HTMLInputElement && el.type === 'hidden') continue;
      const box = el.getBoundingClientRect();
      const style = getComputedStyle(el);
      // A visually hidden file input (its label is the button people see) still takes the focus.
      const hiddenFile = el instanceof HTMLInputElement && el.type === 'file';
      if (!hiddenFile && (box.width === 0 || box.height === 0 || style.visibility === 'hidden')) continue;
      if (el instanceof HTMLInputElement && el.type === 'radio') {
        if (seenRadio.has(el.name)) continue;
        seenRadio.add(el.name);
        el.dataset.kbdGroup = el.name;
      }
      const mark = String(k++);
      el.dataset.kbd = mark;
      const name = el.getAttribute('aria-label') ?? (el as HTMLInputElement).labels?.[0]?.textContent ?? el.textContent ?? '';
      out[mark] = `${el.tagName.toLowerCase()} "${name.trim().replace(/\s+/g, ' ').slice(0, 50)}"`;
    }
    return out;
  });
}

/** The mark of the focused control (a radio stands for its marked group), or null. */
const focusedMark = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el) return null;
    if (el instanceof HTMLInputElement && el.type === 'radio')
      return document.querySelector<HTMLElement>(`[data-kbd-group="${CSS.escape(el.name)}"]`)?.dataset.kbd ?? null;
    return el.dataset.kbd ?? null;
  });

/**
 * Presses Tab from the top of the page until every marked control has had the focus and the focus
 * has gone on past the last one; returns the controls never reached, and whether the focus left
 * the last control (false: a keyboard trap, or the loop ran out).
 */
async function tabThrough(page: Page): Promise<{ missing: string[]; leftLast: boolean }> {
  const controls = await markControls(page);
  const marks = Object.keys(controls);
  expect(marks.length, 'controls on the page').toBeGreaterThan(0);
  await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
  await page.evaluate(() => window.scrollTo(0, 0));
  const reached = new Set<string>();
  const last = marks[marks.length - 1];
  let leftLast = false;
  // Enough presses for every control plus the header's links and the footer.
  for (let i = 0; i < marks.length + 80; i++) {
    await page.keyboard.press('Tab');
    const m = await focusedMark(page);
    if (m !== null) reached.add(m);
    if (reached.has(last) && m === null) leftLast = true;
    if (leftLast && reached.size === marks.length) break;
  }
  return { missing: marks.filter((m) => !reached.has(m)).map((m) => controls[m]), leftLast };
}

interface FormPage {
  who: DemoAccount;
  /** Address relative to the project (starting with '/') or absolute from the server root ('~/...'). */
  path: string;
  /** Button (by accessible name) pressed with Enter first, reached by Tab, to open the form. */
  open?: string;
}

const FORM_PAGES: FormPage[] = [
  { who: 'coordinator', path: '~/account' },
  { who: 'coordinator', path: '~/wave-calculator' },
  { who: 'coordinator', path: '~/wave-calculator?mode=sea-state' },
  { who: 'coordinator', path: '~/wave-calculator?mode=table' },
  { who: 'coordinator', path: '/setup?tab=worksites', open: 'Add worksite' },
  { who: 'coordinator', path: '/setup?tab=operations', open: 'Add operation' },
  { who: 'coordinator', path: '/setup?tab=alpha' },
  { who: 'coordinator', path: '/setup?tab=exchange' },
  { who: 'coordinator', path: '/alerts' },
  { who: 'coordinator', path: '/settings' },
  { who: 'coordinator', path: '/sea-data/import' },
  { who: 'coordinator', path: '/downtime', open: 'New campaign' },
  { who: 'coordinator', path: '/forecast-skill' },
  { who: 'admin', path: '~/admin/people' },
];

describe('every form reachable with the keyboard alone', () => {
  for (const who of ['coordinator', 'admin'] as const) {
    it(`reaches every control of the ${who}'s forms with Tab, and Tab leaves the last one`, async () => {
      const { page } = browser;
      const projectId = await signIn(who);
      const problems: string[] = [];
      for (const f of FORM_PAGES.filter((x) => x.who === who)) {
        const url = f.path.startsWith('~') ? f.path.slice(1) : `/projects/${projectId}${f.path}`;
        await page.goto(`${server.baseUrl}${url}`);
        await page.locator('main').first().waitFor({ timeout: 60_000 });
        await page.waitForLoadState('networkidle', { timeout: 60_000 }).catch(() => undefined);
        if (f.open) {
          const opener = page.getByRole('button', { name: f.open, exact: true }).first();
          await opener.waitFor({ timeout: 60_000 });
          let opened = false;
          for (let i = 0; i < 150 && !opened; i++) {
            await page.keyboard.press('Tab');
            opened = await opener.evaluate((el) => el === document.activeElement);
          }
          expect(opened, `${url}: Tab reaches "${f.open}"`).toBe(true);
          await page.keyboard.press('Enter');
          await page.locator('main form').first().waitFor({ timeout: 30_000 });
        }
        const where = `${url}${f.open ? ` (${f.open})` : ''}`;
        const { missing, leftLast } = await tabThrough(page);
        for (const c of missing) problems.push(`${where}: ${c} never takes the focus`);
        if (!leftLast) problems.push(`${where}: Tab never leaves the page's last control`);
      }
      expect(problems, problems.join('\n')).toEqual([]);
    }, 900_000);
  }
});
