import { reply, route } from '@/lib/server/http/route';
import { getFitState } from '@/lib/server/analysis/study-fit';
import { resultsQuerySchema } from '@/lib/schemas/results.schema';
import { AppError } from '@/lib/server/http/errors';

/** The fit of a study (ready, pending with progress, or empty) with its exclusion counts. */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ req, ctx, params }) => {
  const q = resultsQuerySchema.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!q.success) throw new AppError(422, 'validation_failed', 'The segment or target in the address is not valid.');
  const segment = q.data.segmentQuestion && q.data.segmentAnswer ? { questionId: q.data.segmentQuestion, answer: q.data.segmentAnswer } : null;
  return reply(await getFitState(ctx, params.study, { segment }), 200, { 'cache-control': 'no-store' });
});
