import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/http/route';
import { listMembers } from '@/lib/server/team/members';

export const GET = workspaceRoute('viewer', async (_req, ctx) => NextResponse.json({ members: await listMembers(ctx) }));
