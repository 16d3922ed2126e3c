import { NextResponse } from 'next/server';
import { requireUuid } from '@/lib/server/platform/ids';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { changeRole, removeMember } from '@/lib/server/team/members';
import { changeRoleSchema } from '@/lib/schemas/team.schema';

type P = { workspace: string; member: string };

export const PATCH = workspaceRoute<P>('owner', async (req, ctx, { member }) => {
  const { role } = await readJson(req, changeRoleSchema);
  requireUuid(member, 'That member');
  return NextResponse.json(await changeRole(ctx, member, role));
});

export const DELETE = workspaceRoute<P>('owner', async (_req, ctx, { member }) => {
  requireUuid(member, 'That member');
  await removeMember(ctx, member);
  return new NextResponse(null, { status: 204 });
});
