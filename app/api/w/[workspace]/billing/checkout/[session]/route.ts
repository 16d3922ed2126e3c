import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/api';
import { checkoutStatus } from '@/lib/server/billing';

export const GET = workspaceRoute<{ workspace: string; session: string }>('viewer', async (_req, ctx, params) =>
  NextResponse.json(await checkoutStatus(ctx, params.session)),
);
