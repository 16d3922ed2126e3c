import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { startStandIns, completeCheckout, waitForMail, mailsTo } from '../support/stand-ins';
import { POST as checkout } from '@/app/api/w/[workspace]/billing/checkout/route';
import { POST as webhook } from '@/app/api/stripe/webhook/route';
import { GET as overview } from '@/app/api/w/[workspace]/billing/route';
import { em } from '@/lib/server/db/orm';
import { Purchase } from '@/entities/purchase';
import { AuditEvent } from '@/entities/audit-event';
import { WebhookEvent } from '@/entities/webhook-event';
import { Workspace } from '@/entities/workspace';
import { receiptNumber } from '@/lib/server/billing/webhook';
import { callRoute, makeWorkspace, signInAs } from '../support/factories';

const signer = new Stripe('sk_test_signer_only');
let stop: () => void;
beforeAll(async () => (stop = await startStandIns()));
afterAll(() => stop?.());

type Ws = Awaited<ReturnType<typeof makeWorkspace>>;

async function buy(ws: Ws, bundle = 'pilot') {
  signInAs(ws.owner);
  const res = await callRoute(checkout, { method: 'POST', params: { workspace: ws.slug }, body: { bundle } });
  expect(res.status).toBe(201);
  return (await res.json()) as { url: string; sessionId: string };
}

async function balance(ws: Ws): Promise<number> {
  signInAs(ws.owner);
  return (await (await callRoute(overview, { params: { workspace: ws.slug } })).json()).balance;
}

const deliver = (payload: string, signature: string) =>
  callRoute(webhook, { method: 'POST', params: {}, rawBody: payload, headers: { 'stripe-signature': signature } });

describe('Stripe webhook: seats credited exactly once per payment', () => {
  it('a correctly signed checkout.session.completed credits the bundle, marks the purchase paid, audits, sends a receipt', async () => {
    const ws = await makeWorkspace();
    const { sessionId } = await buy(ws, 'study');
    expect(await balance(ws)).toBe(25);
    const ev = await completeCheckout(sessionId);
    const res = await deliver(ev.payload, ev.signature);
    expect(res.status).toBe(200);
    expect((await res.json()).outcome).toBe('credited');
    expect(await balance(ws)).toBe(425);
    const db = await em();
    const p = await db.findOneOrFail(Purchase, { checkoutSessionId: sessionId });
    expect(p.status).toBe('paid');
    expect(p.paidAt).toBeInstanceOf(Date);
    expect(await db.count(AuditEvent, { workspace: p.workspace, action: 'billing.purchase' })).toBe(1);
    const [mail] = await waitForMail(ws.owner.email);
    // Receipt number (stable per purchase), date and the workspace's name as the billing name.
    const number = receiptNumber(p.id, p.paidAt!);
    expect(number).toMatch(/^NW-\d{4}-[0-9A-F]{4}-[0-9A-F]{4}-[0-9A-F]{4}$/);
    expect(mail.subject).toBe(`Receipt ${number}: Study bundle, 400 seats`);
    expect(mail.text).toContain(`Receipt number: ${number}`);
    expect(mail.text).toContain(`Date: ${p.paidAt!.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })}`);
    expect(mail.text).toContain(`Billed to: ${(await db.findOneOrFail(Workspace, { slug: ws.slug })).name}`);
    expect(mail.text).toContain('€320.00');
    expect(mail.text).toContain('balance is now 425 seats');
    expect(mail.html).toContain('<p>');
  });

  it('the same event delivered twice credits once and sends one receipt', async () => {
    const ws = await makeWorkspace();
    const { sessionId } = await buy(ws);
    const ev = await completeCheckout(sessionId);
    expect((await (await deliver(ev.payload, ev.signature)).json()).outcome).toBe('credited');
    const again = await deliver(ev.payload, signer.webhooks.generateTestHeaderString({ payload: ev.payload, secret: process.env.STRIPE_WEBHOOK_SECRET! }));
    expect(again.status).toBe(200);
    expect((await again.json()).outcome).toBe('duplicate_event');
    expect(await balance(ws)).toBe(125);
    await waitForMail(ws.owner.email);
    await new Promise((r) => setTimeout(r, 500));
    expect(await mailsTo(ws.owner.email)).toHaveLength(1);
  });

  it('two different events for the same session credit once, whichever arrives first', async () => {
    const ws = await makeWorkspace();
    const { sessionId } = await buy(ws);
    const first = await completeCheckout(sessionId);
    const second = await completeCheckout(sessionId);
    expect(second.event_id).not.toBe(first.event_id);
    // Delivered out of order: the later event first.
    expect((await (await deliver(second.payload, second.signature)).json()).outcome).toBe('credited');
    expect((await (await deliver(first.payload, first.signature)).json()).outcome).toBe('already_credited');
    expect(await balance(ws)).toBe(125);
  });

  it('concurrent deliveries (same event and a second event) credit once', async () => {
    const ws = await makeWorkspace();
    const { sessionId } = await buy(ws, 'programme');
    const a = await completeCheckout(sessionId);
    const b = await completeCheckout(sessionId);
    const results = await Promise.all([deliver(a.payload, a.signature), deliver(a.payload, a.signature), deliver(b.payload, b.signature), deliver(a.payload, a.signature)]);
    const outcomes = await Promise.all(results.map(async (r) => (expect(r.status).toBe(200), (await r.json()).outcome)));
    expect(outcomes.filter((o) => o === 'credited')).toHaveLength(1);
    expect(await balance(ws)).toBe(1525);
    await waitForMail(ws.owner.email);
    await new Promise((r) => setTimeout(r, 500));
    expect(await mailsTo(ws.owner.email)).toHaveLength(1);
  });

  it('a wrong signature gets 400 JSON and changes nothing', async () => {
    const ws = await makeWorkspace();
    const { sessionId } = await buy(ws);
    const ev = await completeCheckout(sessionId);
    const forged = signer.webhooks.generateTestHeaderString({ payload: ev.payload, secret: 'whsec_not_the_real_secret' });
    for (const sig of [forged, 't=1,v1=deadbeef', '']) {
      const res = await deliver(ev.payload, sig);
      expect(res.status).toBe(400);
      expect((await res.json()).error.code).toBe('bad_request');
    }
    // A valid signature over a tampered body is refused too.
    const tampered = ev.payload.replace('"paid"', '"paid" ');
    expect((await deliver(tampered, ev.signature)).status).toBe(400);
    expect(await balance(ws)).toBe(25);
    const db = await em();
    expect(await db.count(WebhookEvent, { id: ev.event_id })).toBe(0);
    expect((await db.findOneOrFail(Purchase, { checkoutSessionId: sessionId })).status).toBe('pending');
  });

  it('other event types and unpaid sessions get 200 and change nothing', async () => {
    const ws = await makeWorkspace();
    const payload = JSON.stringify({ id: 'evt_other_' + Date.now(), object: 'event', type: 'customer.created', data: { object: { id: 'cus_1' } } });
    const sig = signer.webhooks.generateTestHeaderString({ payload, secret: process.env.STRIPE_WEBHOOK_SECRET! });
    const res = await deliver(payload, sig);
    expect(res.status).toBe(200);
    expect((await res.json()).outcome).toBe('ignored');
    expect(await balance(ws)).toBe(25);
  });
});
