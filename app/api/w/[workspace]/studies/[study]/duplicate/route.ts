import { reply, route } from '@/lib/server/http/route';
import { duplicateStudy } from '@/lib/server/studies/studies';

/** A new draft with the same design. */
export const POST = route({ auth: 'member', role: 'analyst' }, async ({ ctx, params }) => reply(await duplicateStudy(ctx, params.study), 201));
