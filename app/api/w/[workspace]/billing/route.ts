import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/api';
import { billingOverview } from '@/lib/server/billing';

export const GET = workspaceRoute('viewer', async (_req, ctx) => NextResponse.json(await billingOverview(ctx)));
