import 'server-only';
import { Workspace } from '@/entities/workspace';
import type { WorkspaceSettingsInput } from '@/lib/schemas/workspace.schema';
import { em } from '@/lib/server/db/orm';
import { recordAudit } from './audit';
import type { WorkspaceContext } from './membership';

// Workspace settings: the name and how many days respondent data is kept (retentionDays, told
// to respondents on the consent screen). Anyone in the workspace may read them; the routes let
// only owners change them, and each change writes a `workspace.settings_changed` audit event.

export async function getWorkspaceSettings(ctx: WorkspaceContext) {
  const db = await em();
  const w = await db.findOneOrFail(Workspace, { id: ctx.workspace.id });
  return { slug: w.slug, name: w.name, retentionDays: w.retentionDays, role: ctx.role };
}

export async function updateWorkspaceSettings(ctx: WorkspaceContext, input: WorkspaceSettingsInput) {
  const db = await em();
  const w = await db.findOneOrFail(Workspace, { id: ctx.workspace.id });
  w.name = input.name;
  w.retentionDays = input.retentionDays;
  await db.flush();
  await recordAudit(db, { workspace: w.id, actor: ctx.user.id, action: 'workspace.settings_changed', target: w.name, detail: { ...input } });
  return { slug: w.slug, name: w.name, retentionDays: w.retentionDays, role: ctx.role };
}
