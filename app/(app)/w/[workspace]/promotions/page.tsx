import type { Metadata } from 'next';
import { requireRole } from '@/lib/server/guards';
import { PageTitle } from '@/components/ui/page-title';
import { EmptyState } from '@/components/ui/empty-state';

export const metadata: Metadata = { title: 'Promotions' };

export default async function PromotionsPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  await requireRole(workspace, 'viewer');
  return (
    <>
      <PageTitle title="Promotions" />
      <EmptyState title="Nothing here yet">Promotion plans turn a fitted study into a promo floor for every item on a price list.</EmptyState>
    </>
  );
}
