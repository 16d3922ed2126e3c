import { noContent, readJson, route } from '@/lib/server/http/route';
import { deleteStudy, getStudy, updateStudy } from '@/lib/server/studies/studies';
import { studyDesignSchema } from '@/lib/schemas/study.schema';
import { BODY_LIMITS } from '@/lib/server/http/request-guard';

export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx, params }) => getStudy(ctx, params.study));

/** Replaces a draft's whole design; a launched study answers 409 (its design is frozen). */
export const PATCH = route({ auth: 'member', role: 'analyst', body: { maxBytes: BODY_LIMITS.design } }, async ({ req, ctx, params }) =>
  updateStudy(ctx, params.study, await readJson(req, studyDesignSchema)),
);

export const DELETE = route({ auth: 'member', role: 'analyst' }, async ({ ctx, params }) => {
  await deleteStudy(ctx, params.study);
  return noContent();
});
