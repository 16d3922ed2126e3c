import { reply, route } from '@/lib/server/http/route';
import { getFitState } from '@/lib/server/analysis/study-fit';
import { getWeberPlan } from '@/lib/server/analysis/weber-plan';
import { resultsQuerySchema } from '@/lib/schemas/results.schema';
import { AppError } from '@/lib/server/http/errors';

/**
 * The fit of a study (ready, pending with progress, or empty) with its exclusion counts, and,
 * when the Weber verdict is undecided, the planner's count of completes that would tell.
 */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ req, ctx, params }) => {
  const q = resultsQuerySchema.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!q.success) throw new AppError(422, 'validation_failed', 'The segment or target in the address is not valid.');
  const segment = q.data.segmentQuestion && q.data.segmentAnswer ? { questionId: q.data.segmentQuestion, answer: q.data.segmentAnswer } : null;
  const state = await getFitState(ctx, params.study, { segment });
  return reply({ ...state, weberPlan: await getWeberPlan(state) }, 200, { 'cache-control': 'no-store' });
});
