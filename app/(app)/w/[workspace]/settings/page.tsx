import type { Metadata } from 'next';
import { requireRole } from '@/lib/server/http/page-guard';
import { getWorkspaceSettings } from '@/lib/server/team/workspaces';
import { listApiTokens } from '@/lib/server/team/access-tokens';
import { PageTitle } from '@/components/ui/page-title';
import { env } from '@/lib/server/platform/env';
import { SettingsForm } from './settings-form';
import { AccessTokens } from './_components/access-tokens';

export const metadata: Metadata = { title: 'Settings' };

export default async function SettingsPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  // Analysts come here for their access tokens; the workspace form stays the owner's.
  const ctx = await requireRole(workspace, 'analyst');
  const tokens = await listApiTokens(ctx);
  const s = ctx.role === 'owner' ? await getWorkspaceSettings(ctx) : null;
  return (
    <>
      <PageTitle title="Settings" />
      {s ? (
        <>
          <h2 className="mb-3 text-xl">Workspace</h2>
          <SettingsForm slug={s.slug} initial={{ name: s.name, retentionDays: s.retentionDays }} />
        </>
      ) : null}
      <AccessTokens slug={ctx.workspace.slug} initial={tokens} appUrl={env().APP_URL} />
    </>
  );
}
