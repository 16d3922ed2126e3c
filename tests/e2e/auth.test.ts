import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';
import { mailedLink, submitSignUp } from '../support/e2e-accounts';

const DEMO_PASSWORD = 'harbour-demo-2026';

describe('sign-up, sign-out, sign-in in Chromium', () => {
  let context: BrowserContext;
  let page: Page;
  beforeAll(async () => ({ context, page } = await openBrowser()));
  afterAll(async () => context?.close());

  it('shows field errors for bad input without leaving the form', async () => {
    await page.goto(`${baseUrl()}/sign-up`);
    await page.getByLabel('Your name').fill('Quinn');
    await page.getByLabel('E-mail').fill('not-an-address');
    await page.getByLabel('Password').fill('short');
    await page.getByLabel('Workspace name').fill('Q');
    await page.getByRole('button', { name: 'Open workspace' }).click();
    await expect.poll(() => page.getByText('Enter a valid e-mail address').count()).toBe(1);
    expect(await page.getByText('Use at least 10 characters.').count()).toBe(1);
    expect(page.url()).toMatch(/\/sign-up$/);
  });

  it('an existing address gets the same answer as a new one (no account discovery)', async () => {
    await submitSignUp(page, { name: 'Quinn', email: 'owner@harbourline.example', password: 'long-enough-password', workspaceName: 'Quinn pricing' });
    expect(await page.getByText('already exists').count()).toBe(0);
    expect(page.url()).toMatch(/\/sign-up$/);
  });

  it('signs up, confirms the address by the e-mailed link, signs in, signs out and signs in again', async () => {
    const email = `e2e-${Date.now()}@test.example`;
    await submitSignUp(page, { name: 'Rosa Lind', email, password: 'long-enough-password', workspaceName: 'Lind pricing lab' });
    await page.goto(await mailedLink(email, 'confirm'));
    await page.getByRole('button', { name: 'Confirm my address' }).click();
    await page.waitForURL(/\/sign-in\?confirmed=1/);
    expect(await page.getByText('Your e-mail address is confirmed').count()).toBe(1);
    await signIn(page, email, 'long-enough-password');
    await page.waitForURL(/\/w\/lind-pricing-lab/);
    await expect.poll(() => page.getByTestId('signed-in-as').textContent()).toContain('Rosa Lind · Owner');
    // The shell reads /api/me with TanStack Query to fill the workspace switcher.
    await expect.poll(() => page.getByLabel('Workspace').locator('option').first().textContent(), { timeout: 15_000 }).toContain('Lind pricing lab (Owner)');
    await screenshot(page, 'shell');

    // A copy of the session cookie taken now must die with the sign-out (issue 13, finding 8).
    const copied = (await context.cookies()).filter((c) => /session-token/.test(c.name)).map((c) => `${c.name}=${c.value}`).join('; ');
    expect((await fetch(`${baseUrl()}/api/me`, { headers: { cookie: copied } })).status).toBe(200);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    expect((await fetch(`${baseUrl()}/api/me`, { headers: { cookie: copied } })).status).toBe(401);
    await page.goto(`${baseUrl()}/w/lind-pricing-lab`);
    await page.waitForURL(/\/sign-in\?next=/);

    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('wrong-password-here');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByText('do not match an account').count()).toBe(1);
    await page.getByLabel('Password').fill('long-enough-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/w\/lind-pricing-lab$/);
  });

  it('the viewer demo account cannot open an owner-only page', async () => {
    const { context: c2, page: p2 } = await openBrowser();
    try {
      await signIn(p2, 'viewer@harbourline.example', DEMO_PASSWORD);
      await p2.goto(`${baseUrl()}/w/harbourline/settings`);
      await p2.waitForURL(/not-allowed/);
      expect(await p2.getByRole('heading', { name: 'Not allowed' }).count()).toBe(1);
      const api = await p2.evaluate(async () => (await fetch('/api/w/harbourline', { method: 'PATCH', body: '{"name":"Hacked","retentionDays":99}' })).status);
      expect(api).toBe(403);
    } finally {
      await c2.close();
    }
  });
});
