import { readJson, route } from '@/lib/server/http/route';
import { changeStudyState } from '@/lib/server/studies/lifecycle';
import { studyStateChangeSchema } from '@/lib/schemas/study.schema';

/** Launch, pause, resume or close (the allowed moves are checked in the lifecycle module). */
export const POST = route({ auth: 'member', role: 'analyst' }, async ({ req, ctx, params }) => {
  const { action } = await readJson(req, studyStateChangeSchema);
  return changeStudyState(ctx, params.study, action);
});
