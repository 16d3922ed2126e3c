import { queryOptions } from '@tanstack/react-query';
import type { BillingOverview, CheckoutStatus } from '@/lib/server/billing/checkout';
import { fetchJson } from '@/lib/fetch-json';

export const billingQuery = (slug: string) =>
  queryOptions({ queryKey: ['billing', slug], queryFn: () => fetchJson<BillingOverview>(`/api/w/${slug}/billing`) });

/** Polls a purchase until the webhook has marked it paid. */
export const checkoutStatusQuery = (slug: string, sessionId: string) =>
  queryOptions({
    queryKey: ['billing', slug, 'checkout', sessionId],
    queryFn: () => fetchJson<CheckoutStatus>(`/api/w/${slug}/billing/checkout/${encodeURIComponent(sessionId)}`),
    refetchInterval: (q) => (q.state.data?.status === 'paid' ? false : 1000),
  });
