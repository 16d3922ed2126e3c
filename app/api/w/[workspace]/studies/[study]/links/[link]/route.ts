import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/api';
import { closeLink } from '@/lib/server/study-links';
import { studyLinkPatchSchema } from '@/lib/schemas/study-link.schema';

export const PATCH = workspaceRoute<{ workspace: string; study: string; link: string }>('analyst', async (req, ctx, p) => {
  await readJson(req, studyLinkPatchSchema);
  return NextResponse.json(await closeLink(ctx, p.study, p.link));
});
