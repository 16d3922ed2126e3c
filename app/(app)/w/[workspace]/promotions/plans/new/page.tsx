import type { Metadata } from 'next';
import Link from 'next/link';
import { requireRole } from '@/lib/server/http/page-guard';
import { listFittableStudies } from '@/lib/server/analysis/study-fit';
import { listPriceLists } from '@/lib/server/promotions/price-lists';
import { basisOptions } from '@/lib/server/promotions/basis-options';
import { PageTitle } from '@/components/ui/page-title';
import { EmptyState } from '@/components/ui/empty-state';
import { PlanForm } from './_components/plan-form';

export const metadata: Metadata = { title: 'New promotion plan' };

export default async function NewPlanPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<{ study?: string | string[] }> }) {
  const { workspace } = await params;
  const { study: wanted } = await searchParams;
  const ctx = await requireRole(workspace, 'analyst');
  const [fittable, lists] = await Promise.all([listFittableStudies(ctx), listPriceLists(ctx)]);
  // ?study=<id> (from a study's results): that study first, so the form starts with it chosen.
  const studies = [...fittable].sort((a, b) => Number(b.id === wanted) - Number(a.id === wanted));
  const base = `/w/${ctx.workspace.slug}/promotions`;
  const options = await basisOptions(ctx, studies.map((s) => s.id));
  return (
    <>
      <PageTitle title="New promotion plan" />
      {!studies.length || !lists.length ? (
        <EmptyState title={!lists.length ? 'Upload a price list first' : 'No fitted study yet'}>
          {!lists.length
            ? <>A plan needs a price list. <Link href={`${base}/price-lists/new`}>Upload one</Link>.</>
            : 'A plan needs a study with finished respondents, whose fit gives the notice thresholds.'}
        </EmptyState>
      ) : (
        <PlanForm
          slug={ctx.workspace.slug}
          studies={studies.map((s) => ({ id: s.id, name: s.name, category: s.category, task: s.task, currency: s.currency, basePrices: s.basePrices, segmentQuestions: s.segmentQuestions, basis: options[s.id] ?? { shares: [], shareUnavailable: 'The study’s fit is not computed yet.' } }))}
          lists={lists.map((l) => ({ id: l.id, name: l.name, currency: l.currency, itemCount: l.itemCount }))}
        />
      )}
    </>
  );
}
