import { tokenRoute } from '@/lib/server/api-tokens';
import { listFittableStudies } from '@/lib/server/analysis';

/** Studies of the token's workspace that have answered test trials. */
export const GET = tokenRoute(async (_req, ctx) => Response.json({ workspace: ctx.workspace.slug, studies: await listFittableStudies(ctx) }));
