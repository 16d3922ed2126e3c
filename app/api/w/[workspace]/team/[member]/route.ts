import { NextResponse } from 'next/server';
import { notFoundError } from '@/lib/server/errors';
import { readJson, workspaceRoute } from '@/lib/server/api';
import { changeRole, removeMember } from '@/lib/server/team';
import { changeRoleSchema } from '@/lib/schemas/team.schema';

type P = { workspace: string; member: string };
const UUID = /^[0-9a-f-]{36}$/i;

export const PATCH = workspaceRoute<P>('owner', async (req, ctx, { member }) => {
  const { role } = await readJson(req, changeRoleSchema);
  if (!UUID.test(member)) throw notFoundError('That member');
  return NextResponse.json(await changeRole(ctx, member, role));
});

export const DELETE = workspaceRoute<P>('owner', async (_req, ctx, { member }) => {
  if (!UUID.test(member)) throw notFoundError('That member');
  await removeMember(ctx, member);
  return new NextResponse(null, { status: 204 });
});
