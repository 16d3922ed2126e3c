import 'server-only';
import { LockMode } from '@mikro-orm/postgresql';
import type Stripe from 'stripe';
import { Purchase } from '@/entities/purchase';
import { findBundle } from '@/lib/billing-bundles';
import { formatCents } from '@/lib/money';
import { recordAudit } from '@/lib/server/team/audit';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import { env } from '@/lib/server/platform/env';
import { AppError } from '@/lib/server/http/errors';
import { composeMail, sendMail } from '@/lib/server/platform/mail';
import { creditPurchase, seatBalance } from './seat-ledger';
import { stripe } from './stripe';
import { receiptNumber } from './receipt-number';

// Stripe's webhook: the signature is checked over the raw body (a bad or missing one is a 400),
// then seats are credited exactly once in one transaction — the event id goes into
// webhook_event first (a replayed event stops there), then the ledger entry keyed by the
// checkout session (a second event for the same session adds nothing), the purchase marked
// paid and the `billing.purchase` audit event. Only the delivery that credited sends the
// receipt, and a mail failure is logged, not thrown, so Stripe does not retry a paid event.
// Before crediting, the amount and currency Stripe collected must be the purchase's own: a
// session paid for less (or in another currency) is not credited — it is logged and audited as
// `billing.payment_mismatch` and the purchase stays pending for a person to look at. The answer
// is still 200: Stripe retries any other status for days, and a retry cannot make the amount
// right (Stripe's guidance: acknowledge receipt with a 2xx, then handle the event).
// The signing secret has no fallback in production (lib/env-schema.ts refuses to start).
// The receipt carries its number (receiptNumber(): from the purchase id, so a resend names the
// same receipt), the payment date and the workspace's name as the billing name.
// Tests: tests/integration/billing-webhook.test.ts (replays, two events, Promise.all, bad signatures).

/** The event, if Stripe's signature over the raw body checks out; else a 400. */
export function verifyStripeEvent(rawBody: string, signature: string | null): Stripe.Event {
  if (!signature) throw new AppError(400, 'bad_request', 'Missing Stripe-Signature header.');
  try {
    return stripe().webhooks.constructEvent(rawBody, signature, env().STRIPE_WEBHOOK_SECRET);
  } catch {
    throw new AppError(400, 'bad_request', 'The webhook signature does not match.');
  }
}

export type WebhookOutcome = 'credited' | 'duplicate_event' | 'already_credited' | 'ignored' | 'unknown_purchase' | 'amount_mismatch';

interface Credited {
  workspaceId: string;
  workspaceName: string;
  purchaseId: string;
  paidAt: Date;
  buyer: { email: string; name: string } | null;
  bundle: string;
  seats: number;
  amountCents: number;
  currency: string;
  sessionId: string;
}

/**
 * Applies one verified event. A paid `checkout.session.completed` credits the bundle's seats
 * in one transaction that first records the event id (a replayed event stops there) and then
 * inserts the ledger entry keyed by the session id (a second event for the same session adds
 * nothing). The receipt goes out only from the delivery that credited.
 */
export async function applyStripeEvent(event: Stripe.Event): Promise<WebhookOutcome> {
  if (event.type !== 'checkout.session.completed') return 'ignored';
  const session = event.data.object;
  if (session.payment_status !== 'paid') return 'ignored';
  const db = await em();
  let credited = null as Credited | null;
  const outcome = await db.transactional(async (tx): Promise<WebhookOutcome> => {
    const fresh = await sql(tx, 'insert into webhook_event (id, type, received_at) values (?, ?, now()) on conflict (id) do nothing returning id', [event.id, event.type]);
    if (fresh.length === 0) return 'duplicate_event';
    const p = await tx.findOne(Purchase, { checkoutSessionId: session.id }, { populate: ['buyer', 'workspace'], lockMode: LockMode.PESSIMISTIC_WRITE });
    if (!p || p.workspace.id !== session.metadata?.workspaceId) return 'unknown_purchase';
    const paid = { amountCents: session.amount_total, currency: (session.currency ?? '').toUpperCase() };
    if (paid.amountCents !== p.amountCents || paid.currency !== p.currency.toUpperCase()) {
      console.error('[billing] payment does not match the purchase; not credited', { checkoutSessionId: session.id, expected: { amountCents: p.amountCents, currency: p.currency }, paid });
      await recordAudit(tx, {
        workspace: p.workspace.id,
        actor: null,
        action: 'billing.payment_mismatch',
        target: `${findBundle(p.bundle)?.name ?? p.bundle} bundle: paid ${paid.amountCents ?? '?'} ${paid.currency || '?'}, expected ${p.amountCents} ${p.currency}`,
        detail: { checkoutSessionId: session.id, expected: { amountCents: p.amountCents, currency: p.currency }, paid },
      });
      return 'amount_mismatch';
    }
    const note = `${findBundle(p.bundle)?.name ?? p.bundle} bundle`;
    if (!(await creditPurchase(tx, { workspaceId: p.workspace.id, seats: p.seats, checkoutSessionId: session.id, note }))) return 'already_credited';
    p.status = 'paid';
    p.paidAt = new Date();
    await tx.flush();
    await recordAudit(tx, {
      workspace: p.workspace.id,
      actor: p.buyer?.id ?? null,
      action: 'billing.purchase',
      target: `${findBundle(p.bundle)?.name ?? p.bundle} bundle, ${p.seats} seats`,
      detail: { checkoutSessionId: session.id, seats: p.seats, amountCents: p.amountCents, currency: p.currency },
    });
    credited = { workspaceId: p.workspace.id, workspaceName: p.workspace.name, purchaseId: p.id, paidAt: p.paidAt, buyer: p.buyer ? { email: p.buyer.email, name: p.buyer.name } : null, bundle: p.bundle, seats: p.seats, amountCents: p.amountCents, currency: p.currency, sessionId: session.id };
    return 'credited';
  });
  if (credited) await sendReceipt(credited, session.customer_details?.email ?? session.customer_email ?? null);
  return outcome;
}

export { receiptNumber };

const receiptDate = (d: Date) => d.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

async function sendReceipt(c: Credited, stripeEmail: string | null) {
  const to = c.buyer?.email ?? stripeEmail;
  if (!to) return;
  const balance = await seatBalance(await em(), c.workspaceId);
  const name = findBundle(c.bundle)?.name ?? c.bundle;
  const number = receiptNumber(c.purchaseId, c.paidAt);
  const { text, html } = composeMail([
    `Hello ${c.buyer?.name ?? ''},`.replace(' ,', ','),
    `Thank you: your payment of ${formatCents(c.amountCents, c.currency)} for the ${name} bundle is confirmed.`,
    `Receipt number: ${number}`,
    `Date: ${receiptDate(c.paidAt)}`,
    `Billed to: ${c.workspaceName}`,
    `${c.seats} respondent seats were added to your workspace; the balance is now ${balance} seats.`,
    `Payment reference: ${c.sessionId}`,
  ]);
  try {
    await sendMail({ to, subject: `Receipt ${number}: ${name} bundle, ${c.seats} seats`, text, html });
  } catch (err) {
    // The seats are credited already; a mail outage must not make Stripe retry the payment.
    console.error('[billing] receipt e-mail failed', err);
  }
}
