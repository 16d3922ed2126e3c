import { readJson, route } from '@/lib/server/http/route';
import { closeLink } from '@/lib/server/studies/respondent-links';
import { respondentLinkPatchSchema } from '@/lib/schemas/respondent-link.schema';

/** Closes a respondent link (the only change a link takes). */
export const PATCH = route({ auth: 'member', role: 'analyst' }, async ({ req, ctx, params }) => {
  await readJson(req, respondentLinkPatchSchema);
  return closeLink(ctx, params.study, params.link);
});
