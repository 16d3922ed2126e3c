import { readFileSync } from 'node:fs';
import path from 'node:path';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';

const FIXTURE = path.resolve(__dirname, '../fixtures/demo-price-list.csv');
const DEMO_STUDY = 'Kitchen & home — notice thresholds';

describe('promotion planning in Chromium (demo analyst)', () => {
  let context: BrowserContext;
  let page: Page;
  const listName = `Spring upload ${Date.now()}`;
  const planName = `Spring promo floors ${Date.now()}`;
  beforeAll(async () => {
    ({ context, page } = await openBrowser());
    await signIn(page, 'analyst@harbourline.example', 'harbour-demo-2026');
  });
  afterAll(async () => context?.close());

  it('uploads the demo price list after a clean preview', async () => {
    await page.goto(`${baseUrl()}/w/harbourline/promotions/price-lists/new`);
    await page.locator('#price-list-file').setInputFiles(FIXTURE);
    await page.getByLabel('Price list name').fill(listName);
    await page.getByLabel('Currency of the prices').selectOption('EUR');
    await page.getByRole('button', { name: 'Check file' }).click();
    await expect.poll(() => page.getByText('Ready to store').count()).toBe(1);
    expect(await page.getByRole('cell', { name: 'HL-10001' }).count()).toBe(1);
    await page.getByRole('button', { name: 'Store price list' }).click();
    await page.waitForURL(/\/promotions$/);
    await expect.poll(() => page.getByRole('cell', { name: listName, exact: true }).count()).toBe(1);
  });

  it('creates a plan from the demo study, waiting for the fit if it is still computing', async () => {
    await page.goto(`${baseUrl()}/w/harbourline/promotions/plans/new`);
    await page.getByLabel('Plan name').fill(planName);
    const study = page.getByLabel('Fitted study');
    const studyValue = await study.locator('option', { hasText: DEMO_STUDY }).getAttribute('value');
    await study.selectOption(studyValue!);
    const list = page.getByLabel('Price list');
    await list.selectOption((await list.locator('option', { hasText: listName }).getAttribute('value'))!);
    await page.getByLabel('Target notice rate').selectOption('0.75');
    await page.getByLabel('Price ending').selectOption('ends-99');
    const deadline = Date.now() + 90_000;
    while (!/\/plans\/[0-9a-f-]{36}$/.test(page.url())) {
      await page.getByRole('button', { name: 'Create plan' }).click();
      const outcome = await Promise.race([
        page.waitForURL(/\/plans\/[0-9a-f-]{36}$/, { timeout: 15_000 }).then(() => 'created'),
        page.getByTestId('plan-status').waitFor({ timeout: 15_000 }).then(() => 'status'),
      ]);
      if (outcome === 'created') break;
      const text = (await page.getByTestId('plan-status').textContent()) ?? '';
      expect(text).toMatch(/still being computed/);
      if (Date.now() > deadline) throw new Error('the demo study fit did not finish in time');
      await page.waitForTimeout(3000);
    }
    await expect.poll(() => page.getByTestId('plan-table').locator('tbody tr').count()).toBeGreaterThan(50);
    expect(await page.getByRole('heading', { name: planName }).count()).toBe(1);
    expect(await page.getByTestId('cautions').textContent()).toMatch(/16 CFR Part 233.*Directive 98\/6\/EC/s);
    expect(await page.getByTestId('plan-summary').textContent()).toContain('200');
    expect(await page.getByTestId('promo-floor-chart').count()).toBe(1);
    await page.getByLabel('Show').selectOption('outsideRange');
    await expect.poll(async () => (await page.getByTestId('plan-table').locator('tbody tr').first().textContent()) ?? '').toContain('Outside tested range');
    await page.getByLabel('Show').selectOption('all');
    await expect.poll(() => page.getByTestId('plan-table').locator('tbody tr').count()).toBeGreaterThan(50);
    await screenshot(page, 'promo-plan');
  });

  it('downloads the plan CSV with unit headers and one row per item', async () => {
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download CSV' }).click()]);
    const file = await download.path();
    const rows = Papa.parse<string[]>(readFileSync(file!, 'utf8').trim()).data;
    expect(rows[0]).toEqual([
      'SKU', 'Name', 'Category', 'Regular price (EUR)', 'Unit cost (EUR)', 'Promo floor (% off)', 'Promo floor (EUR off)',
      'Promo price (EUR)', 'Discount at promo price (% off)', 'Margin before (EUR/unit)', 'Margin after (EUR/unit)',
      'Outside tested range', 'Deeper than margin', 'No promo price', 'Exact price kept (ending too deep)', 'No threshold (bound only)',
      'Fit basis',
    ]);
    expect(rows).toHaveLength(201);
    const kettle = rows.find((r) => r[1] === 'Electric kettle, 1.7 l')!;
    // the demo study measured "Kitchen & home"; the list's categories are others: every floor is borrowed, and says so
    expect(kettle[16]).toBe(`borrowed from “${DEMO_STUDY}” (Kitchen & home)`);
    expect(kettle[3]).toBe('29.99');
    expect(Number(kettle[5])).toBeGreaterThan(0);
    // .99 where it deepens the discount by at most 2 points (the plan's default tolerance), else the exact floor price.
    if (kettle[14] === 'no') expect(kettle[7]).toMatch(/\.99$/);
    expect(Number(kettle[8]) - Number(kettle[5])).toBeLessThanOrEqual(2.01);
    expect(Number(kettle[7])).toBeLessThan(29.99);
    expect(kettle[11]).toBe('no');
  });
});
