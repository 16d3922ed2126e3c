// The end-to-end tier's browser: Debian's Chromium (CHROMIUM_PATH, default /usr/bin/chromium)
// driven by playwright-core, so no browser is downloaded. Each test gets a throw-away profile;
// `phone: true` gives a phone-sized viewport for the respondent flow. Screenshots go to
// .test-output/screenshots. The app's address comes from the e2e global setup (`inject`).
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { mkdtempSync, mkdirSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { inject } from 'vitest';

export const OUTPUT_DIR = path.resolve(__dirname, '../../.test-output/screenshots');

export function baseUrl(): string {
  return inject('appUrl');
}

export async function openBrowser(opts: { phone?: boolean } = {}): Promise<{ context: BrowserContext; page: Page }> {
  const profile = mkdtempSync(path.join(os.tmpdir(), 'notchwise-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    viewport: opts.phone ? { width: 390, height: 844 } : { width: 1280, height: 860 },
    deviceScaleFactor: opts.phone ? 2 : 1,
    isMobile: opts.phone ?? false,
    hasTouch: opts.phone ?? false,
    acceptDownloads: true,
  });
  context.setDefaultTimeout(20_000);
  const page = context.pages()[0] ?? (await context.newPage());
  return { context, page };
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(OUTPUT_DIR, { recursive: true });
  const file = path.join(OUTPUT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

export async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${baseUrl()}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/w\//);
}
