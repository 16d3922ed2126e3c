import { NextResponse } from 'next/server';
import { userRoute } from '@/lib/server/http/route';
import { listWorkspaces } from '@/lib/server/team/membership';

export const GET = userRoute(async (_req, user) => {
  const workspaces = await listWorkspaces(user.id);
  return NextResponse.json({ user: { id: user.id, email: user.email, name: user.name }, workspaces });
});

export type MeResponse = { user: { id: string; email: string; name: string }; workspaces: Awaited<ReturnType<typeof listWorkspaces>> };
