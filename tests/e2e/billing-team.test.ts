import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signIn } from '../support/browser';
import { DEMO_WORKSPACE } from '../../scripts/seed/accounts';

const DEMO_PASSWORD = 'harbour-demo-2026';

async function balanceOn(page: Page): Promise<number> {
  return Number((await page.getByTestId('seat-balance').first().textContent())!.replace(/[^\d]/g, ''));
}

/** The invitation link from the e-mail maildev caught (its REST API: GET /api/email). */
async function invitationLink(address: string): Promise<string> {
  const until = Date.now() + 15_000;
  for (;;) {
    const mails = (await (await fetch(`${inject('mailApiUrl')}/api/email`)).json()) as { to: { address: string }[]; text: string }[];
    const mail = mails.find((m) => m.to.some((t) => t.address === address));
    const link = mail?.text.match(/https?:\/\/\S+\/invite\/[\w-]+/)?.[0];
    if (link) return link;
    if (Date.now() > until) throw new Error(`no invitation e-mail for ${address}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** The receipt e-mail with this number, from the mail catcher. */
async function receiptMail(address: string, number: string): Promise<{ subject: string; text: string }> {
  const until = Date.now() + 15_000;
  for (;;) {
    const mails = (await (await fetch(`${inject('mailApiUrl')}/api/email`)).json()) as { to: { address: string }[]; subject: string; text: string }[];
    const mail = mails.find((m) => m.to.some((t) => t.address === address) && m.subject.includes(number));
    if (mail) return mail;
    if (Date.now() > until) throw new Error(`no receipt ${number} for ${address}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

describe('seat bundles and team in Chromium', () => {
  let context: BrowserContext;
  let page: Page;
  beforeAll(async () => {
    ({ context, page } = await openBrowser());
    await signIn(page, 'owner@harbourline.example', DEMO_PASSWORD);
  });
  afterAll(async () => context?.close());

  it('the owner buys a bundle on the stand-in checkout page and sees the balance rise once the webhook arrives', async () => {
    await page.goto(`${baseUrl()}/w/harbourline/billing`);
    const before = await balanceOn(page);
    await page.getByRole('button', { name: 'Buy Pilot bundle' }).click();
    await page.waitForURL(/\/checkout\/cs_test_/);
    expect(await page.getByTestId('amount').textContent()).toBe('€90.00');
    expect(await page.getByTestId('customer-email').textContent()).toBe('owner@harbourline.example');
    await page.getByRole('button', { name: 'Pay' }).click();
    await page.waitForURL(/\/w\/harbourline\/billing\/success\?session_id=cs_test_/);
    await expect.poll(() => page.getByText('Payment confirmed').count(), { timeout: 15_000 }).toBe(1);
    expect(await balanceOn(page)).toBe(before + 100);

    await page.getByRole('link', { name: 'Back to billing' }).click();
    await page.waitForURL(/\/billing$/);
    expect(await balanceOn(page)).toBe(before + 100);
    const line = (await page.getByTestId('ledger').locator('tbody tr').first().textContent())!;
    expect(line).toContain('+100');
    // The ledger names the purchase by its receipt number, in words; no raw id anywhere in it.
    expect(line).toContain('Pilot bundle bought');
    const receipt = line.match(/Receipt (NW-\d{4}-[0-9A-F]{4}-[0-9A-F]{4}-[0-9A-F]{4})/)?.[1];
    expect(receipt, line).toBeTruthy();
    expect(await page.getByTestId('ledger').textContent()).not.toMatch(/cs_test_|[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}/);
    expect(await page.getByTestId('ledger').getByText('Welcome seats').count()).toBeGreaterThan(0);
    await screenshot(page, 'billing');

    // The receipt e-mail, caught by the mail catcher: the same number, the date, the workspace's billing name.
    const mail = await receiptMail('owner@harbourline.example', receipt!);
    expect(mail.text).toContain(`Receipt number: ${receipt}`);
    const today = new Date().toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
    expect(mail.text).toContain(`Date: ${today}`);
    expect(mail.text).toContain(`Billed to: ${DEMO_WORKSPACE.name}`);
  });

  it('cancelling on the checkout page comes back with nothing charged', async () => {
    await page.goto(`${baseUrl()}/w/harbourline/billing`);
    const before = await balanceOn(page);
    await page.getByRole('button', { name: 'Buy Study bundle' }).click();
    await page.waitForURL(/\/checkout\/cs_test_/);
    await page.getByRole('button', { name: 'Cancel' }).click();
    await page.waitForURL(/\/billing\/cancel$/);
    expect(await page.getByText('nothing was charged').count()).toBe(1);
    await page.goto(`${baseUrl()}/w/harbourline/billing`);
    expect(await balanceOn(page)).toBe(before);
  });

  it('the owner invites a new address as analyst; the invitee signs up from the e-mail link and lands as Analyst', async () => {
    const email = `invitee-${Date.now()}@test.example`;
    await page.goto(`${baseUrl()}/w/harbourline/team`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Role', { exact: true }).selectOption('analyst');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => page.getByText(`Invitation sent to ${email}.`).count()).toBe(1);
    await expect.poll(() => page.getByTestId('invitations').getByText(email).count()).toBe(1);
    await screenshot(page, 'team');

    const link = await invitationLink(email);
    const { context: c2, page: p2 } = await openBrowser();
    try {
      await p2.goto(link);
      expect(await p2.getByRole('heading', { name: /Join Harbourline Market/ }).count()).toBe(1);
      expect(await p2.getByLabel('E-mail').inputValue()).toBe(email);
      await p2.getByLabel('Your name').fill('Lena Ortmann');
      await p2.getByLabel('Password').fill('long-enough-password');
      await p2.getByRole('button', { name: 'Create account and join' }).click();
      await p2.waitForURL(/\/w\/harbourline$/);
      await expect.poll(() => p2.getByTestId('signed-in-as').textContent()).toContain('Lena Ortmann · Analyst');
      // The link was single use.
      await p2.goto(link);
      expect(await p2.getByText('already been used').count()).toBe(1);
    } finally {
      await c2.close();
    }
    await page.goto(`${baseUrl()}/w/harbourline/team`);
    expect(await page.getByTestId('members').getByText(email).count()).toBe(1);
  });
});
