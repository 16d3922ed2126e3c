import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';
import { cspDirectives } from '../support/csp';
import { toNextTrial } from '../support/respondent-walk';

// The study is made through the data layer against the app's database.
process.env.DATABASE_URL ??= inject('databaseUrl');
process.env.AUTH_SECRET ??= 'e2e-data-layer-secret-0123456789abcdef';

describe('a respondent completes a study on a phone', () => {
  let context: BrowserContext;
  let page: Page;
  let study: { studyId: string; token: string; workspaceId: string };
  let before: number;
  beforeAll(async () => {
    const { makeLiveStudy, testDesign, balanceOf } = await import('../support/respondent-fixtures');
    const design = testDesign({ name: 'Pantry oil: phone check', basePrices: [2.49, 9.99, 49], ladder: [0.03, 0.06, 0.12, 0.24], repetitions: 1, catchShare: 0.2, practiceTrials: 2, viewMs: 400 });
    study = await makeLiveStudy('harbourline', { design });
    before = await balanceOf(study.workspaceId);
    ({ context, page } = await openBrowser({ phone: true }));
  });
  afterAll(async () => {
    await context?.close();
    const { orm } = await import('@/lib/server/db/orm');
    await (await orm()).close(true);
  });

  it('consent → segment question → practice → trials → thank you', async () => {
    const scripts: string[] = [];
    page.on('request', (r) => { if (r.resourceType() === 'script') scripts.push(new URL(r.url()).pathname); });
    // Anything the browser refused under the script policy, and any hydration or script error.
    const problems: string[] = [];
    page.on('console', (m) => { if (/Content Security Policy|Refused to|React error|hydrat/i.test(m.text())) problems.push(m.text()); });
    page.on('pageerror', (e) => problems.push(e.message));
    // Counts server-rendered forms taken out of the page: hydration keeps the consent form, a fresh render would replace it.
    await page.addInitScript(() => {
      const w = window as unknown as { removedForms: number };
      w.removedForms = 0;
      new MutationObserver((records) => {
        for (const r of records) for (const n of r.removedNodes) if (n instanceof Element && (n.matches('form') || n.querySelector('form'))) w.removedForms++;
      }).observe(document, { childList: true, subtree: true });
    });
    await page.goto(`${baseUrl()}/r/${study.token}`);
    await page.waitForURL(/\/take-part/);
    await expect.poll(() => page.getByText('No names or e-mail addresses are stored.').count()).toBe(1);
    expect(await page.getByText(/kept for 365 days/).count()).toBe(1);
    await page.waitForLoadState('networkidle');
    expect(await page.evaluate(() => (window as unknown as { removedForms: number }).removedForms)).toBe(0);
    await screenshot(page, 'respondent-consent');
    await page.getByRole('button', { name: 'I agree, start' }).click();
    await page.getByRole('button', { name: '2', exact: true }).click();

    let trials = 0;
    let shot = false;
    // Between trials: the task's instructions and the practice feedback (checked in respondent-phone-flow.test.ts).
    for (let i = 0; i < 200 && (await toNextTrial(page)).at === 'trial'; i++) {
      const trial = page.getByTestId('trial');
      if ((await trial.getAttribute('data-kind')) === 'attention') {
        await page.getByRole('button', { name: 'Often' }).click();
      } else {
        if (!shot && (await trial.getAttribute('data-kind')) === 'trial') {
          await page.locator('[data-phase="view"]').waitFor();
          await screenshot(page, 'respondent-trial');
          shot = true;
        }
        // Tags are hidden before the choice appears: never two plain prices with the buttons.
        const left = page.getByRole('button', { name: 'Left', exact: true });
        await left.waitFor();
        expect(await page.getByTestId('price-tag').count()).toBe(0);
        await left.click();
      }
      trials++;
    }
    await page.getByTestId('thanks').waitFor();
    expect(trials).toBe(15); // 2 practice + 12 test + 1 attention (the pick task draws no catch trials)
    // The reference code for a deletion request, as stored for this respondent (not its id).
    expect(await page.getByTestId('reference-code').innerText()).toMatch(/^[0-9A-HJKMNP-TV-Z]{5}-[0-9A-HJKMNP-TV-Z]{5}$/);
    expect(shot).toBe(true);
    // The flow's own bundle only: no Next.js client runtime on the respondent pages.
    expect(scripts.length).toBe(1);
    expect(scripts[0]).toMatch(/^\/r-assets\/main-[\w-]+\.js$/);
    expect(problems).toEqual([]);
  });

  it('before the script has loaded the consent form still starts; the flow resumes once it loads', async () => {
    const { makeLiveStudy, testDesign } = await import('../support/respondent-fixtures');
    const other = await makeLiveStudy('harbourline', { design: testDesign({ name: 'Pantry oil: slow script', viewMs: 400 }) });
    const { context: c3, page: p3 } = await openBrowser({ phone: true });
    try {
      await p3.route('**/r-assets/*.js', (r) => r.abort());
      const res = await p3.goto(`${baseUrl()}/r/${other.token}`);
      // One policy, and its script-src exactly 'self': no inline script of any kind.
      const policies = (await res!.headersArray()).filter((h) => h.name.toLowerCase() === 'content-security-policy');
      expect(policies).toHaveLength(1);
      expect(cspDirectives(policies[0].value).get('script-src')).toEqual(["'self'"]);
      await p3.getByRole('button', { name: 'I agree, start' }).click();
      await p3.waitForURL(/\/take-part\?resume=/);
      await p3.getByTestId('waiting').waitFor();
      await p3.unroute('**/r-assets/*.js');
      await p3.reload();
      await p3.getByRole('button', { name: '3 or more', exact: true }).click();
      await toNextTrial(p3);
      expect(await p3.getByTestId('progress').count()).toBe(1);
    } finally {
      await c3.close();
    }
  });

  // Protects: a finished shopper who reopens the link is thanked again, never offered consent
  // (and with it a second respondent and a second seat).
  it('reopening the link after completing shows the thank-you page again', async () => {
    await page.goto(`${baseUrl()}/r/${study.token}`);
    await page.getByTestId('thanks').waitFor();
    expect(await page.getByTestId('thanks').innerText()).toMatch(/thank/i);
    expect(await page.getByRole('button', { name: 'I agree, start' }).count()).toBe(0);
  });

  it("an unknown link: a real 404 with the flow's own stop screen, styled by the bundle's stylesheet, and no script", async () => {
    const scripts: string[] = [];
    const onRequest = (r: { resourceType(): string; url(): string }) => { if (r.resourceType() === 'script') scripts.push(r.url()); };
    page.on('request', onRequest);
    try {
      const res = await page.goto(`${baseUrl()}/r/no-such-link-0000`);
      expect(res?.status()).toBe(404);
      await page.getByTestId('stopped').waitFor();
      expect(await page.getByRole('heading', { name: 'No study at this address' }).count()).toBe(1);
      // The page's colours come from the stylesheet (no inline style is allowed): paper, not the browser's white.
      expect(await page.evaluate(() => getComputedStyle(document.body).backgroundColor)).toBe('rgb(250, 247, 242)');
      expect(scripts).toEqual([]);
      await screenshot(page, 'respondent-stopped');
    } finally {
      page.off('request', onRequest);
    }
  });

  it('the analyst sees 1 complete and one seat fewer', async () => {
    const { context: c2, page: p2 } = await openBrowser();
    try {
      await signIn(p2, 'analyst@harbourline.example', 'harbour-demo-2026');
      await p2.goto(`${baseUrl()}/w/harbourline/studies/${study.studyId}`);
      await expect.poll(() => p2.getByTestId('completes').textContent(), { timeout: 20_000 }).toBe('1');
      expect(Number(await p2.getByTestId('seats-left').textContent())).toBe(before - 1);
    } finally {
      await c2.close();
    }
  });
});
