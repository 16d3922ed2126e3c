import { queryOptions } from '@tanstack/react-query';
import type { GET } from '@/app/api/me/route';
import type { RouteDto } from '@/lib/server/http/route';
import { fetchJson } from '@/lib/fetch-json';

export type MeResponse = RouteDto<typeof GET>;

export const meQuery = () => queryOptions({ queryKey: ['me'], queryFn: () => fetchJson<MeResponse>('/api/me') });
