import { NextResponse } from 'next/server';
import { notFoundError } from '@/lib/server/errors';
import { workspaceRoute } from '@/lib/server/api';
import { revokeInvitation } from '@/lib/server/invitations';

export const DELETE = workspaceRoute<{ workspace: string; invitation: string }>('owner', async (_req, ctx, { invitation }) => {
  if (!/^[0-9a-f-]{36}$/i.test(invitation)) throw notFoundError('That invitation');
  await revokeInvitation(ctx, invitation);
  return new NextResponse(null, { status: 204 });
});
