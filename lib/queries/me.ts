import { queryOptions } from '@tanstack/react-query';
import type { MeResponse } from '@/app/api/me/route';
import { fetchJson } from '@/lib/fetch-json';

export const meQuery = () => queryOptions({ queryKey: ['me'], queryFn: () => fetchJson<MeResponse>('/api/me') });
