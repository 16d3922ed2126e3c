// The results page answers first, at a desk and on a phone: the summary table of the demo study
// with the fit's own numbers, the verdict and rule, the plan action (which opens the new-plan
// page with this study chosen), charts whose labels never collide and whose cards share one
// x range, no page-level horizontal scroll at 390 px (results and printable report), and the
// message naming the rule that removed everyone. Screenshots in .test-output/screenshots.
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';
import { DEMO_STUDY_NAME } from '../../scripts/seed/demo-study';
import { DEFAULT_EXCLUSION_RULES } from '../../lib/schemas/exclusions.schema';
import type { AnalysisReport } from '../../lib/psychometrics/report-types';

const ANALYST = ['analyst@harbourline.example', 'harbour-demo-2026'] as const;

type Box = { x: number; y: number; width: number; height: number };
const overlap = (a: Box, b: Box) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

async function noPageScroll(page: Page) {
  // Chromium's mobile emulation widens innerWidth to fit an overflowing page: compare with the layout width too.
  return page.evaluate(() => document.documentElement.scrollWidth <= Math.min(window.innerWidth, document.documentElement.clientWidth));
}

async function waitForSummary(page: Page) {
  await page.getByTestId('summary-table').waitFor({ timeout: 120_000 });
  await expect.poll(() => page.getByTestId('fit-progress').count(), { timeout: 120_000 }).toBe(0);
}

/** Geometry of every curve card's chart: tick labels, axis titles, threshold label, dots. */
async function chartGeometry(page: Page) {
  return page.evaluate(() => [...document.querySelectorAll('[data-testid="curves"] figure[data-testid="curve-figure"] svg[aria-label]')].map((svg) => {
    const box = (el: Element) => { const r = el.getBoundingClientRect(); return { x: r.x, y: r.y, width: r.width, height: r.height }; };
    const texts = [...svg.querySelectorAll('text')];
    const svgBox = box(svg);
    const xTicks = [...svg.querySelectorAll('.visx-axis-bottom .visx-axis-tick text')];
    const yTicks = [...svg.querySelectorAll('.visx-axis-left .visx-axis-tick text')];
    const yTitle = texts.find((t) => t.textContent === 'Notice rate')!;
    const label = svg.querySelector('[data-testid="threshold-label"]')!;
    return {
      svg: svgBox,
      xTickText: xTicks.map((t) => t.textContent),
      xTicks: xTicks.map(box), yTicks: yTicks.map(box), yTitle: box(yTitle), label: box(label),
      dots: [...svg.querySelectorAll('circle')].map(box),
    };
  }));
}

