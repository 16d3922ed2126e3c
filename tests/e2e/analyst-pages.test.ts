import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';
import { expectAccessible } from '../support/a11y';
import { DEMO_STUDY_NAME } from '../../scripts/seed/demo-study';

// Protects the analyst pages on a phone and at a desk, and the app's own dialogs:
// - at 390 × 844 every main analyst page fits the screen (the page never scrolls sideways; wide
//   tables scroll inside their ScrollFrame), passes the accessibility check and is photographed;
// - at 1,280 px the promotion plan's Items table shows every column, promo price and margins
//   included, without scrolling;
// - closing a link, closing a study (which says how many respondents are answering now),
//   removing a member and deleting a respondent ask in the app's dialog, never the browser's
//   confirm box; and a link's state follows its study (a closed study's link says so).
// A live study with one respondent answering is made through the data layer.

process.env.DATABASE_URL ??= inject('databaseUrl');
process.env.AUTH_SECRET ??= 'e2e-data-layer-secret-0123456789abcdef';

const OWNER = ['owner@harbourline.example', 'harbour-demo-2026'] as const;
const PHONE = { width: 390, height: 844 };
const poll = <T>(fn: () => Promise<T> | T, timeout = 20_000) => expect.poll(fn, { timeout });

/** The page's width against the phone's: Chromium's mobile emulation widens innerWidth to fit an overflowing page, so both are checked. */
async function pageWidth(page: Page) {
  return page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, inner: window.innerWidth }));
}

