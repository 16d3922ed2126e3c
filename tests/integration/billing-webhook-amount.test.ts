import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { startStandIns, completeCheckout } from '../support/stand-ins';
import { POST as checkout } from '@/app/api/w/[workspace]/billing/checkout/route';
import { POST as webhook } from '@/app/api/stripe/webhook/route';
import { GET as overview } from '@/app/api/w/[workspace]/billing/route';
import { em } from '@/lib/server/db/orm';
import { Purchase } from '@/entities/purchase';
import { AuditEvent } from '@/entities/audit-event';
import { callRoute, makeWorkspace, signInAs } from '../support/factories';

// Issue 13, finding 12: the webhook credited the stored seat count without comparing what was
// paid. A signed event whose amount or currency is not the purchase's own credits nothing; it
// is acknowledged (200, so Stripe stops retrying), audited as billing.payment_mismatch and the
// purchase stays pending. The matching event for the same session still credits afterwards.

const signer = new Stripe('sk_test_signer_only');
let stop: () => void;
beforeAll(async () => (stop = await startStandIns()));
afterAll(() => stop?.());

type Ws = Awaited<ReturnType<typeof makeWorkspace>>;

async function buy(ws: Ws, bundle = 'pilot') {
  signInAs(ws.owner);
  const res = await callRoute(checkout, { method: 'POST', params: { workspace: ws.slug }, body: { bundle } });
  expect(res.status).toBe(201);
  return (await res.json()) as { sessionId: string };
}

const balance = async (ws: Ws) => {
  signInAs(ws.owner);
  return (await (await callRoute(overview, { params: { workspace: ws.slug } })).json()).balance as number;
};

/** The stand-in's real completed event for the session, with some of the session's fields changed, signed again. */
async function alteredEvent(sessionId: string, change: Record<string, unknown>) {
  const ev = JSON.parse((await completeCheckout(sessionId)).payload);
  ev.id = `${ev.id}_altered_${Object.keys(change).join('_')}`;
  Object.assign(ev.data.object, change);
  const payload = JSON.stringify(ev);
  return { payload, signature: signer.webhooks.generateTestHeaderString({ payload, secret: process.env.STRIPE_WEBHOOK_SECRET! }) };
}

const deliver = (e: { payload: string; signature: string }) =>
  callRoute(webhook, { method: 'POST', params: {}, rawBody: e.payload, headers: { 'stripe-signature': e.signature } });

describe('Stripe webhook: the paid amount and currency must be the purchase’s', () => {
  for (const [label, change] of [
    ['one cent paid', { amount_total: 1 }],
    ['another currency', { currency: 'jpy' }],
    ['no amount at all', { amount_total: null }],
  ] as const) {
    it(`${label}: acknowledged 200, not credited, audited, the purchase still pending`, async () => {
      const ws = await makeWorkspace();
      const start = await balance(ws);
      const { sessionId } = await buy(ws);
      const res = await deliver(await alteredEvent(sessionId, change));
      expect(res.status).toBe(200);
      expect((await res.json()).outcome).toBe('amount_mismatch');
      expect(await balance(ws)).toBe(start);
      const db = (await em()).fork();
      const p = await db.findOneOrFail(Purchase, { checkoutSessionId: sessionId });
      expect(p.status).toBe('pending');
      expect(await db.count(AuditEvent, { workspace: p.workspace, action: 'billing.payment_mismatch' })).toBe(1);
      expect(await db.count(AuditEvent, { workspace: p.workspace, action: 'billing.purchase' })).toBe(0);
    });
  }

  it('the true event for the same session still credits once', async () => {
    const ws = await makeWorkspace();
    const start = await balance(ws);
    const { sessionId } = await buy(ws);
    expect((await (await deliver(await alteredEvent(sessionId, { amount_total: 1 }))).json()).outcome).toBe('amount_mismatch');
    const real = await completeCheckout(sessionId);
    expect((await (await deliver(real)).json()).outcome).toBe('credited');
    expect(await balance(ws)).toBe(start + 100);
  });
});
