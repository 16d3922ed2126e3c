import { queryOptions } from '@tanstack/react-query';
import type { FitState } from '@/lib/server/analysis/study-fit';
import type { getExclusions } from '@/lib/server/analysis/exclusions';
import type { SegmentState } from '@/lib/server/analysis/segments';
import type { PlannerState } from '@/lib/server/analysis/planner';
import { fetchJson } from '@/lib/fetch-json';

const base = (slug: string, study: string) => `/api/w/${encodeURIComponent(slug)}/studies/${encodeURIComponent(study)}`;

/** Polls every second while the fit computes, every 15 s while fieldwork runs, else not at all. */
export const resultsQuery = (slug: string, study: string) => queryOptions({
  queryKey: ['results', slug, study],
  queryFn: () => fetchJson<FitState>(`${base(slug, study)}/results`),
  refetchInterval: (q) => {
    const d = q.state.data;
    if (!d || d.fit.status === 'pending') return 1000;
    return d.study.state === 'live' ? 15_000 : false;
  },
});

export type ExclusionsResponse = Awaited<ReturnType<typeof getExclusions>>;
export const exclusionsQuery = (slug: string, study: string) => queryOptions({
  queryKey: ['exclusions', slug, study],
  queryFn: () => fetchJson<ExclusionsResponse>(`${base(slug, study)}/exclusions`),
});

export const segmentsQuery = (slug: string, study: string, question: string) => queryOptions({
  queryKey: ['segments', slug, study, question],
  queryFn: () => fetchJson<SegmentState>(`${base(slug, study)}/results/segments?question=${encodeURIComponent(question)}`),
  refetchInterval: (q) => (q.state.data?.status === 'pending' ? 1500 : false),
  enabled: question !== '',
});

export const plannerQuery = (slug: string, study: string, width: number | null) => queryOptions({
  queryKey: ['planner', slug, study, width],
  queryFn: () => fetchJson<PlannerState>(`${base(slug, study)}/planner?width=${width}`),
  refetchInterval: (q) => (q.state.data?.status === 'pending' ? 2000 : false),
  enabled: width !== null,
});

export const exportUrl = (slug: string, study: string, file: string, segment?: string) =>
  `${base(slug, study)}/exports/${file}${segment ? `?segment=${encodeURIComponent(segment)}` : ''}`;
