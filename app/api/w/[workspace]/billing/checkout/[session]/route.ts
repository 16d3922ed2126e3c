import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/http/route';
import { checkoutStatus } from '@/lib/server/billing/checkout';

export const GET = workspaceRoute<{ workspace: string; session: string }>('viewer', async (_req, ctx, params) =>
  NextResponse.json(await checkoutStatus(ctx, params.session)),
);
