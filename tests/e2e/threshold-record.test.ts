// The threshold record in Chromium (issue 15): the demo workspace's closed studies — plus an
// earlier wave of the kitchen study, copied here so one category has two measurements — on one
// chart, in the table at a picked price, on a line over time, and in a shopper-level comparison;
// the category filter; the price-list categories no study measured; the CSV download; no
// sideways scroll at 390 × 844 and no axe violation. A plan built from the household study for
// the demo price list says it borrows its fit. Screenshots in .test-output/screenshots.
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';
import { expectAccessible } from '../support/a11y';
import { DEMO_STUDY_NAME } from '../../scripts/seed/demo-study';
import { DEMO_RECORD_STUDIES } from '../../scripts/seed/demo-record-studies';

const COPY = 'Kitchen & home — earlier wave (e2e copy)';
const PASSWORD = 'harbour-demo-2026';

async function copyKitchenStudy(db: pg.Client): Promise<string> {
  const src = (await db.query("select s.id from study s join workspace w on w.id = s.workspace_id where w.slug = 'harbourline' and s.name = $1", [DEMO_STUDY_NAME])).rows[0].id;
  await db.query('begin');
  const id = (await db.query(
    `insert into study (id, workspace_id, name, state, design, exclusion_rules, data_version, created_at, updated_at, launched_at, closed_at, retention_days)
     select gen_random_uuid(), workspace_id, $2::text, 'closed', jsonb_set(design, '{name}', to_jsonb($2::text)), exclusion_rules, 1,
            '2025-06-02', '2025-06-20', '2025-06-02', '2025-06-20', retention_days from study where id = $1 returning id`, [src, COPY])).rows[0].id;
  await db.query('create temp table m on commit drop as select id as old_id, gen_random_uuid() as new_id from respondent where study_id = $1 and state in (\'completed\', \'imported\')', [src]);
  await db.query(
    `insert into respondent (id, workspace_id, study_id, link_id, pid, resume_token, external_ref, reference_code, seed, state, segment_answers, attention_passed, plan, answered_count, started_at, last_seen_at, completed_at)
     select m.new_id, x.workspace_id, $1, null, null, md5(random()::text) || md5(random()::text), x.external_ref, null, x.seed, x.state, x.segment_answers, x.attention_passed, null, x.answered_count, x.started_at, x.last_seen_at, x.completed_at
       from respondent x join m on m.old_id = x.id`, [id]);
  await db.query(
    `insert into trial (study_id, respondent_id, idx, kind, base_price, discount, shown, answer, response_ms, client_id, answered_at)
     select $1, m.new_id, t.idx, t.kind, t.base_price, t.discount, t.shown, t.answer, t.response_ms, gen_random_uuid(), t.answered_at
       from trial t join m on m.old_id = t.respondent_id`, [id]);
  await db.query('commit');
  return id;
}

async function waitUntilFitted(page: Page) {
  const deadline = Date.now() + 270_000;
  for (;;) {
    await page.getByTestId('record-table').waitFor();
    const pending = await page.getByText(/still being fitted/).count();
    if (!pending) return;
    if (Date.now() > deadline) throw new Error('the record studies were not fitted in time');
    await page.waitForTimeout(4000);
    await page.reload();
  }
}

/** Both charts measured and drawn (ParentSize renders them after the first layout). */
async function chartsDrawn(page: Page) {
  for (const id of ['record-chart', 'record-trend-chart']) await page.getByTestId(id).locator('svg[role="img"] .visx-axis-bottom').waitFor({ state: 'visible' });
}

