import { workspaceRoute } from '@/lib/server/http/route';
import { revokeApiToken } from '@/lib/server/team/access-tokens';

export const DELETE = workspaceRoute<{ workspace: string; token: string }>('analyst', async (_req, ctx, { token }) =>
  Response.json(await revokeApiToken(ctx, token)));
