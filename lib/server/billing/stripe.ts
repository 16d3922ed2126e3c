import 'server-only';
import Stripe from 'stripe';
import { env } from '@/lib/server/platform/env';

type Holder = { stripeClient?: Stripe };
const holder = globalThis as unknown as Holder;

/**
 * The official SDK, pointed at the local stand-in when STRIPE_FAKE_URL is set and at Stripe
 * itself otherwise (same calls either way).
 */
export function stripe(): Stripe {
  if (holder.stripeClient) return holder.stripeClient;
  const { STRIPE_SECRET_KEY: key, STRIPE_FAKE_URL: fake } = env();
  if (fake) {
    const u = new URL(fake);
    holder.stripeClient = new Stripe(key, { host: u.hostname, port: Number(u.port || 80), protocol: 'http', maxNetworkRetries: 0, telemetry: false });
  } else {
    holder.stripeClient = new Stripe(key);
  }
  return holder.stripeClient;
}
