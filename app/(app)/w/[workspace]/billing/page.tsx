import type { Metadata } from 'next';
import { connection } from 'next/server';
import { requireRole } from '@/lib/server/http/page-guard';
import { billingOverview } from '@/lib/server/billing/checkout';
import { BUNDLES } from '@/lib/billing-bundles';
import { PageTitle } from '@/components/ui/page-title';
import { BundleCard } from './_components/bundle-card';
import { LedgerTable } from './_components/ledger-table';

export const metadata: Metadata = { title: 'Billing' };

export default async function BillingPage({ params }: { params: Promise<{ workspace: string }> }) {
  await connection();
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const o = await billingOverview(ctx);
  return (
    <>
      <PageTitle title="Billing" />
      <section className="card mb-8 flex flex-wrap items-baseline gap-x-6 gap-y-1 p-5" aria-labelledby="balance-h">
        <h2 id="balance-h" className="text-lg">Seat balance</h2>
        <p className="num text-3xl" data-testid="seat-balance">{o.balance.toLocaleString('en')}</p>
        <p className="text-sm text-muted">seats left · one seat is used when a respondent completes a study</p>
      </section>

      <h2 className="mb-1 text-xl">Seat bundles</h2>
      <p className="mb-3 text-sm text-muted">
        {o.canBuy ? 'Payment goes through Stripe Checkout; seats are added when the payment is confirmed.' : 'Only an owner of the workspace can buy bundles.'}{' '}
        Demo prices, invented for this installation.
      </p>
      <div className="mb-10 grid gap-4 sm:grid-cols-3">
        {BUNDLES.map((b) => (
          <BundleCard key={b.id} slug={ctx.workspace.slug} bundle={b} canBuy={o.canBuy} />
        ))}
      </div>

      <h2 className="mb-3 text-xl">History</h2>
      <LedgerTable entries={o.entries} />
    </>
  );
}
