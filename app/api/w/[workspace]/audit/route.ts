import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/http/route';
import { listAuditEvents } from '@/lib/server/team/audit';

export const GET = workspaceRoute('owner', async (req, ctx) => {
  const page = Number(req.nextUrl.searchParams.get('page') ?? 1);
  return NextResponse.json(await listAuditEvents(ctx, page));
});