describe('results summary in Chromium', () => {
  let db: pg.Client;
  let studyId: string;
  const contexts: BrowserContext[] = [];
  beforeAll(async () => {
    db = new pg.Client({ connectionString: inject('databaseUrl') });
    await db.connect();
    const r = await db.query("select s.id from study s join workspace w on w.id = s.workspace_id where w.slug = 'harbourline' and s.name = $1", [DEMO_STUDY_NAME]);
    studyId = r.rows[0].id;
    await db.query('update study set exclusion_rules = $1 where id = $2', [JSON.stringify(DEFAULT_EXCLUSION_RULES), studyId]);
  });
  afterAll(async () => {
    for (const c of contexts) await c.close();
    await db?.query('update study set exclusion_rules = $1 where id = $2', [JSON.stringify(DEFAULT_EXCLUSION_RULES), studyId]);
    await db?.end();
  });
  const open = async (phone: boolean) => {
    const b = await openBrowser({ phone });
    contexts.push(b.context);
    await signIn(b.page, ...ANALYST);
    return b.page;
  };
  const resultsUrl = () => `${baseUrl()}/w/harbourline/studies/${studyId}/results`;

  it('at 1,280 px: the summary carries the fit’s numbers, the verdict, the rule and the actions; charts are tidy', async () => {
    const page = await open(false);
    await page.goto(resultsUrl());
    await waitForSummary(page);
    const api = await page.request.get(`${baseUrl()}/api/w/harbourline/studies/${studyId}/results`);
    const state = await api.json() as { fit: { status: string; report: AnalysisReport }; counts: { respondents: { after: number } } };
    expect(state.fit.status).toBe('ready');
    const report = state.fit.report;
    const rows = page.getByTestId('summary-row');
    expect(await rows.count()).toBe(5);
    for (let i = 0; i < report.bases.length; i++) {
      const cells = await rows.nth(i).locator('td').allTextContents();
      const t = report.bases[i].threshold;
      expect(cells[1]).toBe(`${(Number(t.fraction) * 100).toFixed(1)} %`);
      expect(cells[2]).toContain(Number(t.amount).toFixed(2));
      expect(cells[3]).toContain(`${(t.fractionCi![0] * 100).toFixed(1)} % – ${(t.fractionCi![1] * 100).toFixed(1)} %`);
      expect(cells[4]).toBe(String(state.counts.respondents.after));
    }
    expect(state.counts.respondents.after).toBeGreaterThanOrEqual(100);
    const verdict = page.getByTestId('weber-verdict');
    // The demo's invented observer has a Weber slope of 0.8: cheap items need deeper percentages.
    expect(await verdict.getAttribute('data-kind')).toBe('tiers-cheap');
    expect(await verdict.textContent()).toMatch(/^Cheap items need deeper percentages/);
    expect(await page.getByTestId('promotion-rule').textContent()).toMatch(/Promotion rule: Plan promotions by price tier/);
    expect(await page.getByTestId('excluded-summary').textContent()).toMatch(/120 finished respondents; \d+ left out .*failed the attention check/);
    // Exports sit with the summary, before any detail.
    expect(await page.locator('[data-testid="summary"] [data-testid="export-thresholds-csv"]').count()).toBe(1);
    // Every technical figure has its label and a footnote; the model table names its methods.
    expect(await page.getByTestId('base-table-3.49').textContent()).toMatch(/Lapse rate.*Guess rate/s);
    expect(await page.getByTestId('weber-notes').textContent()).toMatch(/AIC.*χ²/s);
    expect(await page.getByTestId('interval-method').textContent()).toContain(report.intervalMethod);
    expect(await page.getByTestId('cautions').textContent()).toContain('Directive 98/6/EC');
    for (const w of report.warnings) expect(await page.getByTestId('cautions').textContent()).toContain(w);
    expect(await noPageScroll(page)).toBe(true);

    const charts = await chartGeometry(page);
    expect(charts).toHaveLength(5);
    for (const c of charts) {
      expect(c.xTickText).toEqual(charts[0].xTickText); // one x range for every card
      for (const t of c.yTicks) expect(overlap(c.yTitle, t)).toBe(false);
      for (let i = 1; i < c.xTicks.length; i++) expect(c.xTicks[i].x).toBeGreaterThan(c.xTicks[i - 1].x + c.xTicks[i - 1].width);
      expect(c.label.x).toBeGreaterThanOrEqual(c.svg.x);
      expect(c.label.x + c.label.width).toBeLessThanOrEqual(c.svg.x + c.svg.width + 0.5);
      for (const d of c.dots) expect(overlap(c.label, d)).toBe(false);
    }
    await screenshot(page, 'results-summary-1280');

    const plan = page.getByTestId('plan-from-study');
    expect(await plan.getAttribute('href')).toBe(`/w/harbourline/promotions/plans/new?study=${studyId}`);
    await plan.click();
    await page.waitForURL(/\/promotions\/plans\/new/);
    await expect.poll(() => page.locator('#f-studyId').inputValue()).toBe(studyId);
  });

  it('at 390 px: no page-level horizontal scroll on the results page and the printable report; wide tables scroll in their frame', async () => {
    const page = await open(true);
    await page.goto(resultsUrl());
    await waitForSummary(page);
    await page.getByTestId('curve-figure').first().locator('svg[aria-label]').waitFor();
    expect(await noPageScroll(page)).toBe(true);
    const frame = page.getByTestId('summary-scroll');
    const fits = await frame.evaluate((el) => el.getBoundingClientRect().right <= window.innerWidth);
    expect(fits).toBe(true);
    await screenshot(page, 'results-summary-390');

    await page.goto(`${resultsUrl()}/print`);
    await page.getByTestId('print-summary').waitFor({ timeout: 120_000 });
    expect(await noPageScroll(page)).toBe(true);
    // The report's first block is the summary.
    const first = await page.evaluate(() => document.querySelector('article > header + *')?.getAttribute('data-testid'));
    expect(first).toBe('print-summary');
    await screenshot(page, 'results-print-390');
  });

  it('when the rules leave nobody, says which rule removed how many and links to the rules', async () => {
    const rules = { ...DEFAULT_EXCLUSION_RULES, speeders: { enabled: true, minMedianMs: 10_000 } };
    await db.query('update study set exclusion_rules = $1 where id = $2', [JSON.stringify(rules), studyId]);
    const page = await open(false);
    await page.goto(resultsUrl());
    const box = page.getByTestId('all-excluded');
    await box.waitFor({ timeout: 120_000 });
    expect(await box.textContent()).toMatch(/left out all 120 finished respondents.*“Median response time under the limit” removed 120 of 120/s);
    expect(await page.getByText('no cells to fit').count()).toBe(0);
    await page.getByTestId('relax-rules').click();
    await expect.poll(() => page.evaluate(() => location.hash)).toBe('#rules');
    await screenshot(page, 'results-all-excluded');
  });
});
