import { queryOptions } from '@tanstack/react-query';
import type { GET as ResultsGET } from '@/app/api/w/[workspace]/studies/[study]/results/route';
import type { GET as ExclusionsGET } from '@/app/api/w/[workspace]/studies/[study]/exclusions/route';
import type { GET as SegmentsGET } from '@/app/api/w/[workspace]/studies/[study]/results/segments/route';
import type { GET as PlannerGET } from '@/app/api/w/[workspace]/studies/[study]/planner/route';
import type { RouteDto } from '@/lib/server/http/route';
import { fetchJson } from '@/lib/fetch-json';

const base = (slug: string, study: string) => `/api/w/${encodeURIComponent(slug)}/studies/${encodeURIComponent(study)}`;

export type ResultsResponse = RouteDto<typeof ResultsGET>;

/** Polls every second while the fit computes (every 2 s while the Weber planner does), every 15 s while fieldwork runs, else not at all. */
export const resultsQuery = (slug: string, study: string) => queryOptions({
  queryKey: ['results', slug, study],
  queryFn: () => fetchJson<ResultsResponse>(`${base(slug, study)}/results`),
  refetchInterval: (q) => {
    const d = q.state.data;
    if (!d || d.fit.status === 'pending') return 1000;
    if (d.weberPlan.status === 'pending') return 2000;
    return d.study.state === 'live' ? 15_000 : false;
  },
});

export type ExclusionsResponse = RouteDto<typeof ExclusionsGET>;
export const exclusionsQuery = (slug: string, study: string) => queryOptions({
  queryKey: ['exclusions', slug, study],
  queryFn: () => fetchJson<ExclusionsResponse>(`${base(slug, study)}/exclusions`),
});

export const segmentsQuery = (slug: string, study: string, question: string) => queryOptions({
  queryKey: ['segments', slug, study, question],
  queryFn: () => fetchJson<RouteDto<typeof SegmentsGET>>(`${base(slug, study)}/results/segments?question=${encodeURIComponent(question)}`),
  refetchInterval: (q) => (q.state.data?.status === 'pending' ? 1500 : false),
  enabled: question !== '',
});

export const plannerQuery = (slug: string, study: string, width: number | null) => queryOptions({
  queryKey: ['planner', slug, study, width],
  queryFn: () => fetchJson<RouteDto<typeof PlannerGET>>(`${base(slug, study)}/planner?width=${width}`),
  refetchInterval: (q) => (q.state.data?.status === 'pending' ? 2000 : false),
  enabled: width !== null,
});

export const exportUrl = (slug: string, study: string, file: string, segment?: string) =>
  `${base(slug, study)}/exports/${file}${segment ? `?segment=${encodeURIComponent(segment)}` : ''}`;
