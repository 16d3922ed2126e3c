import { readJson, reply, route } from '@/lib/server/http/route';
import { createApiToken, listApiTokens } from '@/lib/server/team/access-tokens';
import { apiTokenCreateSchema } from '@/lib/schemas/api-token.schema';

/** The signed-in analyst's own access tokens in this workspace. */
export const GET = route({ auth: 'member', role: 'analyst' }, async ({ ctx }) => listApiTokens(ctx));

/** Creates a token; the response is the only time the token itself is shown. */
export const POST = route({ auth: 'member', role: 'analyst' }, async ({ req, ctx }) => {
  const { name } = await readJson(req, apiTokenCreateSchema);
  return reply(await createApiToken(ctx, name), 201, { 'cache-control': 'no-store' });
});
