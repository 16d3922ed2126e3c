import { NextResponse } from 'next/server';
import { requireUuid } from '@/lib/server/ids';
import { workspaceRoute } from '@/lib/server/api';
import { revokeInvitation } from '@/lib/server/invitations';

export const DELETE = workspaceRoute<{ workspace: string; invitation: string }>('owner', async (_req, ctx, { invitation }) => {
  requireUuid(invitation, 'That invitation');
  await revokeInvitation(ctx, invitation);
  return new NextResponse(null, { status: 204 });
});
