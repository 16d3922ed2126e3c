import { queryOptions } from '@tanstack/react-query';
import type { FieldworkDto } from '@/lib/server/studies/fieldwork';
import type { RespondentLinkDto } from '@/lib/server/studies/respondent-links';
import { fetchJson } from '@/lib/fetch-json';

const base = (slug: string, study: string) => `/api/w/${encodeURIComponent(slug)}/studies/${study}`;

/** Live fieldwork numbers: refreshed every 5 s while the study is live, left alone otherwise. */
export const fieldworkQuery = (slug: string, study: string) =>
  queryOptions({
    queryKey: ['fieldwork', slug, study],
    queryFn: () => fetchJson<FieldworkDto>(`${base(slug, study)}/fieldwork`),
    refetchInterval: (q) => (q.state.data?.state === 'live' ? 5000 : false),
  });

export const linksQuery = (slug: string, study: string) =>
  queryOptions({
    queryKey: ['links', slug, study],
    queryFn: async () => (await fetchJson<{ links: RespondentLinkDto[] }>(`${base(slug, study)}/links`)).links,
  });

export const studyApi = base;
