import type { Metadata } from 'next';
import { requireRole } from '@/lib/server/guards';
import { PageTitle } from '@/components/ui/page-title';
import { EmptyState } from '@/components/ui/empty-state';

export const metadata: Metadata = { title: 'Billing' };

export default async function BillingPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  await requireRole(workspace, 'viewer');
  return (
    <>
      <PageTitle title="Billing" />
      <EmptyState title="Nothing here yet">Respondent seats are used as respondents complete a study; bundles are bought here.</EmptyState>
    </>
  );
}
