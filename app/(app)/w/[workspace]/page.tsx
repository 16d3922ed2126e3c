import type { Metadata } from 'next';
import { requireRole } from '@/lib/server/guards';
import { PageTitle } from '@/components/ui/page-title';
import { EmptyState } from '@/components/ui/empty-state';

export const metadata: Metadata = { title: 'Studies' };

export default async function StudiesPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  await requireRole(workspace, 'viewer');
  return (
    <>
      <PageTitle title="Studies" />
      <EmptyState title="No studies yet">
        A study measures, at several regular prices, how deep a discount must be before shoppers notice it.
      </EmptyState>
    </>
  );
}
