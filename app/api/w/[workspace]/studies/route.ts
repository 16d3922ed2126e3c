import { readJson, reply, route } from '@/lib/server/http/route';
import { createStudy, listStudies } from '@/lib/server/studies/studies';
import { studyDesignSchema } from '@/lib/schemas/study.schema';
import { BODY_LIMITS } from '@/lib/server/http/request-guard';

export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx }) => ({ studies: await listStudies(ctx) }));

export const POST = route({ auth: 'member', role: 'analyst', body: { maxBytes: BODY_LIMITS.design } }, async ({ req, ctx }) => {
  const design = await readJson(req, studyDesignSchema);
  return reply(await createStudy(ctx, design), 201);
});
