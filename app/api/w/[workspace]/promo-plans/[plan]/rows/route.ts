import { route, zodIssues } from '@/lib/server/http/route';
import { AppError } from '@/lib/server/http/errors';
import { queryRows, rowQuerySchema } from '@/lib/promo/query-rows';
import { planTable } from '@/lib/server/promotions/plan-table';

/** One page of the plan's rows, sorted, filtered by flag and searched by SKU or name. */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ req, ctx, params }) => {
  const parsed = rowQuerySchema.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw new AppError(422, 'validation_failed', 'Some query parameters are not valid.', zodIssues(parsed.error));
  const { rows } = await planTable(ctx, params.plan);
  return { ...queryRows(rows, parsed.data), page: parsed.data.page, pageSize: parsed.data.pageSize };
});
