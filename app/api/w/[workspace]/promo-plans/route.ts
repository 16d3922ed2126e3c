import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { promoPlanCreateSchema } from '@/lib/schemas/promo-plan.schema';
import { createPromoPlan, listPromoPlans } from '@/lib/server/promotions/plans';

export const GET = workspaceRoute('viewer', async (_req, ctx) => NextResponse.json({ plans: await listPromoPlans(ctx) }));

/** 201 with the plan, or 202 while the study's fit is still computing (nothing stored). */
export const POST = workspaceRoute('analyst', async (req, ctx) => {
  const input = await readJson(req, promoPlanCreateSchema);
  const result = await createPromoPlan(ctx, input);
  if (result.status === 'pending') return NextResponse.json({ pending: true, message: result.message }, { status: 202, headers: { 'retry-after': '5' } });
  return NextResponse.json({ plan: result.plan }, { status: 201 });
});
