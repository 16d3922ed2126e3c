import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';
import { TINY_PNG } from '../support/study-fixtures';

const DEMO_PASSWORD = 'harbour-demo-2026';
/** The seat balance summed from the ledger table, independently of the app's own sum. */
async function ledgerBalance(slug: string): Promise<number> {
  const db = new pg.Client({ connectionString: inject('databaseUrl') });
  await db.connect();
  try {
    const r = await db.query('select coalesce(sum(l.delta), 0)::int as b from seat_ledger_entry l join workspace w on w.id = l.workspace_id where w.slug = $1', [slug]);
    return r.rows[0].b;
  } finally {
    await db.end();
  }
}

/** Server round trips on 2 shared cores can take a few seconds. */
const poll = <T>(fn: () => Promise<T> | T) => expect.poll(fn, { timeout: 15_000 });

describe('an analyst builds, launches and shares a study in Chromium', () => {
  let context: BrowserContext;
  let page: Page;
  const name = `Ground coffee notice test ${Date.now()}`;
  let studyUrl = '';
  beforeAll(async () => {
    ({ context, page } = await openBrowser());
    await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: baseUrl() });
    page.on('dialog', (d) => void d.accept());
    await signIn(page, 'analyst@harbourline.example', DEMO_PASSWORD);
  });
  afterAll(async () => context?.close());

  const trials = async () => Number(await page.getByTestId('trials-per-respondent').textContent());
  const minutes = async () => Number(await page.getByTestId('estimated-minutes').textContent());

  it('builds a 3-base × 4-rung study, the trial count and minutes following the form', async () => {
    await page.goto(`${baseUrl()}/w/harbourline`);
    await page.getByRole('link', { name: 'New study' }).click();
    await page.waitForURL(/\/studies\/new$/);
    await page.getByLabel('Study name').fill(name);
    await page.getByLabel('Item name').fill('Ground coffee, 500 g');
    await page.getByLabel('Item category').fill('Hot drinks');
    await page.getByLabel('Item picture (optional)').setInputFiles({ name: 'coffee.png', mimeType: 'image/png', buffer: TINY_PNG });
    await poll(() => page.getByAltText('The item as respondents will see it').count()).toBe(1);
    const before = { trials: await trials(), minutes: await minutes() };
    // Defaults: 3 base prices × 8 rungs × 4 repetitions = 96 test trials + 17 catch + 3 practice + 1 attention.
    expect(before.trials).toBe(117);

    await page.getByLabel('Base price 1', { exact: true }).fill('0');
    await page.getByRole('button', { name: 'Save as draft' }).click();
    await poll(() => page.getByText('Prices must be above zero.').count()).toBe(1);
    expect(page.url()).toMatch(/\/studies\/new$/);

    await page.getByLabel('Base price 1', { exact: true }).fill('3.49');
    await page.getByLabel('Base price 2', { exact: true }).fill('8.99');
    await page.getByLabel('Base price 3', { exact: true }).fill('24.5');
    await page.getByLabel('Discount ladder (%)').fill('5, 10, 20, 30');
    await page.getByLabel('Repetitions per cell').fill('3');
    // 3 × 4 × 3 = 36 test trials + round(36 × 0.15 / 0.85) = 6 catch + 3 practice + 1 attention.
    await poll(trials).toBe(46);
    expect(await minutes()).toBeLessThan(before.minutes);

    await page.getByLabel('Pick the lower price').check();
    await poll(() => page.getByLabel('Viewing time (ms)').count()).toBe(1);
    // Pick the lower price has no catch trials (two equal tags carry no information): 36 + 3 + 1.
    await poll(trials).toBe(40);
    expect(await page.getByTestId('no-catch-trials').textContent()).toMatch(/guess rate is 1\/2/);
    await page.getByRole('button', { name: 'Add a segment question' }).click();
    await page.getByLabel('Question 1', { exact: true }).fill('How often do you buy coffee?');
    await page.getByLabel('Answer 1', { exact: true }).fill('Every week');
    await page.getByLabel('Answer 2', { exact: true }).fill('Less often');
    // Respondents' language (issue 15): French moves the price format and the standard consent text and
    // attention check to French; back to English moves them back (a text the analyst wrote would stay).
    const language = page.getByLabel('Respondents’ language');
    await language.selectOption('fr');
    await poll(() => page.getByLabel('Price format (locale)').inputValue()).toBe('fr-FR');
    expect(await page.getByLabel('Consent text').inputValue()).toMatch(/^Cette courte enquête/);
    expect(await page.getByLabel('Attention question').inputValue()).toMatch(/Souvent/);
    await screenshot(page, 'study-builder-language-fr');
    await language.selectOption('en');
    await poll(() => page.getByLabel('Price format (locale)').inputValue()).toBe('en-GB');
    expect(await page.getByLabel('Consent text').inputValue()).toMatch(/^This short survey/);
    expect(await page.getByLabel('Attention question').inputValue()).toMatch(/“Often”/);
    // Respondents' data: who runs the study (required to launch) and the caution beside the consent text.
    await page.getByLabel('Who runs this study (contact)').fill('Pricing research, Harbourline Home (fictional) — research@harbourline.example');
    expect(await page.getByTestId('data-protection-consent').count()).toBe(1);
    await screenshot(page, 'study-builder');

    await page.getByRole('button', { name: 'Save as draft' }).click();
    await page.waitForURL(/\/studies\/[0-9a-f-]{36}$/);
    studyUrl = page.url();
    await poll(() => page.getByRole('heading', { name }).count()).toBe(1);
    expect(await page.getByText('40 trials').count()).toBe(1);
  });

  it('launches it; the design is then frozen and the monitor reads zero completes', async () => {
    await page.getByRole('button', { name: 'Launch' }).click();
    // The app's own dialog (no browser confirm box) asks first.
    const dialog = page.getByTestId('confirm-dialog');
    await poll(() => dialog.isVisible()).toBe(true);
    await dialog.getByRole('button', { name: 'Launch' }).click();
    await poll(() => page.locator('[data-state="live"]').count()).toBe(1);
    expect(await page.getByRole('link', { name: 'Edit' }).count()).toBe(0);
    await poll(() => page.getByTestId('completes').textContent()).toBe('0');
    // The monitor's seats left is the workspace's ledger balance, read here straight from the table.
    expect((await page.getByTestId('seats-left').textContent())?.trim()).toBe(String(await ledgerBalance('harbourline')));
    // Held vs used seats: nobody has started yet.
    expect((await page.getByTestId('seats-held').textContent())?.trim()).toBe('0');
    await page.goto(`${studyUrl}/edit`);
    await page.waitForURL(/frozen=1/);
    expect(await page.getByText('its design is frozen').count()).toBe(1);
  });

  it('opens Links, creates a link and copies its URL', async () => {
    await page.goto(studyUrl);
    await page.getByRole('link', { name: 'Links' }).click();
    await page.waitForURL(/\/links$/);
    await page.getByLabel('Source').fill('newsletter');
    await page.getByRole('button', { name: 'Add link' }).click();
    await poll(() => page.getByTestId('link-row').count()).toBe(1);
    const url = (await page.getByTestId('link-url').textContent())!.trim();
    expect(url).toMatch(new RegExp(`^${baseUrl().replace(/[.:/]/g, '\\$&')}/r/[A-Za-z0-9_-]{43}$`));
    await page.getByRole('button', { name: 'Copy link' }).click();
    await poll(() => page.getByText('Copied').count()).toBe(1);
    expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(url);
    await poll(() => page.locator('img[alt^="QR code"]').evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
    await screenshot(page, 'study-links');
  });

  it('previews the respondent screens without recording a respondent', async () => {
    await page.goto(`${studyUrl}/preview`);
    await poll(() => page.getByTestId('respondent-preview').count()).toBe(1);
    await page.goto(studyUrl);
    await poll(() => page.getByTestId('in-progress').textContent()).toBe('0');
    expect(await page.getByTestId('completes').textContent()).toBe('0');
  });

  it('the study list finds it by search and by state', async () => {
    await page.goto(`${baseUrl()}/w/harbourline`);
    await page.getByLabel('Search').fill(name);
    await poll(() => page.getByTestId('study-table').locator('tbody tr').count()).toBe(1);
    await page.getByLabel('State').selectOption('draft');
    await poll(() => page.getByText('No study matches').count()).toBe(1);
    await page.getByLabel('State').selectOption('live');
    await poll(() => page.getByRole('link', { name }).count()).toBe(1);
  });
});