describe('analyst pages in Chromium', () => {
  const contexts: BrowserContext[] = [];
  let live: { studyId: string; linkId: string; token: string; workspaceId: string };
  let demoStudyId = '';
  let planId = '';
  const browserDialogs: string[] = [];

  const open = async (phone: boolean) => {
    const b = await openBrowser({ phone });
    contexts.push(b.context);
    b.page.on('dialog', (d) => { browserDialogs.push(d.message()); void d.dismiss(); });
    await signIn(b.page, ...OWNER);
    return b.page;
  };

  beforeAll(async () => {
    const { makeLiveStudy, testDesign } = await import('../support/respondent-fixtures');
    const { startOk } = await import('../support/respondent-client');
    live = await makeLiveStudy('harbourline', { design: testDesign({ name: `Phone page check ${Date.now()}` }) });
    await startOk(live.token); // one respondent answering now
  });
  afterAll(async () => {
    for (const c of contexts) await c.close();
    const { orm } = await import('@/lib/server/db/orm');
    await (await orm()).close(true);
  });

  it('a plan from the demo study exists to look at (made through the API once the fit is ready)', async () => {
    const page = await open(false);
    const api = `${baseUrl()}/api/w/harbourline`;
    const { studies } = (await (await page.request.get(`${api}/studies`)).json()) as { studies: { id: string; name: string }[] };
    demoStudyId = studies.find((s) => s.name === DEMO_STUDY_NAME)!.id;
    const { priceLists } = (await (await page.request.get(`${api}/price-lists`)).json()) as { priceLists: { id: string }[] };
    const priceListId = priceLists[0].id;
    const deadline = Date.now() + 180_000;
    while (!planId) {
      const r = await page.request.post(`${api}/promo-plans`, { data: { name: `Phone check plan ${Date.now()}`, priceListId, studyId: demoStudyId, ending: 'ends-99' }, headers: { origin: baseUrl() } });
      expect([201, 202]).toContain(r.status());
      if (r.status() === 201) planId = ((await r.json()) as { plan: { id: string } }).plan.id;
      else if (Date.now() > deadline) throw new Error('the demo study fit did not finish in time');
      else await page.waitForTimeout(3000);
    }
  }, 240_000);

  it('at 390 × 844 every main analyst page fits the screen, passes the accessibility check and is photographed', async () => {
    const page = await open(true);
    const demo = `/studies/${demoStudyId}`;
    const pages: { name: string; path: string; ready: string }[] = [
      { name: 'studies-list', path: '', ready: '[data-testid="study-table"]' },
      { name: 'study-builder', path: '/studies/new', ready: 'form[aria-label="Study builder"]' },
      { name: 'study-overview-live', path: `/studies/${live.studyId}`, ready: '[data-testid="completes"]' },
      { name: 'study-overview-closed', path: demo, ready: '[data-testid="cell-grid"]' },
      { name: 'study-links', path: `/studies/${live.studyId}/links`, ready: '[data-testid="links-table"]' },
      { name: 'study-preview', path: `/studies/${live.studyId}/preview`, ready: '[data-testid="respondent-preview"]' },
      { name: 'study-results', path: `${demo}/results`, ready: '[data-testid="summary-table"]' },
      { name: 'study-import', path: `${demo}/import`, ready: 'main form' },
      { name: 'study-report-print', path: `${demo}/results/print`, ready: '[data-testid="print-summary"]' },
      { name: 'responses-import', path: '/studies/import', ready: 'main form' },
      { name: 'promotions', path: '/promotions', ready: 'main h1' },
      { name: 'promotion-plan', path: `/promotions/plans/${planId}`, ready: '[data-testid="plan-table"] tbody tr' },
      { name: 'promotion-plan-new', path: '/promotions/plans/new', ready: 'main form' },
      { name: 'price-list-new', path: '/promotions/price-lists/new', ready: 'main form' },
      { name: 'billing', path: '/billing', ready: '[data-testid="ledger"]' },
      { name: 'team', path: '/team', ready: '[data-testid="members"]' },
      { name: 'workspace-settings', path: '/settings', ready: 'main form' },
      { name: 'audit', path: '/audit', ready: '[data-testid="audit"]' },
    ];
    const wide: string[] = [];
    for (const p of pages) {
      await page.goto(`${baseUrl()}/w/harbourline${p.path}`);
      await page.locator(p.ready).first().waitFor({ timeout: 120_000 });
      await page.waitForLoadState('networkidle');
      const w = await pageWidth(page);
      if (w.inner !== PHONE.width || w.scroll > w.inner) wide.push(`${p.name}: page ${w.scroll} px in a ${w.inner} px window`);
      await expectAccessible(page, `phone-${p.name}`);
      await screenshot(page, `phone-${p.name}`);
    }
    expect(wide).toEqual([]);
  }, 300_000);

  it('at 390 px a wide table scrolls inside its frame, which says so and takes keyboard focus', async () => {
    const page = await open(true);
    await page.goto(`${baseUrl()}/w/harbourline/team`);
    const frame = page.getByRole('region', { name: 'Members' });
    await frame.waitFor();
    await poll(() => frame.getAttribute('data-clipped')).toBe('true'); // measured once the page is live
    expect(await frame.evaluate((el) => el.scrollWidth > el.clientWidth)).toBe(true);
    expect(await page.getByTestId('scroll-hint').first().textContent()).toContain('Scroll sideways for more columns');
    await frame.focus();
    await page.keyboard.press('End');
    await page.keyboard.press('ArrowRight');
    await poll(() => frame.evaluate((el) => el.scrollLeft)).toBeGreaterThan(0);
  });

  it('at 1,280 px the plan’s Items table shows every column, promo price and margins included', async () => {
    const page = await open(false);
    await page.goto(`${baseUrl()}/w/harbourline/promotions/plans/${planId}`);
    await page.getByTestId('plan-table').locator('tbody tr').first().waitFor({ timeout: 60_000 });
    const frame = page.getByRole('region', { name: 'Items of the plan' });
    await page.waitForLoadState('networkidle');
    expect(await frame.getAttribute('data-clipped')).toBe('false');
    const box = (await frame.boundingBox())!;
    const inner = await page.evaluate(() => window.innerWidth);
    for (const header of ['Promo price', 'Margin before', 'Margin after', 'Flags']) {
      const th = page.getByTestId('plan-table').locator('thead th', { hasText: header });
      const b = (await th.boundingBox())!;
      expect(b.x, header).toBeGreaterThanOrEqual(box.x);
      expect(b.x + b.width, header).toBeLessThanOrEqual(Math.min(inner, box.x + box.width) + 0.5);
    }
    expect(await page.getByTestId('plan-table-frame').getByTestId('scroll-hint').count()).toBe(0);
    await screenshot(page, 'desk-promotion-plan-1280');
  });

  it('closing a link and closing the study ask in the app’s dialog; the close says who is answering; links follow the study', async () => {
    const page = await open(false);
    const study = `${baseUrl()}/w/harbourline/studies/${live.studyId}`;
    // A second link, to close on its own.
    await page.goto(`${study}/links`);
    await page.getByLabel('Source').fill('store poster');
    await page.getByRole('button', { name: 'Add link' }).click();
    await poll(() => page.getByTestId('link-row').count()).toBe(2);
    const poster = page.getByTestId('link-row').filter({ hasText: 'store poster' });
    expect(await poster.getByTestId('link-state').textContent()).toContain('Open');
    await poster.getByRole('button', { name: 'Close' }).click();
    // The open one of the page's dialogs (each action keeps its own, closed, in the page).
    const dialog = page.locator('dialog[open][data-testid="confirm-dialog"]');
    await poll(() => dialog.count()).toBe(1);
    expect(await dialog.textContent()).toContain('store poster');
    await dialog.getByRole('button', { name: 'Close link' }).click();
    await poll(() => poster.getByTestId('link-state').textContent()).toContain('Closed');
    await screenshot(page, 'links-one-closed');

    await page.goto(study);
    await page.getByRole('button', { name: 'Close', exact: true }).click();
    await poll(() => dialog.count()).toBe(1);
    await poll(() => page.getByTestId('close-in-progress').textContent()).toContain('1 respondent is answering right now');
    await screenshot(page, 'study-close-dialog');
    await dialog.getByRole('button', { name: 'Close study' }).click();
    await poll(() => page.locator('[data-state="closed"]').count()).toBe(1);
    // The monitor's per-link states follow the study too.
    await poll(async () => (await page.getByTestId('per-link-state').allTextContents()).sort()).toEqual(['Closed', 'Study closed']);

    await page.goto(`${study}/links`);
    await page.getByTestId('links-table').waitFor();
    const states = await page.getByTestId('link-state').allTextContents();
    expect(states).toHaveLength(2);
    expect(states.some((s) => /Open/.test(s))).toBe(false);
    expect(states.filter((s) => s.includes('Study closed'))).toHaveLength(1);
    await screenshot(page, 'links-study-closed');
    expect(browserDialogs).toEqual([]);
  });

  it('removing a member and deleting a respondent ask in the app’s dialog (cancelled here: nothing changes)', async () => {
    const page = await open(false);
    await page.goto(`${baseUrl()}/w/harbourline/team`);
    const viewer = page.getByTestId('members').locator('tr', { hasText: 'viewer@harbourline.example' });
    await viewer.getByRole('button', { name: 'Remove' }).click();
    const dialog = page.locator('dialog[open][data-testid="confirm-dialog"]');
    await poll(() => dialog.count()).toBe(1);
    expect(await dialog.textContent()).toContain('viewer@harbourline.example');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Cancel'); // the safe choice first
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await poll(() => dialog.count()).toBe(0);
    expect(await page.getByTestId('members').getByText('viewer@harbourline.example').count()).toBe(1);

    await page.goto(`${baseUrl()}/w/harbourline/studies/${demoStudyId}`);
    await page.getByLabel('Reference code').fill('7K2QD-M9XPA');
    await page.getByRole('button', { name: 'Delete respondent' }).click();
    await poll(() => dialog.count()).toBe(1);
    expect(await dialog.textContent()).toContain('7K2QD-M9XPA');
    await page.keyboard.press('Escape');
    await poll(() => dialog.count()).toBe(0);
    expect(browserDialogs).toEqual([]);
  });
});
