import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { exclusionRulesSchema } from '@/lib/schemas/exclusions.schema';
import { getExclusions, saveExclusionRules } from '@/lib/server/analysis/exclusions';

/** The rules in force and the respondents and trials they keep. */
export const GET = workspaceRoute<{ workspace: string; study: string }>('viewer', async (_req, ctx, { study }) =>
  Response.json(await getExclusions(ctx, study)));

/** Saves new rules (analysts and owners); the fit for them is computed by the next results request. */
export const PUT = workspaceRoute<{ workspace: string; study: string }>('analyst', async (req, ctx, { study }) => {
  const rules = await readJson(req, exclusionRulesSchema);
  return Response.json(await saveExclusionRules(ctx, study, rules));
});
