import { noContent, route } from '@/lib/server/http/route';
import { deletePromoPlan } from '@/lib/server/promotions/plans';
import { planTable } from '@/lib/server/promotions/plan-table';

/** The plan with its summary and chart data; the rows come page by page from ./rows. */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx, params }) => {
  const { plan, summary, chart } = await planTable(ctx, params.plan);
  return { plan, summary, chart };
});

export const DELETE = route({ auth: 'member', role: 'analyst' }, async ({ ctx, params }) => {
  await deletePromoPlan(ctx, params.plan);
  return noContent();
});
