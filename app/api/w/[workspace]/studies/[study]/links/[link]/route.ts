import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { closeLink } from '@/lib/server/studies/respondent-links';
import { respondentLinkPatchSchema } from '@/lib/schemas/respondent-link.schema';

export const PATCH = workspaceRoute<{ workspace: string; study: string; link: string }>('analyst', async (req, ctx, p) => {
  await readJson(req, respondentLinkPatchSchema);
  return NextResponse.json(await closeLink(ctx, p.study, p.link));
});
