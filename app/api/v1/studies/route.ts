import { tokenRoute } from '@/lib/server/team/access-tokens';
import { listFittableStudies } from '@/lib/server/analysis/study-fit';

/** Studies of the token's workspace that have answered test trials. */
export const GET = tokenRoute(async (_req, ctx) => Response.json({ workspace: ctx.workspace.slug, studies: await listFittableStudies(ctx) }));
