import { readJson, reply, route } from '@/lib/server/http/route';
import { createLink, listLinks } from '@/lib/server/studies/respondent-links';
import { respondentLinkSchema } from '@/lib/schemas/respondent-link.schema';

export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx, params }) => ({ links: await listLinks(ctx, params.study) }));

export const POST = route({ auth: 'member', role: 'analyst' }, async ({ req, ctx, params }) => {
  const input = await readJson(req, respondentLinkSchema);
  return reply(await createLink(ctx, params.study, input), 201);
});
