import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { changeStudyState } from '@/lib/server/studies/lifecycle';
import { studyStateChangeSchema } from '@/lib/schemas/study.schema';

export const POST = workspaceRoute<{ workspace: string; study: string }>('analyst', async (req, ctx, p) => {
  const { action } = await readJson(req, studyStateChangeSchema);
  return NextResponse.json(await changeStudyState(ctx, p.study, action));
});
