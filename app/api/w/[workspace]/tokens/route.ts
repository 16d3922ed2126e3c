import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { createApiToken, listApiTokens } from '@/lib/server/team/access-tokens';
import { apiTokenCreateSchema } from '@/lib/schemas/api-token.schema';

/** The signed-in analyst's own access tokens in this workspace. */
export const GET = workspaceRoute('analyst', async (_req, ctx) => Response.json(await listApiTokens(ctx)));

/** Creates a token; the response is the only time the token itself is shown. */
export const POST = workspaceRoute('analyst', async (req, ctx) => {
  const { name } = await readJson(req, apiTokenCreateSchema);
  return Response.json(await createApiToken(ctx, name), { status: 201, headers: { 'cache-control': 'no-store' } });
});
