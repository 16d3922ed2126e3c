import { route } from '@/lib/server/http/route';
import { revokeApiToken } from '@/lib/server/team/access-tokens';

/** Revokes an access token (its owner, or any workspace owner); revoking twice changes nothing. */
export const DELETE = route({ auth: 'member', role: 'analyst' }, async ({ ctx, params }) => revokeApiToken(ctx, params.token));
