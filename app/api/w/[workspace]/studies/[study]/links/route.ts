import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { createLink, listLinks } from '@/lib/server/studies/respondent-links';
import { respondentLinkSchema } from '@/lib/schemas/respondent-link.schema';

type P = { workspace: string; study: string };

export const GET = workspaceRoute<P>('viewer', async (_req, ctx, p) => NextResponse.json({ links: await listLinks(ctx, p.study) }));

export const POST = workspaceRoute<P>('analyst', async (req, ctx, p) => {
  const input = await readJson(req, respondentLinkSchema);
  return NextResponse.json(await createLink(ctx, p.study, input), { status: 201 });
});
