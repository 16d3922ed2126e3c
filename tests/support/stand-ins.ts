// The local stand-ins (fake Stripe server, maildev) for integration tests: reused when
// `npm test` already runs them on these ports, started here (and stopped after) otherwise.
// The env lines below must run before the app's env module is first read, so import this
// file before any lib/server module. Mail is read through maildev's REST API, which is
// GET /api/email (not /email). Ports come from scripts/lib/test-env.mjs.
import net from 'node:net';
import type { ChildProcess } from 'node:child_process';
import { TEST_MAIL_WEB_PORT, TEST_SMTP_PORT, TEST_STRIPE_PORT, TEST_STRIPE_WEBHOOK_SECRET } from '../../scripts/lib/test-env.mjs';
import { startFakeStripe, startMailCatcher, waitForPort } from '../../scripts/lib/services.mjs';

// Set before the app's env module is first read in this test file.
process.env.STRIPE_FAKE_URL ??= `http://127.0.0.1:${TEST_STRIPE_PORT}`;
process.env.STRIPE_SECRET_KEY ??= 'sk_test_local_fake';
process.env.STRIPE_WEBHOOK_SECRET ??= TEST_STRIPE_WEBHOOK_SECRET;
process.env.SMTP_PORT = String(TEST_SMTP_PORT);
process.env.APP_URL ??= 'http://127.0.0.1:3999';

export const STRIPE_URL = process.env.STRIPE_FAKE_URL;
export const MAIL_API = process.env.MAIL_API_URL ?? `http://127.0.0.1:${TEST_MAIL_WEB_PORT}`;

function listening(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ host: '127.0.0.1', port });
    s.once('connect', () => (s.destroy(), resolve(true)));
    s.once('error', () => resolve(false));
  });
}

/** Ensures both stand-ins answer; returns a function that stops the ones started here. */
export async function startStandIns(): Promise<() => void> {
  const started: ChildProcess[] = [];
  if (!(await listening(TEST_STRIPE_PORT))) {
    started.push(startFakeStripe({ port: TEST_STRIPE_PORT, webhookUrl: '', webhookSecret: process.env.STRIPE_WEBHOOK_SECRET!, quiet: true }));
  }
  if (!(await listening(TEST_SMTP_PORT))) started.push(startMailCatcher({ smtpPort: TEST_SMTP_PORT, webPort: TEST_MAIL_WEB_PORT, quiet: true }));
  await Promise.all([waitForPort(TEST_STRIPE_PORT), waitForPort(TEST_SMTP_PORT), waitForPort(TEST_MAIL_WEB_PORT)]);
  return () => started.forEach((c) => c.kill('SIGTERM'));
}

export interface CaughtMail {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string }[];
}

/** Messages maildev caught for one address (its REST API: GET /api/email). */
export async function mailsTo(address: string): Promise<CaughtMail[]> {
  const all = (await (await fetch(`${MAIL_API}/api/email`)).json()) as CaughtMail[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
}

/** Waits until at least `count` messages reached the address (SMTP delivery is asynchronous). */
export async function waitForMail(address: string, count = 1, timeoutMs = 10_000): Promise<CaughtMail[]> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const found = await mailsTo(address);
    if (found.length >= count || Date.now() > until) return found;
    await new Promise((r) => setTimeout(r, 150));
  }
}

/** Pays a session on the fake Stripe server and returns its signed event (not delivered). */
export async function completeCheckout(sessionId: string): Promise<{ event_id: string; payload: string; signature: string }> {
  const r = await fetch(`${STRIPE_URL}/_test/checkout/sessions/${sessionId}/complete`, { method: 'POST' });
  if (!r.ok) throw new Error(`fake Stripe: ${r.status} ${await r.text()}`);
  return r.json();
}
