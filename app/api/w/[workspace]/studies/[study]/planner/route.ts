import { reply, route } from '@/lib/server/http/route';
import { AppError } from '@/lib/server/http/errors';
import { getPlan } from '@/lib/server/analysis/planner';
import { plannerInputSchema } from '@/lib/schemas/results.schema';

/** How many completes bring each threshold's interval under the chosen width (queued as a job). */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ req, ctx, params }) => {
  const parsed = plannerInputSchema.safeParse({ widthPoints: req.nextUrl.searchParams.get('width') ?? undefined });
  if (!parsed.success) throw new AppError(422, 'validation_failed', parsed.error.issues[0]?.message ?? 'Enter a width.', [{ path: 'widthPoints', message: parsed.error.issues[0]?.message ?? '' }]);
  return reply(await getPlan(ctx, params.study, parsed.data.widthPoints), 200, { 'cache-control': 'no-store' });
});
