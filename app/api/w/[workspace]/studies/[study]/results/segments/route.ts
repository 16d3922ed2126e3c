import { reply, route } from '@/lib/server/http/route';
import { AppError } from '@/lib/server/http/errors';
import { getSegmentComparison } from '@/lib/server/analysis/segments';

/** Thresholds and Weber slope per answer group of one segment question, with the LR test. */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ req, ctx, params }) => {
  const q = req.nextUrl.searchParams.get('question') ?? '';
  if (!/^[a-z0-9_]{1,32}$/.test(q)) throw new AppError(422, 'validation_failed', 'Choose a segment question.');
  return reply(await getSegmentComparison(ctx, params.study, q), 200, { 'cache-control': 'no-store' });
});
