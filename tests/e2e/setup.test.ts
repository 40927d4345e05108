// Sites & limits in a real browser against the built app and the seeded demo project: the
// coordinator changes an operation's Hs max through the form (a value out of range is refused
// beside the field first) and finds the change in the audit trail with its before and after; the
// client reads the operations with no edit control anywhere.
//
// Expected values come from the demo seed (seed/scenario-sites.ts: "Rock berm placement" has
// Hs max 1.5 m) and from the shared schema's range (LIMIT_RANGES.hsM.max = 20 m), not from the UI.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { AuditEntryResponse, OperationResponse } from '../../shared/api-types-sites';
import { screenshot, useBrowserApp } from '../support/browser';

const { server, browser, signIn } = useBrowserApp();

async function openTab(page: Page, projectId: string, tab: string): Promise<void> {
  await page.goto(`${server.baseUrl}/projects/${projectId}/setup?tab=${tab}`);
  await page.getByRole('tab', { selected: true }).waitFor();
}

const OPERATION = 'Rock berm placement';

describe('sites & limits', () => {
  it('lets the coordinator change an Hs limit and shows it in the audit trail', async () => {
    const { page } = browser;
    const projectId = await signIn('coordinator');
    await openTab(page, projectId, 'operations');

    const card = page.getByTestId('operation-card').filter({ hasText: OPERATION });
    await card.waitFor({ timeout: 30_000 });
    // Seeded limits, in words (non-breaking spaces before units are white space to \s).
    expect(await card.getByTestId('limits-summary').textContent()).toMatch(/Hs ≤ 1\.5\sm, Tp not in 13–15\ss, wind ≤ 16\sm\/s/);

    await page.getByRole('button', { name: `Edit ${OPERATION}` }).click();
    const form = page.getByRole('form', { name: `Edit operation ${OPERATION}` });
    const hsMax = form.getByRole('textbox', { name: /^Hs max/ });
    expect(await hsMax.inputValue()).toBe('1.5');

    // Out of the schema's range: refused beside the field, nothing sent.
    await hsMax.fill('25');
    await form.getByRole('button', { name: 'Save operation' }).click();
    await form.getByText('Hs max must be at most 20 m').waitFor();
    const unchanged = (await (
      await page.request.get(`${server.baseUrl}/api/projects/${projectId}/operations`)
    ).json()) as OperationResponse[];
    expect(unchanged.find((o) => o.name === OPERATION)?.limits.hsMax).toBe(1.5);

    await hsMax.fill('1.2');
    await form.getByRole('button', { name: 'Save operation' }).click();
    await page.getByText(`Operation “${OPERATION}” saved.`).waitFor();
    expect(await card.getByTestId('limits-summary').textContent()).toMatch(/Hs ≤ 1\.2\sm/);

    // The server holds the new limit, the rest of the limits untouched.
    const ops = (await (await page.request.get(`${server.baseUrl}/api/projects/${projectId}/operations`)).json()) as OperationResponse[];
    const saved = ops.find((o) => o.name === OPERATION)!;
    expect(saved.limits).toEqual({ hsMax: 1.2, tpExcluded: [[13, 15]], windMax: 16 });

    await page.getByRole('tab', { name: 'Audit trail' }).click();
    const entry = page.getByTestId('audit-entry').first();
    await entry.waitFor();
    expect(await entry.getByRole('heading').textContent()).toBe(`Operation “${OPERATION}” changed`);
    expect(await entry.textContent()).toMatch(/Demo Coordinator/);
    const changes = entry.getByTestId('audit-change');
    // Only the changed field is listed, with before and after.
    expect(await changes.count()).toBe(1);
    expect(await changes.first().locator('del').textContent()).toMatch(/^1\.5\sm$/);
    expect(await changes.first().locator('ins').textContent()).toMatch(/^1\.2\sm$/);
    expect(await changes.first().textContent()).toMatch(/^Hs max:/);
    await screenshot(page, 'setup-audit-trail');

    const audit = (await (
      await page.request.get(`${server.baseUrl}/api/projects/${projectId}/audit?entity=operation&limit=1`)
    ).json()) as AuditEntryResponse[];
    expect((audit[0].before as OperationResponse).limits.hsMax).toBe(1.5);
    expect((audit[0].after as OperationResponse).limits.hsMax).toBe(1.2);

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
  });

  it('shows the client the operations with no edit controls', async () => {
    const { page } = browser;
    const projectId = await signIn('client');
    const noEditing = /^(Edit|Add|Delete|Save|Reset|Import|Replace|Remove|\+)/;

    await openTab(page, projectId, 'operations');
    await page.getByTestId('operation-card').first().waitFor({ timeout: 30_000 });
    // The client reads every operation the API lists for the project.
    const listed = (await (await page.request.get(`${server.baseUrl}/api/projects/${projectId}/operations`)).json()) as OperationResponse[];
    expect(listed.length).toBeGreaterThan(0);
    expect(await page.getByTestId('operation-card').count()).toBe(listed.length);
    expect(await page.getByTestId('limits-summary').first().textContent()).toMatch(/≤/);
    expect(await page.getByRole('button', { name: noEditing }).count()).toBe(0);
    await screenshot(page, 'setup-client-operations');

    for (const tab of ['worksites', 'alpha', 'audit', 'exchange']) {
      await openTab(page, projectId, tab);
      await page.waitForLoadState('networkidle');
      expect(await page.getByRole('button', { name: noEditing }).count(), `edit buttons on ${tab}`).toBe(0);
      expect(await page.getByRole('textbox').count(), `inputs on ${tab}`).toBe(0);
    }
    // The alpha table is shown as figures, and the export stays open to every member.
    await openTab(page, projectId, 'alpha');
    await page.getByRole('table').waitFor();
    expect(await page.getByText(/Defaults from memory of DNV-ST-N001/).count()).toBe(1);
    await openTab(page, projectId, 'exchange');
    expect(await page.getByRole('link', { name: 'Download setup (.json)' }).count()).toBe(1);
  });
});
