import { route } from '@/lib/server/http/route';
import { billingOverview } from '@/lib/server/billing/checkout';

/** Seat balance, bundles on sale and the ledger. */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx }) => billingOverview(ctx));
