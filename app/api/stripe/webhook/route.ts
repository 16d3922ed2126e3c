import { route } from '@/lib/server/http/route';
import { BODY_LIMITS } from '@/lib/server/http/request-guard';
import { applyStripeEvent, verifyStripeEvent } from '@/lib/server/billing/webhook';

/** Stripe's webhook: the raw body is verified against the signing secret before anything else. */
export const POST = route({
  auth: 'public', reason: 'Stripe signs it; verified before anything else',
  anyOrigin: 'Stripe posts from its own servers; the signature over the body authenticates it',
  body: { types: ['application/json'], maxBytes: BODY_LIMITS.webhook },
}, async ({ req }) => {
  const event = verifyStripeEvent(await req.text(), req.headers.get('stripe-signature'));
  return { received: true as const, outcome: await applyStripeEvent(event) };
});
