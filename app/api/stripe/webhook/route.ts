import { NextResponse, type NextRequest } from 'next/server';
import { toErrorResponse } from '@/lib/server/http/route';
import { applyStripeEvent, verifyStripeEvent } from '@/lib/server/billing/webhook';

/** Stripe's webhook: the raw body is verified against the signing secret before anything else. */
export async function POST(req: NextRequest) {
  try {
    const event = verifyStripeEvent(await req.text(), req.headers.get('stripe-signature'));
    const outcome = await applyStripeEvent(event);
    return NextResponse.json({ received: true, outcome });
  } catch (err) {
    return toErrorResponse(err);
  }
}
