import { readJson, reply, route } from '@/lib/server/http/route';
import { createCheckout } from '@/lib/server/billing/checkout';
import { checkoutSchema } from '@/lib/schemas/billing.schema';

/** Owner only: opens a Stripe Checkout Session; the client then goes to its `url`. */
export const POST = route({ auth: 'member', role: 'owner' }, async ({ req, ctx }) => {
  const { bundle } = await readJson(req, checkoutSchema);
  return reply(await createCheckout(ctx, bundle), 201);
});
