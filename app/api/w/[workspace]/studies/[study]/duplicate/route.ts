import { NextResponse } from 'next/server';
import { workspaceRoute } from '@/lib/server/http/route';
import { duplicateStudy } from '@/lib/server/studies/studies';

export const POST = workspaceRoute<{ workspace: string; study: string }>('analyst', async (_req, ctx, p) =>
  NextResponse.json(await duplicateStudy(ctx, p.study), { status: 201 }),
);
