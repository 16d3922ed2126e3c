import { queryOptions } from '@tanstack/react-query';
import type { GET as BillingGET } from '@/app/api/w/[workspace]/billing/route';
import type { GET as CheckoutGET } from '@/app/api/w/[workspace]/billing/checkout/[session]/route';
import type { RouteDto } from '@/lib/server/http/route';
import { fetchJson } from '@/lib/fetch-json';

export const billingQuery = (slug: string) =>
  queryOptions({ queryKey: ['billing', slug], queryFn: () => fetchJson<RouteDto<typeof BillingGET>>(`/api/w/${slug}/billing`) });

/** Polls a purchase until the webhook has marked it paid. */
export const checkoutStatusQuery = (slug: string, sessionId: string) =>
  queryOptions({
    queryKey: ['billing', slug, 'checkout', sessionId],
    queryFn: () => fetchJson<RouteDto<typeof CheckoutGET>>(`/api/w/${slug}/billing/checkout/${encodeURIComponent(sessionId)}`),
    refetchInterval: (q) => (q.state.data?.status === 'paid' ? false : 1000),
  });
