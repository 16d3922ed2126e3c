import { workspaceRoute } from '@/lib/server/api';
import { revokeApiToken } from '@/lib/server/api-tokens';

export const DELETE = workspaceRoute<{ workspace: string; token: string }>('analyst', async (_req, ctx, { token }) =>
  Response.json(await revokeApiToken(ctx, token)));
