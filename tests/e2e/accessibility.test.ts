import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { axeViolations, describeViolations, expectAccessible } from '../support/a11y';
import { baseUrl, openBrowser, signIn } from '../support/browser';

// axe-core on the main pages outside the respondent flow (whose screens are checked one by one
// in respondent-phone-flow.test.ts): sign-in and sign-up, at desktop and phone size, the
// respondent stop screen, and, signed in, the workspace's study list, a study's page and Settings.
// Every form control has its own label; names, contrast and landmarks as WCAG 2.x A/AA ask.

describe('the accessibility check', () => {
  let context: BrowserContext;
  let page: Page;
  beforeAll(async () => ({ context, page } = await openBrowser()));
  afterAll(async () => context?.close());

  // Protects the check itself: a page with an unlabelled field must fail it.
  it('fires on a field without a label and names where', async () => {
    await page.setContent('<!doctype html><html lang="en"><head><title>t</title></head><body><main><h1>Form</h1><input type="text" id="bare"></main></body></html>');
    const vs = await axeViolations(page, 'self-check-unlabelled');
    expect(vs.map((v) => v.id)).toContain('label');
    expect(describeViolations(vs)).toContain('#bare');
    await expect(expectAccessible(page, 'self-check-unlabelled')).rejects.toThrow(/label/);
  });

  for (const size of ['desktop', 'phone'] as const) {
    it(`sign-in and sign-up pages (${size})`, async () => {
      const b = await openBrowser({ phone: size === 'phone' });
      try {
        for (const path of ['/sign-in', '/sign-up']) {
          await b.page.goto(`${baseUrl()}${path}`);
          await b.page.getByRole('button').first().waitFor();
          await expectAccessible(b.page, `auth${path.replace('/', '-')}-${size}`);
        }
        // With the field errors shown: each message tied to its field, nothing new to fix.
        await b.page.goto(`${baseUrl()}/sign-in`);
        await b.page.getByRole('button', { name: 'Sign in' }).click();
        await b.page.waitForTimeout(500);
        await expectAccessible(b.page, `auth-sign-in-errors-${size}`);
      } finally {
        await b.context.close();
      }
    });
  }

  it("the respondent stop screen (a link that doesn't exist)", async () => {
    await page.goto(`${baseUrl()}/r/no-such-link-a11y`);
    await page.getByTestId('stopped').waitFor();
    await expectAccessible(page, 'respondent-stopped');
  });

  it('signed in: the workspace home and a study page', async () => {
    await signIn(page, 'analyst@harbourline.example', 'harbour-demo-2026');
    await page.goto(`${baseUrl()}/w/harbourline`);
    await page.getByTestId('study-table').waitFor();
    const home = await axeViolations(page, 'workspace-home');
    const href = await page.getByTestId('study-table').locator('tbody a[href*="/studies/"]').first().getAttribute('href');
    await page.goto(`${baseUrl()}${href}`);
    await page.getByTestId('completes').waitFor();
    const study = await axeViolations(page, 'study-page');
    expect(describeViolations(home)).toBe('');
    expect(describeViolations(study)).toBe('');
  });

  it('settings: each label points at its own field, and the page passes the check', async () => {
    await context.clearCookies(); // the test before signed in as the analyst
    await signIn(page, 'owner@harbourline.example', 'harbour-demo-2026');
    await page.goto(`${baseUrl()}/w/harbourline/settings`);
    const tokenName = page.getByLabel('Token name');
    const workspaceName = page.getByLabel('Workspace name');
    await tokenName.waitFor();
    // Both forms register a field called "name": the labels must still reach different inputs.
    expect(await tokenName.evaluate((el) => el.id)).not.toBe(await workspaceName.evaluate((el) => el.id));
    await page.getByText('Token name', { exact: true }).click();
    expect(await page.evaluate(() => document.activeElement?.id)).toBe(await tokenName.evaluate((el) => el.id));
    expect(describeViolations(await axeViolations(page, 'settings'))).toBe('');
  });
});
