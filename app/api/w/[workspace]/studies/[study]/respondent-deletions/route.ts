import { readJson, route } from '@/lib/server/http/route';
import { deleteRespondentByCode } from '@/lib/server/studies/retention';
import { respondentDeletionSchema } from '@/lib/schemas/respondent-deletion.schema';

/** POST { code }: deletes the respondent behind a reference code and their answers (audited; the fit is recomputed). */
export const POST = route({ auth: 'member', role: 'analyst' }, async ({ req, ctx, params }) => {
  const { code } = await readJson(req, respondentDeletionSchema);
  return deleteRespondentByCode(ctx, params.study, code);
});
