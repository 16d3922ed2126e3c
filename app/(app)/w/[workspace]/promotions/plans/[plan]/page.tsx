import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { orNotFound } from '@/lib/server/http/not-found';
import { planTable } from '@/lib/server/promotions/plan-table';
import { hasRole } from '@/lib/roles';
import { PageTitle } from '@/components/ui/page-title';
import { PromoFloorChart } from '@/components/charts/promo-floor-chart';
import { BorrowedFitBanner, CautionsPanel, PoorFitBanner } from '../../_components/cautions-panel';
import { fitSourceCautions, isBorrowed } from '@/lib/promo/fit-source';
import { DeleteButton } from '../../_components/delete-button';
import { PlanFacts } from './_components/plan-facts';
import { PlanSummaryCard } from './_components/plan-summary';
import { PlanTable } from './_components/plan-table';

export const metadata: Metadata = { title: 'Promotion plan' };

export default async function PlanPage({ params }: { params: Promise<{ workspace: string; plan: string }> }) {
  const { workspace, plan: planId } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const table = await orNotFound(planTable(ctx, planId));
  const { plan, summary, chart } = table;
  const api = `/api/w/${ctx.workspace.slug}/promo-plans/${plan.id}`;
  const currency = plan.priceList.currency;
  return (
    <>
      <PageTitle title={plan.name}>
        <a className="btn" href={`${api}/export?format=csv`} download>Download CSV</a>
        <a className="btn" href={`${api}/export?format=about-csv`} download>About this plan (CSV)</a>
        <a className="btn" href={`${api}/export?format=json`} download>Download JSON</a>
        {hasRole(ctx.role, 'analyst') ? (
          <DeleteButton url={api} what={`plan ${plan.name}`} confirmText={`Delete the plan “${plan.name}”?`} after={`/w/${ctx.workspace.slug}/promotions`} />
        ) : null}
      </PageTitle>
      <p className="-mt-3 mb-5 text-sm"><Link href={`/w/${ctx.workspace.slug}/promotions`}>← All promotion plans</Link></p>
      {plan.poorFit ? <PoorFitBanner /> : null}
      {plan.fit.source && isBorrowed(plan.fit.source) ? <BorrowedFitBanner source={plan.fit.source} /> : null}
      <div className="grid gap-6 *:min-w-0 lg:grid-cols-[1fr_19rem]">
        <div className="min-w-0 space-y-6">
          <PlanSummaryCard summary={summary} currency={currency} locale={plan.fit.locale} />
          <figure className="card p-4">
            <figcaption className="mb-2 text-sm text-muted">
              Promo floor against regular price. The line is the model’s floor; dots are items at their promo price
              {chart.step > 1 ? ` (one in ${chart.step} of ${chart.itemsTotal.toLocaleString('en-GB')} items)` : ''}; ▽ marks the tested base prices.
            </figcaption>
            <PromoFloorChart data={chart} currency={currency} />
          </figure>
          <PlanFacts plan={plan} />
        </div>
        <CautionsPanel extra={fitSourceCautions(plan.fit.source)} />
      </div>
      <div className="mt-8">
        <PlanTable slug={ctx.workspace.slug} planId={plan.id} currency={currency} locale={plan.fit.locale} total={summary.items} />
      </div>
    </>
  );
}
