import { z } from 'zod';
import { BUNDLE_IDS } from '@/lib/billing-bundles';

export const checkoutSchema = z.object({
  bundle: z.enum(BUNDLE_IDS, 'Choose one of the bundles.'),
});
export type CheckoutInput = z.infer<typeof checkoutSchema>;
