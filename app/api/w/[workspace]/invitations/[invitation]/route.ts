import { NextResponse } from 'next/server';
import { requireUuid } from '@/lib/server/platform/ids';
import { workspaceRoute } from '@/lib/server/http/route';
import { revokeInvitation } from '@/lib/server/team/invitations';

export const DELETE = workspaceRoute<{ workspace: string; invitation: string }>('owner', async (_req, ctx, { invitation }) => {
  requireUuid(invitation, 'That invitation');
  await revokeInvitation(ctx, invitation);
  return new NextResponse(null, { status: 204 });
});
