import 'server-only';
import { randomUUID } from 'node:crypto';
import { Purchase } from '@/entities/purchase';
import { BUNDLE_CURRENCY, findBundle, type BundleId } from '@/lib/billing-bundles';
import { em } from '@/lib/server/db/orm';
import { env } from '@/lib/server/platform/env';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { seatBalance, seatHistory } from './seat-ledger';
import { completeDetails, purchaseDetails } from './ledger-details';
import { stripe } from './stripe';

// Buying seats, the analyst-facing half: the billing page's balance and ledger, starting a
// Checkout Session (owner only; the Session first, then a pending Purchase keyed by its id, so
// a failed Stripe call leaves no row), and the success page's polling of that purchase. No
// seat is credited here: only the verified webhook (./webhook.ts) does, through the seat ledger.
// Tests: tests/integration/billing-checkout.test.ts (creation, rights); e2e billing-team.test.ts.

const HISTORY_LIMIT = 200;

/** Balance and ledger history for the billing page (every member may read it). */
export async function billingOverview(ctx: WorkspaceContext) {
  const db = await em();
  const [balance, history] = await Promise.all([seatBalance(db, ctx.workspace.id), seatHistory(db, ctx.workspace.id, HISTORY_LIMIT)]);
  // A complete's line names its study and whether the respondent is kept or excluded now.
  const [details, purchases] = await Promise.all([
    completeDetails(db, ctx.workspace.id, history.filter((e) => e.reason === 'complete').map((e) => e.reference)),
    purchaseDetails(db, ctx.workspace.id, history.filter((e) => e.reason === 'purchase').map((e) => e.reference)),
  ]);
  // The page shows each line in words (lib/ledger-words.ts), never the raw reference.
  const entries = history.map((e) => ({
    ...e,
    complete: e.reason === 'complete' ? details.get(e.reference) ?? null : null,
    purchase: e.reason === 'purchase' ? purchases.get(e.reference) ?? null : null,
  }));
  return { balance, canBuy: ctx.role === 'owner', entries };
}
export type BillingOverview = Awaited<ReturnType<typeof billingOverview>>;

/**
 * Starts a purchase: a Stripe Checkout Session for the bundle, then a pending Purchase row
 * keyed by the session id. Seats are credited only by the verified webhook.
 */
export async function createCheckout(ctx: WorkspaceContext, bundleId: BundleId): Promise<{ url: string; sessionId: string }> {
  const bundle = findBundle(bundleId);
  if (!bundle) throw new AppError(422, 'validation_failed', 'Choose one of the bundles.', [{ path: 'bundle', message: 'Choose one of the bundles.' }]);
  const purchaseId = randomUUID();
  const base = `${env().APP_URL}/w/${encodeURIComponent(ctx.workspace.slug)}/billing`;
  let session;
  try {
    session = await stripe().checkout.sessions.create(
      {
        mode: 'payment',
        line_items: [{ quantity: 1, price_data: { currency: BUNDLE_CURRENCY, unit_amount: bundle.amountCents, product_data: { name: `${bundle.name} bundle — ${bundle.seats} respondent seats` } } }],
        customer_email: ctx.user.email,
        client_reference_id: purchaseId,
        metadata: { workspaceId: ctx.workspace.id, purchaseId, bundle: bundle.id },
        success_url: `${base}/success?session_id={CHECKOUT_SESSION_ID}`,
        cancel_url: `${base}/cancel`,
      },
      { idempotencyKey: purchaseId },
    );
  } catch (err) {
    console.error('[billing] checkout session failed', err);
    throw new AppError(502, 'internal', 'The payment service did not answer. Try again in a moment.');
  }
  if (!session.url) throw new AppError(502, 'internal', 'The payment service returned no checkout page.');
  const db = await em();
  db.create(Purchase, {
    id: purchaseId,
    workspace: ctx.workspace.id,
    buyer: ctx.user.id,
    bundle: bundle.id,
    seats: bundle.seats,
    amountCents: bundle.amountCents,
    currency: BUNDLE_CURRENCY,
    checkoutSessionId: session.id,
    status: 'pending',
  });
  await db.flush();
  return { url: session.url, sessionId: session.id };
}

/** Where a purchase stands, for the success page's polling; scoped to the workspace. */
export async function checkoutStatus(ctx: WorkspaceContext, sessionId: string) {
  const db = await em();
  const p = await db.findOne(Purchase, { checkoutSessionId: sessionId, workspace: ctx.workspace.id });
  if (!p) throw notFoundError('That purchase');
  return {
    status: p.status,
    bundle: p.bundle,
    seats: p.seats,
    amountCents: p.amountCents,
    currency: p.currency,
    paidAt: p.paidAt?.toISOString() ?? null,
    // The balance is shown only once the webhook has credited the seats.
    balance: p.status === 'paid' ? await seatBalance(db, ctx.workspace.id) : null,
  };
}
export type CheckoutStatus = Awaited<ReturnType<typeof checkoutStatus>>;
