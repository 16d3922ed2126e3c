import 'server-only';
import Stripe from 'stripe';
import { env } from '@/lib/server/platform/env';

// The Stripe client, one per process. With STRIPE_FAKE_URL set it talks plain HTTP to the local
// stand-in (scripts/fake-stripe/server.ts: `npm start` runs it, the test app on TEST_STRIPE_PORT),
// with SDK retries and telemetry off; without it, to Stripe itself. The calls
// are the same either way, so checkout and webhook code never know which one they reach.

type Holder = { stripeClient?: Stripe };
const holder = globalThis as unknown as Holder;

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