describe('threshold record in Chromium', () => {
  let db: pg.Client;
  let copyId: string;
  const contexts: BrowserContext[] = [];
  beforeAll(async () => {
    db = new pg.Client({ connectionString: inject('databaseUrl') });
    await db.connect();
    await db.query('delete from study where name = $1', [COPY]);
    copyId = await copyKitchenStudy(db);
  });
  afterAll(async () => {
    for (const c of contexts) await c.close();
    await db?.query('delete from study where id = $1', [copyId]);
    await db?.end();
  });

  // The first visit queues the fits of the studies not fitted yet (the copy, and the demo studies on a fresh database): minutes under load.
  it('shows every closed study on the chart and in the table, with a line over time and the unmeasured categories', { timeout: 300_000 }, async () => {
    const { context, page } = await openBrowser();
    contexts.push(context);
    await page.setViewportSize({ width: 1280, height: 900 });
    await signIn(page, 'viewer@harbourline.example', PASSWORD);
    await page.goto(`${baseUrl()}/w/harbourline`);
    await page.getByRole('link', { name: 'Threshold record' }).click();
    await page.waitForURL(/\/w\/harbourline\/record$/);
    await waitUntilFitted(page);
    expect(await page.getByRole('link', { name: 'Threshold record' }).getAttribute('aria-current')).toBe('page');
    const names = [DEMO_STUDY_NAME, COPY, ...DEMO_RECORD_STUDIES.map((s) => s.design.name)];
    for (const n of names) expect(await page.getByTestId('record-table').getByRole('link', { name: n }).count(), n).toBe(1);
    // one mark per tested base price and study on the chart (5 bases × 4 studies), and both reference lines
    await expect.poll(() => page.getByTestId('record-chart').locator('svg[role="img"] circle, svg[role="img"] rect, svg[role="img"] path:not(.visx-axis-line)').count()).toBeGreaterThanOrEqual(20);
    const chartText = await page.getByTestId('record-chart').textContent();
    expect(chartText).toContain("Weber's law (slope 1)");
    expect(chartText).toContain('same amount (slope 0)');
    expect(chartText).toMatch(/Groceries — drinks.*Household.*Kitchen & home/s);
    // the kitchen category was measured twice: its line over time
    expect(await page.getByTestId('record-trend-chart').locator('polyline').count()).toBe(1);
    expect(await page.getByTestId('uncovered-categories').textContent()).toContain('Kitchen — tools');
    expect(await page.getByTestId('uncovered-categories').textContent()).not.toContain('Household');
    await chartsDrawn(page);
    await screenshot(page, 'record-desktop');
    await expectAccessible(page, 'record');
  });

  it('filters by category, reads thresholds at a picked price, and compares two studies of one category', async () => {
    const { context, page } = await openBrowser();
    contexts.push(context);
    await page.setViewportSize({ width: 1280, height: 900 });
    await signIn(page, 'analyst@harbourline.example', PASSWORD);
    await page.goto(`${baseUrl()}/w/harbourline/record`);
    await waitUntilFitted(page);
    const filters = page.getByTestId('record-filters');
    await filters.getByLabel('Category').selectOption('Kitchen & home');
    await filters.getByLabel(/Read thresholds at/).fill('25');
    await filters.getByRole('button', { name: 'Apply' }).click();
    await page.waitForURL(/category=Kitchen/);
    expect(await page.getByTestId('record-table').locator('tbody tr').count()).toBe(2);
    expect(await page.getByTestId('record-table').locator('thead').textContent()).toMatch(/Threshold at €25\.00/);
    const compare = page.getByRole('form', { name: 'Compare two studies' });
    await compare.getByLabel('Study', { exact: true }).selectOption({ label: `${DEMO_STUDY_NAME} (2026-03-20)` });
    await compare.getByLabel('against', { exact: true }).selectOption({ label: `${COPY} (2025-06-20)` });
    await compare.getByRole('button', { name: 'Compare' }).click();
    const result = page.getByTestId('comparison-result');
    await result.waitFor();
    // the copy holds the same answers: no difference, ratio 1 within its interval
    expect(await result.textContent()).toMatch(/needs about the same discount as/);
    expect(await result.textContent()).toMatch(/do not show a difference at the 5 % level/);
    expect(await result.textContent()).toMatch(/Method: Welch t-test with each study’s respondent-level bootstrap SE/);
    await chartsDrawn(page);
    await screenshot(page, 'record-compare');
    await expectAccessible(page, 'record-compare');
    const csv = await page.evaluate(async () => { const r = await fetch('/api/w/harbourline/record?format=csv'); return { status: r.status, text: await r.text() }; });
    expect(csv.status).toBe(200);
    expect(csv.text.split('\r\n')[0]).toMatch(/^category,study,study_id,state,date,currency/);
    expect(csv.text.split('\r\n').filter((l) => l.includes(COPY))).toHaveLength(5);
  });

  it('fits a 390 × 844 phone without sideways scrolling', async () => {
    const { context, page } = await openBrowser({ phone: true });
    contexts.push(context);
    await page.setViewportSize({ width: 390, height: 844 });
    await signIn(page, 'viewer@harbourline.example', PASSWORD);
    await page.goto(`${baseUrl()}/w/harbourline/record`);
    await waitUntilFitted(page);
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    const box = await page.getByTestId('record-chart').locator('svg[role="img"]').boundingBox();
    expect(box!.x + box!.width).toBeLessThanOrEqual(390);
    await chartsDrawn(page);
    await screenshot(page, 'record-phone');
    await expectAccessible(page, 'record-phone');
  });

  it('a plan from the household study for the demo price list says its fit is borrowed', async () => {
    const { context, page } = await openBrowser();
    contexts.push(context);
    await signIn(page, 'analyst@harbourline.example', PASSWORD);
    await page.goto(`${baseUrl()}/w/harbourline/promotions/plans/new`);
    await page.getByLabel('Plan name').fill(`Borrowed floors ${Date.now()}`);
    const study = page.getByLabel('Fitted study');
    await study.selectOption((await study.locator('option', { hasText: DEMO_RECORD_STUDIES[1].design.name }).getAttribute('value'))!);
    expect(await page.getByTestId('pooled-studies').textContent()).toContain(DEMO_STUDY_NAME);
    const deadline = Date.now() + 120_000;
    while (!/\/plans\/[0-9a-f-]{36}$/.test(page.url())) {
      await page.getByRole('button', { name: 'Create plan' }).click();
      const outcome = await Promise.race([
        page.waitForURL(/\/plans\/[0-9a-f-]{36}$/, { timeout: 15_000 }).then(() => 'created'),
        page.getByTestId('plan-status').waitFor({ timeout: 15_000 }).then(() => 'status'),
      ]);
      if (outcome === 'created') break;
      if (Date.now() > deadline) throw new Error('the household study fit did not finish in time');
      await page.waitForTimeout(3000);
    }
    const banner = await page.getByTestId('borrowed-fit').textContent();
    expect(banner).toMatch(/Borrowed fit\. Borrowed from “Household cleaning — spot the saving” \(Household\) for .*Kitchen — tools/);
    expect(await page.getByTestId('cautions').textContent()).toMatch(/Borrowed fit: the floors for .* come from shoppers asked about Household/);
    await screenshot(page, 'plan-borrowed');
  });
});
