import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/http/route';
import { deletePromoPlan } from '@/lib/server/promotions/plans';
import { planTable } from '@/lib/server/promotions/plan-table';

type Params = { workspace: string; plan: string };

/** The plan with its summary and chart data; the rows come page by page from ./rows. */
export const GET = workspaceRoute<Params>('viewer', async (_req, ctx, p) => {
  const { plan, summary, chart } = await planTable(ctx, p.plan);
  return NextResponse.json({ plan, summary, chart });
});

export const DELETE = workspaceRoute<Params>('analyst', async (_req, ctx, p) => {
  await deletePromoPlan(ctx, p.plan);
  return new NextResponse(null, { status: 204 });
});
