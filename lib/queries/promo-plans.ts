import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { GET as PlanRowsGET } from '@/app/api/w/[workspace]/promo-plans/[plan]/rows/route';
import type { RouteDto } from '@/lib/server/http/route';
import { fetchJson } from '@/lib/fetch-json';
import type { RowQuery } from '@/lib/promo/query-rows';

export type PlanRowsResponse = RouteDto<typeof PlanRowsGET>;

/** One page of a plan's rows; the previous page stays on screen while the next one loads. */
export const planRowsQuery = (slug: string, planId: string, q: RowQuery) =>
  queryOptions({
    queryKey: ['promo-plan-rows', slug, planId, q],
    queryFn: () => {
      const params = new URLSearchParams(Object.entries(q).map(([k, v]) => [k, String(v)]));
      return fetchJson<PlanRowsResponse>(`/api/w/${slug}/promo-plans/${planId}/rows?${params}`);
    },
    placeholderData: keepPreviousData,
    staleTime: 5 * 60_000,
  });
