import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { PageTitle } from '@/components/ui/page-title';

export const metadata: Metadata = { title: 'Payment cancelled' };

export default async function BillingCancelPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  return (
    <>
      <PageTitle title="Payment cancelled" />
      <div className="card max-w-xl p-6">
        <p>The checkout was cancelled: nothing was charged and the seat balance is unchanged.</p>
        <p className="mt-4"><Link href={`/w/${ctx.workspace.slug}/billing`}>Back to billing</Link></p>
      </div>
    </>
  );
}
