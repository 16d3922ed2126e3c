import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { deleteStudy, getStudy, updateStudy } from '@/lib/server/studies/studies';
import { studyDesignSchema } from '@/lib/schemas/study.schema';

type P = { workspace: string; study: string };

export const GET = workspaceRoute<P>('viewer', async (_req, ctx, p) => NextResponse.json(await getStudy(ctx, p.study)));

/** Replaces a draft's whole design; a launched study answers 409 (its design is frozen). */
export const PATCH = workspaceRoute<P>('analyst', async (req, ctx, p) => {
  const design = await readJson(req, studyDesignSchema);
  return NextResponse.json(await updateStudy(ctx, p.study, design));
});

export const DELETE = workspaceRoute<P>('analyst', async (_req, ctx, p) => {
  await deleteStudy(ctx, p.study);
  return new NextResponse(null, { status: 204 });
});
