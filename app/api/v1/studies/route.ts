import { route } from '@/lib/server/http/route';
import { listFittableStudies } from '@/lib/server/analysis/study-fit';

/** Studies of the token's workspace that have answered test trials. */
export const GET = route({ auth: 'token' }, async ({ ctx }) => ({ workspace: ctx.workspace.slug, studies: await listFittableStudies(ctx) }));
