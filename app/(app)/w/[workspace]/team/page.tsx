import type { Metadata } from 'next';
import { requireRole } from '@/lib/server/guards';
import { PageTitle } from '@/components/ui/page-title';
import { EmptyState } from '@/components/ui/empty-state';

export const metadata: Metadata = { title: 'Team' };

export default async function TeamPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  await requireRole(workspace, 'viewer');
  return (
    <>
      <PageTitle title="Team" />
      <EmptyState title="Nothing here yet">Invite colleagues and give each a role: owner, analyst or viewer.</EmptyState>
    </>
  );
}
