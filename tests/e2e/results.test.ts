import { readFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { OUTPUT_DIR, baseUrl, openBrowser, screenshot, signIn } from '../support/browser';
import { DEMO_STUDY_NAME } from '../../scripts/seed/demo-study';
import { DEFAULT_EXCLUSION_RULES } from '../../lib/schemas/exclusions.schema';

describe('results of the demo study in Chromium', () => {
  let context: BrowserContext;
  let page: Page;
  let db: pg.Client;
  let studyId: string;
  beforeAll(async () => {
    db = new pg.Client({ connectionString: inject('databaseUrl') });
    await db.connect();
    const r = await db.query("select s.id from study s join workspace w on w.id = s.workspace_id where w.slug = 'harbourline' and s.name = $1", [DEMO_STUDY_NAME]);
    studyId = r.rows[0].id;
    await db.query('update study set exclusion_rules = $1 where id = $2', [JSON.stringify(DEFAULT_EXCLUSION_RULES), studyId]);
    ({ context, page } = await openBrowser());
  });
  afterAll(async () => {
    await context?.close();
    await db?.query('update study set exclusion_rules = $1 where id = $2', [JSON.stringify(DEFAULT_EXCLUSION_RULES), studyId]);
    await db?.end();
  });

  const fitShown = async () => {
    await page.getByTestId('curves').waitFor({ timeout: 90_000 });
    await expect.poll(() => page.getByTestId('fit-progress').count(), { timeout: 90_000 }).toBe(0);
  };

  it('shows the fitted curves and the Weber view once the job has run', async () => {
    await signIn(page, 'analyst@harbourline.example', 'harbour-demo-2026');
    await page.goto(`${baseUrl()}/w/harbourline/studies/${studyId}/results`);
    await fitShown();
    expect(await page.locator('[data-testid="curves"] article').count()).toBe(5);
    expect(await page.getByText('Discount (% of base price, log scale)').count()).toBeGreaterThan(0);
    expect(await page.getByTestId('weber-verdict').textContent()).toMatch(/Cheap items need deeper percentages/);
    expect(await page.getByTestId('model-table').textContent()).toMatch(/preferred/);
  });

  it('switching an exclusion rule off changes the counts and refits', async () => {
    const after = page.getByTestId('respondents-after');
    await expect.poll(() => after.textContent()).toMatch(/\d+/);
    const before = Number(await after.textContent());
    expect(before).toBeLessThan(120);
    // The simulated inattentive respondents break no other rule: switching the check off lets them back in.
    await page.getByTestId('rule-attention').uncheck();
    await page.getByRole('button', { name: 'Save rules' }).click();
    await page.getByText('Rules saved; the fit is updating.').waitFor();
    await expect.poll(async () => Number(await after.textContent())).toBe(before + 4);
    expect(await page.getByTestId('respondents-before').textContent()).toBe('120');
    await fitShown();
    await screenshot(page, 'results');
    await page.getByTestId('weber-view').screenshot({ path: path.join(OUTPUT_DIR, 'weber-view.png') });
  });

  it('downloads the thresholds CSV with plain column names', async () => {
    await page.locator('a[data-testid="export-thresholds-csv"]').waitFor({ timeout: 90_000 });
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-thresholds-csv').click()]);
    const file = await download.path();
    const text = readFileSync(file, 'utf8');
    const [header, ...rows] = text.trim().split('\r\n');
    expect(header).toMatch(/^Segment question,Segment answer,Base price \(EUR\),Notice threshold \(% of base price\),Notice threshold \(EUR\),95% interval low \(%\)/);
    expect(rows).toHaveLength(5);
  });
});
