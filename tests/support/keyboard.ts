// Keyboard-only helpers of the browser tests (WCAG 2.1 success criterion 2.1.1 "Keyboard"): move
// the focus with Tab, type into fields and pick options with the arrow keys, never clicking.
import type { FileChooser, Locator, Page } from 'playwright-core';
import { expect } from 'vitest';

export const isFocused = (target: Locator) => target.evaluate((el) => el === document.activeElement);
export const focusedText = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement;
    return el ? `${el.tagName.toLowerCase()} "${el.getAttribute('aria-label') ?? el.textContent?.trim().slice(0, 40) ?? ''}"` : 'nothing';
  });

/** Presses Tab (Shift+Tab with `back`) until `target` has the focus; fails after `max` presses, saying where the focus went. */
export async function tabTo(page: Page, target: Locator, { back = false, max = 120 } = {}): Promise<void> {
  await target.first().waitFor({ timeout: 60_000 });
  const passed: string[] = [];
  for (let i = 0; i < max; i++) {
    if (await isFocused(target.first())) return;
    await page.keyboard.press(back ? 'Shift+Tab' : 'Tab');
    passed.push(await focusedText(page));
  }
  throw new Error(`${max} presses of Tab never reached the target; the focus went through: ${passed.slice(-15).join(', ')}`);
}

/** Tabs to a field, selects what it holds and types the new text. */
export async function typeInto(page: Page, field: Locator, text: string): Promise<void> {
  await tabTo(page, field);
  await page.keyboard.press('ControlOrMeta+A');
  await page.keyboard.type(text);
}

/** Tabs to a select and picks the option whose label is given, with the arrow keys. */
export async function chooseWithKeys(page: Page, select: Locator, label: string): Promise<void> {
  await tabTo(page, select);
  const options = await select.locator('option').allTextContents();
  const want = options.findIndex((o) => o.trim() === label);
  if (want < 0) throw new Error(`no option "${label}" in ${JSON.stringify(options)}`);
  for (let i = 0; i < options.length && (await select.evaluate((s: HTMLSelectElement) => s.selectedIndex)) !== want; i++) {
    const now = await select.evaluate((s: HTMLSelectElement) => s.selectedIndex);
    await page.keyboard.press(now < want ? 'ArrowDown' : 'ArrowUp');
  }
  expect(await select.evaluate((s: HTMLSelectElement) => s.selectedIndex)).toBe(want);
}

/**
 * Tabs to a file input and opens its chooser with Space, answering it with `files`. On a loaded
 * machine the chooser event now and then does not come for one press: Space is pressed again (at
 * most three times), with the focus checked to be on the input each time.
 */
export async function chooseFileWithKeys(page: Page, input: Locator, files: Parameters<FileChooser['setFiles']>[0]): Promise<void> {
  await tabTo(page, input);
  for (let attempt = 1; ; attempt++) {
    expect(await isFocused(input.first())).toBe(true);
    try {
      const [chooser] = await Promise.all([page.waitForEvent('filechooser', { timeout: 15_000 }), page.keyboard.press('Space')]);
      await chooser.setFiles(files);
      return;
    } catch (err) {
      if (attempt >= 3) throw err;
    }
  }
}
