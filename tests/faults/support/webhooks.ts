// Signed Stripe events for purchases written straight into the table, delivered like Stripe does
// (retried on any non-2xx answer or a lost connection).
import { randomUUID } from 'node:crypto';
import Stripe from 'stripe';
import type pg from 'pg';
import { WEBHOOK_SECRET } from '../../../scripts/load/app';
import { request } from '../../../scripts/load/respondent-client';
import { sleep } from './respondents';

const signer = new Stripe('sk_test_signer_only');

export async function pendingPurchase(pool: pg.Pool, workspaceId: string, seats: number) {
  const sessionId = `cs_test_${randomUUID().replace(/-/g, '')}`;
  // 9000 EUR cents: completedEvent reports the same amount, which the webhook compares before crediting.
  await pool.query(
    `insert into purchase (id, workspace_id, buyer_id, bundle, seats, amount_cents, currency, checkout_session_id, status, created_at) values ($1, $2, null, 'pilot', $3, 9000, 'eur', $4, 'pending', now())`,
    [randomUUID(), workspaceId, seats, sessionId],
  );
  return sessionId;
}

export function completedEvent(sessionId: string, workspaceId: string, type = 'checkout.session.completed') {
  const payload = JSON.stringify({
    id: `evt_${randomUUID().replace(/-/g, '')}`, object: 'event', type, created: Math.floor(Date.now() / 1000), livemode: false,
    data: { object: { id: sessionId, object: 'checkout.session', payment_status: 'paid', status: 'complete', amount_total: 9000, currency: 'eur', customer_email: null, metadata: { workspaceId } } },
  });
  return payload;
}

/** Delivers until the app answers 2xx; returns the outcomes it reported. */
export async function deliverUntilAccepted(base: string, payload: string, timeoutMs = 60_000): Promise<string> {
  const end = Date.now() + timeoutMs;
  for (let i = 0; ; i++) {
    const signature = signer.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET });
    const r = await request(base, 'POST', '/api/stripe/webhook', undefined, { 'stripe-signature': signature }, payload);
    if (r.status >= 200 && r.status < 300) return (r.body as { outcome: string }).outcome;
    if (Date.now() > end) throw new Error(`webhook not accepted: ${r.status} ${JSON.stringify(r.body)}`);
    await sleep(Math.min(2000, 200 * 2 ** i));
  }
}
