import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/http/route';
import { billingOverview } from '@/lib/server/billing/checkout';

export const GET = workspaceRoute('viewer', async (_req, ctx) => NextResponse.json(await billingOverview(ctx)));
