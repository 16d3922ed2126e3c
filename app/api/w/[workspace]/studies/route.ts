import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { createStudy, listStudies } from '@/lib/server/studies/studies';
import { studyDesignSchema } from '@/lib/schemas/study.schema';

export const GET = workspaceRoute('viewer', async (_req, ctx) => NextResponse.json({ studies: await listStudies(ctx) }));

export const POST = workspaceRoute('analyst', async (req, ctx) => {
  const design = await readJson(req, studyDesignSchema);
  return NextResponse.json(await createStudy(ctx, design), { status: 201 });
});
