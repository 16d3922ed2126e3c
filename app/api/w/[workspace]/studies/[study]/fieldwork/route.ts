import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/http/route';
import { getFieldwork } from '@/lib/server/studies/fieldwork';

export const GET = workspaceRoute<{ workspace: string; study: string }>('viewer', async (_req, ctx, p) =>
  NextResponse.json(await getFieldwork(ctx, p.study), { headers: { 'cache-control': 'no-store' } }),
);
