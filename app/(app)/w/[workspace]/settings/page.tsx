import type { Metadata } from 'next';
import { requireRole } from '@/lib/server/guards';
import { getWorkspaceSettings } from '@/lib/server/workspaces';
import { PageTitle } from '@/components/ui/page-title';
import { SettingsForm } from './settings-form';

export const metadata: Metadata = { title: 'Settings' };

export default async function SettingsPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'owner');
  const s = await getWorkspaceSettings(ctx);
  return (
    <>
      <PageTitle title="Settings" />
      <h2 className="mb-3 text-xl">Workspace</h2>
      <SettingsForm slug={s.slug} initial={{ name: s.name, retentionDays: s.retentionDays }} />
    </>
  );
}
