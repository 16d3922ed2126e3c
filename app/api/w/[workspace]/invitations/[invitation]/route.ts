import { requireUuid } from '@/lib/server/platform/ids';
import { noContent, route } from '@/lib/server/http/route';
import { revokeInvitation } from '@/lib/server/team/invitations';

export const DELETE = route({ auth: 'member', role: 'owner' }, async ({ ctx, params }) => {
  requireUuid(params.invitation, 'That invitation');
  await revokeInvitation(ctx, params.invitation);
  return noContent();
});
