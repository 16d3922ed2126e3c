import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { hasRole } from '@/lib/roles';
import { listPriceLists } from '@/lib/server/promotions/price-lists';
import { listPromoPlans } from '@/lib/server/promotions/plans';
import { FLOOR_MODEL_SHORT } from '@/lib/promo/model-choice';
import { formatTarget } from '@/lib/promo/format';
import { describeFitSource, isBorrowed } from '@/lib/promo/fit-source';
import { PRICE_ENDING_LABELS } from '@/lib/schemas/study.schema';
import { PageTitle } from '@/components/ui/page-title';
import { EmptyState } from '@/components/ui/empty-state';
import { CautionsPanel } from './_components/cautions-panel';
import { DeleteButton } from './_components/delete-button';
import { ScrollFrame } from '@/components/ui/scroll-frame';

export const metadata: Metadata = { title: 'Promotions' };

const date = (iso: string) => new Date(iso).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });

export default async function PromotionsPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const [plans, lists] = await Promise.all([listPromoPlans(ctx), listPriceLists(ctx)]);
  const analyst = hasRole(ctx.role, 'analyst');
  const base = `/w/${ctx.workspace.slug}/promotions`;
  return (
    <>
      <PageTitle title="Promotions">
        {analyst ? <Link className="btn" href={`${base}/price-lists/new`}>Upload price list</Link> : null}
        {analyst && lists.length ? <Link className="btn btn-primary" href={`${base}/plans/new`}>New promotion plan</Link> : null}
      </PageTitle>
      <div className="grid gap-8 *:min-w-0 lg:grid-cols-[1fr_19rem]">
        <div className="space-y-8">
          <section aria-labelledby="plans-h">
            <h2 id="plans-h" className="mb-3 text-xl">Promotion plans</h2>
            {plans.length === 0 ? (
              <EmptyState title="No promotion plans yet">
                A plan turns a fitted study into a promo floor for every item on a price list: the smallest discount shoppers notice, rounded to a price ending.
              </EmptyState>
            ) : (
              <ScrollFrame label="Promotion plans" className="card"><table className="table">
                <thead><tr><th>Plan</th><th>Study</th><th>Price list</th><th>Model</th><th>Notice rate</th><th>Ending</th><th>Created</th>{analyst ? <th><span className="sr-only">Actions</span></th> : null}</tr></thead>
                <tbody>
                  {plans.map((p) => (
                    <tr key={p.id}>
                      <td><Link href={`${base}/plans/${p.id}`}>{p.name}</Link>{p.poorFit ? <span className="pill ml-2 text-brick">⚠ poor fit</span> : null}{isBorrowed(p.fit.source) ? <span className="pill ml-2" title={describeFitSource(p.fit.source!)}>{p.fit.source!.borrowedFor.length ? 'borrowed fit' : 'pooled fit'}</span> : null}</td>
                      <td>{p.study.name}{p.settings.segment ? <span className="hint"> · {p.settings.segment.answer}</span> : null}</td>
                      <td>{p.priceList.name}</td>
                      <td>{FLOOR_MODEL_SHORT[p.settings.model]}</td>
                      <td>{formatTarget(p.settings.target)}</td>
                      <td>{PRICE_ENDING_LABELS[p.settings.ending]}</td>
                      <td className="whitespace-nowrap">{date(p.createdAt)}</td>
                      {analyst ? <td><DeleteButton url={`/api/w/${ctx.workspace.slug}/promo-plans/${p.id}`} what={`plan ${p.name}`} confirmText={`Delete the plan “${p.name}”? The price list and the study stay.`} /></td> : null}
                    </tr>
                  ))}
                </tbody>
              </table></ScrollFrame>
            )}
          </section>
          <section aria-labelledby="lists-h">
            <h2 id="lists-h" className="mb-3 text-xl">Price lists</h2>
            {lists.length === 0 ? (
              <EmptyState title="No price lists yet">
                Upload a CSV with the columns sku, name, regular_price and, optionally, unit_cost and category.
              </EmptyState>
            ) : (
              <ScrollFrame label="Price lists" className="card"><table className="table">
                <thead><tr><th>Price list</th><th>Currency</th><th className="n">Items</th><th>Uploaded</th>{analyst ? <th><span className="sr-only">Actions</span></th> : null}</tr></thead>
                <tbody>
                  {lists.map((l) => (
                    <tr key={l.id}>
                      <td>{l.name}</td>
                      <td>{l.currency}</td>
                      <td className="n">{l.itemCount.toLocaleString('en-GB')}</td>
                      <td className="whitespace-nowrap">{date(l.createdAt)}{l.createdBy ? <span className="hint"> · {l.createdBy}</span> : null}</td>
                      {analyst ? <td><DeleteButton url={`/api/w/${ctx.workspace.slug}/price-lists/${l.id}`} what={`price list ${l.name}`} confirmText={`Delete the price list “${l.name}” and every plan built on it?`} /></td> : null}
                    </tr>
                  ))}
                </tbody>
              </table></ScrollFrame>
            )}
          </section>
        </div>
        <CautionsPanel compact />
      </div>
    </>
  );
}
