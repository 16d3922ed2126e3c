import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';

// In Chromium: the builder's grid of prices shoppers will see, its warning and one-click fix;
// the launch dialog's seat warning (at 1,280 px and 390 px); a promotion plan on the cautious
// end of the interval, its page saying which basis it uses.

const FIXTURE = path.resolve(__dirname, '../fixtures/demo-price-list.csv');
const DEMO_STUDY = 'Kitchen & home — notice thresholds';
const poll = <T>(fn: () => Promise<T> | T) => expect.poll(fn, { timeout: 15_000 });

describe('ladder grid, launch dialog and plan basis (demo analyst)', () => {
  let context: BrowserContext;
  let page: Page;
  const stamp = Date.now();
  beforeAll(async () => {
    ({ context, page } = await openBrowser());
    await signIn(page, 'analyst@harbourline.example', 'harbour-demo-2026');
  });
  afterAll(async () => context?.close());

  it('shows each base price × rung as shoppers will see it, warns about a rung cents cannot show, and fixes it in one click', async () => {
    await page.goto(`${baseUrl()}/w/harbourline/studies/new`);
    await page.getByLabel('Study name').fill(`Ladder check ${stamp}`);
    await page.getByLabel('Item name').fill('Rolled oats, 500 g');
    await page.getByLabel('Item category').fill('Breakfast');
    const grid = page.getByTestId('ladder-grid');
    await poll(() => grid.locator('tbody tr').count()).toBe(3);
    // Defaults (2.99 / 9.99 / 49, exact cents): every rung within a tenth of its depth.
    expect(await page.getByTestId('ladder-ok').count()).toBe(1);
    expect(await grid.locator('tbody tr').first().locator('td').first().textContent()).toMatch(/2[.,]96.*1\.00 %/);

    await page.getByLabel('Base price 1', { exact: true }).fill('2.49');
    const issues = page.getByTestId('ladder-issues');
    await poll(() => issues.count()).toBe(1);
    expect(await issues.textContent()).toMatch(/2[.,]49 the 1 % rung can only be shown as 0\.8 % off/);
    expect(await grid.locator('td[data-flagged="true"]').count()).toBe(1);
    await screenshot(page, 'builder-ladder-grid-warning');

    await issues.getByRole('button', { name: 'Remove the 1 % rung' }).click();
    await poll(() => page.getByTestId('ladder-ok').count()).toBe(1);
    expect(await page.getByLabel('Discount ladder (%)').inputValue()).toBe('2, 3, 5, 8, 12, 18, 25');
    expect(await grid.locator('thead th').count()).toBe(8);

    await page.getByRole('button', { name: 'Save as draft' }).click();
    await page.waitForURL(/\/studies\/[0-9a-f-]{36}$/);
  });

  it('launch asks in the app’s dialog and warns that 200 completes exceed the seats, linking to Billing', async () => {
    await page.getByRole('button', { name: 'Launch' }).click();
    const dialog = page.getByTestId('confirm-dialog');
    await poll(() => dialog.isVisible()).toBe(true);
    await poll(() => dialog.getByTestId('seat-warning').count()).toBe(1);
    expect(await dialog.getByTestId('seat-warning').textContent()).toMatch(/needs 200 completes, but the workspace has \d+ seats? left/);
    expect(await dialog.getByRole('link', { name: 'Buy seats under Billing' }).getAttribute('href')).toBe('/w/harbourline/billing');
    // Focus stays in the dialog: it starts on Launch and Tab cycles through its own controls.
    for (let i = 0; i < 5; i++) {
      expect(await page.evaluate(() => !!document.activeElement?.closest('dialog'))).toBe(true);
      await page.keyboard.press('Tab');
    }
    await screenshot(page, 'launch-dialog-seat-warning');
    await page.setViewportSize({ width: 390, height: 844 });
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= 390 || !!document.querySelector('dialog[open]'))).toBe(true);
    const box = await dialog.boundingBox();
    expect(box!.x).toBeGreaterThanOrEqual(0);
    expect(box!.x + box!.width).toBeLessThanOrEqual(390);
    await screenshot(page, 'launch-dialog-seat-warning-phone');
    await page.setViewportSize({ width: 1280, height: 860 });
    await page.keyboard.press('Escape');
    await poll(() => dialog.isVisible()).toBe(false);
    expect(await page.locator('[data-state="draft"]').count()).toBe(1);
  });

  it('a plan on the cautious end of the interval says so on its page', async () => {
    const listName = `Basis list ${stamp}`;
    await page.goto(`${baseUrl()}/w/harbourline/promotions/price-lists/new`);
    await page.locator('#price-list-file').setInputFiles(FIXTURE);
    await page.getByLabel('Price list name').fill(listName);
    await page.getByLabel('Currency of the prices').selectOption('EUR');
    await page.getByRole('button', { name: 'Check file' }).click();
    await poll(() => page.getByText('Ready to store').count()).toBe(1);
    await page.getByRole('button', { name: 'Store price list' }).click();
    await page.waitForURL(/\/promotions$/);

    await page.goto(`${baseUrl()}/w/harbourline/promotions/plans/new`);
    await page.getByLabel('Plan name').fill(`Cautious floors ${stamp}`);
    const study = page.getByLabel('Fitted study');
    await study.selectOption((await study.locator('option', { hasText: DEMO_STUDY }).getAttribute('value'))!);
    const list = page.getByLabel('Price list');
    await list.selectOption((await list.locator('option', { hasText: listName }).getAttribute('value'))!);
    const basis = page.getByTestId('floor-basis');
    // The share of shoppers is offered only when the study's fit reports it; otherwise it says why.
    const share = basis.getByLabel(/Discount a chosen share of shoppers notices/);
    if (await share.isDisabled()) expect(await basis.textContent()).toMatch(/Not available: /);
    await basis.getByLabel(/Cautious end of the 95 % interval/).check();
    await page.getByLabel('Price ending').selectOption('ends-99');
    expect(await page.getByLabel(/Ending may deepen the discount by at most/).inputValue()).toBe('2');
    const deadline = Date.now() + 90_000;
    while (!/\/plans\/[0-9a-f-]{36}$/.test(page.url())) {
      await page.getByRole('button', { name: 'Create plan' }).click();
      const outcome = await Promise.race([
        page.waitForURL(/\/plans\/[0-9a-f-]{36}$/, { timeout: 15_000 }).then(() => 'created'),
        page.getByTestId('plan-status').waitFor({ timeout: 15_000 }).then(() => 'status'),
      ]);
      if (outcome === 'created') break;
      expect((await page.getByTestId('plan-status').textContent()) ?? '').toMatch(/still being computed/);
      if (Date.now() > deadline) throw new Error('the demo study fit did not finish in time');
      await page.waitForTimeout(3000);
    }
    await poll(() => page.getByTestId('plan-table').locator('tbody tr').count()).toBeGreaterThan(50);
    const facts = page.locator('section[aria-labelledby="facts-h"]');
    expect(await facts.textContent()).toMatch(/Floor basis\s*Cautious end of the 95 % interval/);
    expect(await facts.textContent()).toMatch(/Ending tolerance\s*at most 2 points deeper than the floor/);
    const summary = await page.getByTestId('plan-summary').textContent();
    expect(summary).toMatch(/Average promo floor/);
    expect(summary).toMatch(/Average discount given/);
    expect(summary).toMatch(/Margin cost, one unit of each item/);
    await screenshot(page, 'plan-basis-cautious');
  });
});
