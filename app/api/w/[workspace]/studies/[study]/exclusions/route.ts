import { readJson, route } from '@/lib/server/http/route';
import { exclusionRulesSchema } from '@/lib/schemas/exclusions.schema';
import { getExclusions, saveExclusionRules } from '@/lib/server/analysis/exclusions';

/** The rules in force and the respondents and trials they keep. */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx, params }) => getExclusions(ctx, params.study));

/** Saves new rules (analysts and owners); the fit for them is computed by the next results request. */
export const PUT = route({ auth: 'member', role: 'analyst' }, async ({ req, ctx, params }) =>
  saveExclusionRules(ctx, params.study, await readJson(req, exclusionRulesSchema)),
);
