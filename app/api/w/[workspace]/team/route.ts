import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/api';
import { listMembers } from '@/lib/server/team';

export const GET = workspaceRoute('viewer', async (_req, ctx) => NextResponse.json({ members: await listMembers(ctx) }));
