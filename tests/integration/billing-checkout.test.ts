import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startStandIns, completeCheckout, STRIPE_URL } from '../support/stand-ins';
import { POST as checkout } from '@/app/api/w/[workspace]/billing/checkout/route';
import { GET as status } from '@/app/api/w/[workspace]/billing/checkout/[session]/route';
import { GET as overview } from '@/app/api/w/[workspace]/billing/route';
import { POST as webhook } from '@/app/api/stripe/webhook/route';
import { em } from '@/lib/server/db/orm';
import { Purchase } from '@/entities/purchase';
import { WELCOME_SEATS } from '@/lib/server/billing/seat-ledger';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';

let stop: () => void;
beforeAll(async () => (stop = await startStandIns()));
afterAll(() => stop?.());

const buy = (slug: string, body: unknown) => callRoute(checkout, { method: 'POST', params: { workspace: slug }, body });

describe('checkout session creation', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => (ws = await makeWorkspace()));

  it('the owner gets a Stripe Checkout Session (created through the SDK on the fake server) and a pending purchase', async () => {
    signInAs(ws.owner);
    const res = await buy(ws.slug, { bundle: 'pilot' });
    expect(res.status).toBe(201);
    const { url, sessionId } = await res.json();
    expect(sessionId).toMatch(/^cs_test_/);
    expect(url).toBe(`${STRIPE_URL}/checkout/${sessionId}`);
    const db = await em();
    const p = await db.findOneOrFail(Purchase, { checkoutSessionId: sessionId }, { populate: ['workspace'] });
    expect(p).toMatchObject({ status: 'pending', bundle: 'pilot', seats: 100, amountCents: 9000, currency: 'eur' });
    expect(p.workspace.slug).toBe(ws.slug);
    // What the fake Stripe server holds is what the app asked for.
    const s = await (await fetch(`${STRIPE_URL}/v1/checkout/sessions/${sessionId}`, { headers: { authorization: 'Bearer sk_test_x' } })).json();
    expect(s).toMatchObject({ object: 'checkout.session', amount_total: 9000, currency: 'eur', customer_email: ws.owner.email, payment_status: 'unpaid', status: 'open', mode: 'payment' });
    expect(s.metadata).toEqual({ workspaceId: p.workspace.id, purchaseId: p.id, bundle: 'pilot' });
    expect(s.success_url).toMatch(new RegExp(`/w/${ws.slug}/billing/success\\?session_id=\\{CHECKOUT_SESSION_ID\\}$`));
    expect(s.cancel_url).toMatch(new RegExp(`/w/${ws.slug}/billing/cancel$`));
  });

  it('the status route shows pending (no balance) until the webhook credits, then paid with the balance', async () => {
    signInAs(ws.owner);
    const { sessionId } = await (await buy(ws.slug, { bundle: 'pilot' })).json();
    const before = await (await callRoute(status, { params: { workspace: ws.slug, session: sessionId } })).json();
    expect(before).toMatchObject({ status: 'pending', balance: null, seats: 100 });
    const ev = await completeCheckout(sessionId);
    await callRoute(webhook, { method: 'POST', params: {}, rawBody: ev.payload, headers: { 'stripe-signature': ev.signature } });
    signInAs(ws.owner);
    const after = await (await callRoute(status, { params: { workspace: ws.slug, session: sessionId } })).json();
    expect(after).toMatchObject({ status: 'paid', balance: 125 });
  });

  it('analyst and viewer get 403 and no purchase is made; they still read the balance', async () => {
    const db = await em();
    const before = await db.count(Purchase, { workspace: { slug: ws.slug } });
    signInAs(ws.owner);
    const ownerBalance = (await (await callRoute(overview, { params: { workspace: ws.slug } })).json()).balance;
    expect(ownerBalance).toBeGreaterThanOrEqual(WELCOME_SEATS);
    for (const role of ['analyst', 'viewer'] as const) {
      signInAs(await makeMember(ws.slug, role));
      const res = await buy(ws.slug, { bundle: 'pilot' });
      expect(res.status).toBe(403);
      expect((await res.json()).error.code).toBe('forbidden');
      const o = await (await callRoute(overview, { params: { workspace: ws.slug } })).json();
      expect(o.canBuy).toBe(false);
      // Every member reads the same balance as the owner.
      expect(o.balance).toBe(ownerBalance);
    }
    expect(await db.count(Purchase, { workspace: { slug: ws.slug } })).toBe(before);
  });

  it('an owner of another workspace gets 404 for this one, and for its purchase status', async () => {
    signInAs(ws.owner);
    const { sessionId } = await (await buy(ws.slug, { bundle: 'pilot' })).json();
    const other = await makeWorkspace();
    signInAs(other.owner);
    expect((await buy(ws.slug, { bundle: 'pilot' })).status).toBe(404);
    expect((await callRoute(status, { params: { workspace: other.slug, session: sessionId } })).status).toBe(404);
  });

  it('signed out is 401; an unknown bundle is 422 naming the field; malformed JSON 400', async () => {
    signInAs(null);
    expect((await buy(ws.slug, { bundle: 'pilot' })).status).toBe(401);
    signInAs(ws.owner);
    const bad = await buy(ws.slug, { bundle: 'everything' });
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.issues[0].path).toBe('bundle');
    expect((await callRoute(checkout, { method: 'POST', params: { workspace: ws.slug }, rawBody: '{' })).status).toBe(400);
  });
});
