import { readJson, reply, route } from '@/lib/server/http/route';
import { promoPlanCreateSchema } from '@/lib/schemas/promo-plan.schema';
import { createPromoPlan, listPromoPlans } from '@/lib/server/promotions/plans';

export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx }) => ({ plans: await listPromoPlans(ctx) }));

/** 201 with the plan, or 202 while the study's fit is still computing (nothing stored). */
export const POST = route({ auth: 'member', role: 'analyst' }, async ({ req, ctx }) => {
  const input = await readJson(req, promoPlanCreateSchema);
  const result = await createPromoPlan(ctx, input);
  if (result.status === 'pending') return reply({ pending: true as const, message: result.message }, 202, { 'retry-after': '5' });
  return reply({ plan: result.plan }, 201);
});
