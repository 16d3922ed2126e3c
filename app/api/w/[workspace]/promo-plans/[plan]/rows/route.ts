import { NextResponse } from 'next/server';
import { workspaceRoute, zodIssues } from '@/lib/server/http/route';
import { AppError } from '@/lib/server/http/errors';
import { queryRows, rowQuerySchema } from '@/lib/promo/query-rows';
import { planTable } from '@/lib/server/promotions/plan-table';

type Params = { workspace: string; plan: string };
export type PlanRowsResponse = ReturnType<typeof queryRows> & { page: number; pageSize: number };

/** One page of the plan's rows, sorted, filtered by flag and searched by SKU or name. */
export const GET = workspaceRoute<Params>('viewer', async (req, ctx, p) => {
  const parsed = rowQuerySchema.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw new AppError(422, 'validation_failed', 'Some query parameters are not valid.', zodIssues(parsed.error));
  const { rows } = await planTable(ctx, p.plan);
  const page = queryRows(rows, parsed.data);
  const body: PlanRowsResponse = { ...page, page: parsed.data.page, pageSize: parsed.data.pageSize };
  return NextResponse.json(body);
});
