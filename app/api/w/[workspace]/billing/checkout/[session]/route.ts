import { route } from '@/lib/server/http/route';
import { checkoutStatus } from '@/lib/server/billing/checkout';

/** Whether a purchase has been paid yet (the success page polls this until the webhook lands). */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx, params }) => checkoutStatus(ctx, params.session));
