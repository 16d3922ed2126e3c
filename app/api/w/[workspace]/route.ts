import { readJson, route } from '@/lib/server/http/route';
import { getWorkspaceSettings, updateWorkspaceSettings } from '@/lib/server/team/workspaces';
import { workspaceSettingsSchema } from '@/lib/schemas/workspace.schema';

export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx }) => getWorkspaceSettings(ctx));

export const PATCH = route({ auth: 'member', role: 'owner' }, async ({ req, ctx }) => updateWorkspaceSettings(ctx, await readJson(req, workspaceSettingsSchema)));
