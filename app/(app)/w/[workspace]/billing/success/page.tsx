import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { PageTitle } from '@/components/ui/page-title';
import { PaymentWait } from './payment-wait';

export const metadata: Metadata = { title: 'Payment' };

export default async function BillingSuccessPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<{ session_id?: string }> }) {
  const { workspace } = await params;
  const { session_id } = await searchParams;
  const ctx = await requireRole(workspace, 'viewer');
  return (
    <>
      <PageTitle title="Payment" />
      {session_id ? (
        <PaymentWait slug={ctx.workspace.slug} sessionId={session_id} />
      ) : (
        <p className="card p-5">This page needs the checkout reference Stripe sends back. <Link href={`/w/${ctx.workspace.slug}/billing`}>Back to billing</Link></p>
      )}
    </>
  );
}
