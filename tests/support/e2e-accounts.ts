// New accounts in the end-to-end tier: sign up in the browser, follow the confirmation link
// the worker mailed (read from maildev's REST API, GET /api/email), then sign in. Sign-up
// itself never opens a session: it answers "check your e-mail" for new and existing addresses.
import { inject } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl, signIn } from './browser';

/** The newest link of `kind` mailed to `address` (waits for the worker to send it). */
export async function mailedLink(address: string, kind: 'confirm' | 'reset' | 'invite', timeoutMs = 20_000): Promise<string> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const mails = (await (await fetch(`${inject('mailApiUrl')}/api/email`)).json()) as { to: { address: string }[]; text: string }[];
    const link = mails
      .filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()))
      .map((m) => m.text.match(new RegExp(`https?://\\S+/${kind}/[\\w-]+`))?.[0])
      .filter(Boolean)
      .at(-1);
    if (link) return link;
    if (Date.now() > until) throw new Error(`no ${kind} e-mail for ${address}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

export interface NewAccount {
  name: string;
  email: string;
  password: string;
  workspaceName: string;
}

/** Fills the sign-up form and waits for the "check your e-mail" answer. */
export async function submitSignUp(page: Page, a: NewAccount) {
  await page.goto(`${baseUrl()}/sign-up`);
  await page.getByLabel('Your name').fill(a.name);
  await page.getByLabel('E-mail').fill(a.email);
  await page.getByLabel('Password').fill(a.password);
  await page.getByLabel('Workspace name').fill(a.workspaceName);
  await page.getByRole('button', { name: 'Open workspace' }).click();
  await page.getByRole('status').filter({ hasText: 'Check your e-mail' }).waitFor();
}

/** Sign-up, confirmation link, sign-in: the browser ends in the new workspace. */
export async function signUpAndConfirm(page: Page, a: NewAccount) {
  await submitSignUp(page, a);
  await page.goto(await mailedLink(a.email, 'confirm'));
  await page.getByRole('button', { name: 'Confirm my address' }).click();
  await page.waitForURL(/\/sign-in\?confirmed=1/);
  await signIn(page, a.email, a.password);
}
