import { describe, expect, it } from 'vitest';
import { openDemoProject, screenshot, signInAs, useBrowserApp } from '../support/browser';

const { server, browser } = useBrowserApp();

describe('signing in and out in the browser', () => {
  it('lets the coordinator open the project and sign out', async () => {
    const { page } = browser;
    await signInAs(page, server.baseUrl, 'coordinator@example.com');
    await page.getByRole('heading', { name: 'Projects' }).waitFor();
    await openDemoProject(page);
    expect(await page.getByTestId('role-badge').textContent()).toBe('Marine coordinator');
    expect(await page.getByRole('link', { name: 'Settings' }).count()).toBe(1);
    expect(await page.getByTestId('caution').textContent()).toMatch(/Decision support only/);
    await screenshot(page, 'coordinator-project');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    // Signed out: a project address sends the visitor back to sign in.
    await page.goto(`${server.baseUrl}/projects`);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
  });

  it('shows the client no administration and no editing controls', async () => {
    const { page } = browser;
    await signInAs(page, server.baseUrl, 'client@example.com');
    expect(await page.getByRole('link', { name: 'People & access' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'New project' }).count()).toBe(0);
    await openDemoProject(page);
    expect(await page.getByTestId('role-badge').textContent()).toBe('Client (read-only)');
    expect(await page.getByRole('link', { name: 'Settings' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /Save|Edit|Delete|Create/ }).count()).toBe(0);
    // The admin page itself is refused.
    await page.goto(`${server.baseUrl}/admin/people`);
    await page.getByRole('heading', { name: 'Projects' }).waitFor();
    await screenshot(page, 'client-project-list');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
  });

  it('lets the admin create a user whose temporary password works', async () => {
    const { page } = browser;
    await signInAs(page, server.baseUrl, 'admin@example.com');
    await page.getByRole('link', { name: 'People & access' }).click();
    await page.getByLabel('Name').fill('Relief Skipper');
    await page.getByLabel('E-mail').fill('relief@example.com');
    await page.getByRole('button', { name: 'Create user' }).click();
    const password = (await page.getByTestId('temporary-password').textContent())!.trim();
    expect(password.length).toBeGreaterThanOrEqual(12);
    await screenshot(page, 'admin-people');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await signInAs(page, server.baseUrl, 'relief@example.com', password);
    // A temporary password must be changed at the first sign-in: the account page comes first.
    await page.getByRole('heading', { name: 'Your account' }).waitFor();
    await page.getByText('You signed in with a temporary password').waitFor();
    await page.locator('#current-password').fill(password);
    await page.locator('#new-password').fill('heron lantern quarry 52');
    await page.locator('#repeat-password').fill('heron lantern quarry 52');
    await page.getByRole('button', { name: 'Change password' }).click();
    // The list loads after the change: wait for the empty-state words (the wait fails the test if they never come).
    await page.getByText('You are not a member of any project yet').waitFor();
    expect(await page.getByRole('link', { name: /Varrow Reach/ }).count()).toBe(0);
    await page.getByRole('button', { name: 'Sign out' }).click();
  });
});
