import { NextResponse } from 'next/server';
import { readJson, workspaceRoute } from '@/lib/server/http/route';
import { getWorkspaceSettings, updateWorkspaceSettings } from '@/lib/server/team/workspaces';
import { workspaceSettingsSchema } from '@/lib/schemas/workspace.schema';

export const GET = workspaceRoute('viewer', async (_req, ctx) => NextResponse.json(await getWorkspaceSettings(ctx)));

export const PATCH = workspaceRoute('owner', async (req, ctx) => {
  const input = await readJson(req, workspaceSettingsSchema);
  return NextResponse.json(await updateWorkspaceSettings(ctx, input));
});
