import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { inviteMember, listPendingInvitations } from '@/lib/server/team/invitations';
import { inviteSchema } from '@/lib/schemas/team.schema';

export const GET = workspaceRoute('owner', async (_req, ctx) => NextResponse.json({ invitations: await listPendingInvitations(ctx) }));

export const POST = workspaceRoute('owner', async (req, ctx) => {
  const input = await readJson(req, inviteSchema);
  return NextResponse.json(await inviteMember(ctx, input), { status: 201 });
});
