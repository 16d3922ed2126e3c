import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { createCheckout } from '@/lib/server/billing/checkout';
import { checkoutSchema } from '@/lib/schemas/billing.schema';

/** Owner only: opens a Stripe Checkout Session; the client then goes to its `url`. */
export const POST = workspaceRoute('owner', async (req, ctx) => {
  const { bundle } = await readJson(req, checkoutSchema);
  return NextResponse.json(await createCheckout(ctx, bundle), { status: 201 });
});
