'use client';
import Link from 'next/link';
import { useQuery } from '@tanstack/react-query';
import { exclusionsQuery, resultsQuery } from '@/lib/queries/results';
import { EmptyState } from '@/components/ui/empty-state';
import { sharedDiscountDomain } from '@/components/charts/chart-domain';
import { poorFitBanner, poorFitBases } from '@/lib/results-text';
import { ResultsSummary } from './results-summary';
import { BaseCurves } from './base-curves';
import { SpreadSection } from './spread-section';
import { WeberSection } from './weber-section';
import { FitCautions } from './fit-cautions';
import { AllExcluded } from './all-excluded';
import { DataQualityPanel } from './data-quality-panel';
import { SegmentsPanel } from './segments-panel';
import { PlannerPanel } from './planner-panel';
import { ExportLinks } from './export-links';
import { FitProgress } from './fit-progress';

// The results page: the answer first (summary, verdict, rule, exclusions, actions and exports),
// then the details under our own headings, then the rules, segments and planner. While a newer
// fit computes, the previous one stays on screen; when the rules leave nobody, the page says
// which rule removed whom and links to the rules.

type Question = { id: string; text: string; options: string[] };

export function ResultsView({ slug, studyId, canEdit, segmentQuestions }: { slug: string; studyId: string; canEdit: boolean; segmentQuestions: Question[] }) {
  const q = useQuery(resultsQuery(slug, studyId));
  const ex = useQuery(exclusionsQuery(slug, studyId));
  if (q.isPending) return <FitProgress message="Loading the results…" />;
  if (q.isError) return <p role="alert" className="field-error">{q.error.message}</p>;
  const s = q.data;
  const ready = s.fit.status === 'ready' ? { report: s.fit.report, cells: s.cells!.cells, counts: s.counts! } : null;
  const shown = ready ?? (s.previous ? { report: s.previous.report, cells: s.previous.cells, counts: s.previous.counts } : null);
  const { locale, currency } = s.study;
  const money = new Intl.NumberFormat(locale, { style: 'currency', currency });
  const rulesHref = '#rules';
  const allExcluded = ex.data && ex.data.counts.respondents.before > 0 && ex.data.counts.respondents.after === 0;
  const exports = <ExportLinks slug={slug} studyId={studyId} questions={segmentQuestions} ready={s.fit.status === 'ready'} />;
  const actions = (
    <div className="space-y-4">
      <div className="flex flex-wrap gap-2">
        {canEdit ? <Link className="btn btn-primary" href={`/w/${slug}/promotions/plans/new?study=${studyId}`} data-testid="plan-from-study">Plan a promotion from this study</Link> : null}
        <Link className="btn" href={`/w/${slug}/studies/${studyId}/results/print`}>Printable report</Link>
      </div>
      {!canEdit ? <p className="hint">Analysts and owners can plan a promotion from this study.</p> : null}
      {exports}
    </div>
  );
  const banner = shown ? poorFitBanner(shown.report, (x) => money.format(x)) : null;
  return (
    <div className="space-y-10">
      {s.fit.status === 'pending' ? <FitProgress message={s.fit.message} stale={!!s.previous} /> : null}
      {s.fit.status === 'empty' && allExcluded && ex.data ? <AllExcluded counts={ex.data.counts} rules={ex.data.rules} rulesHref={rulesHref} canEdit={canEdit} /> : null}
      {s.fit.status === 'empty' && !allExcluded ? <EmptyState title="No fit yet">{s.fit.message}</EmptyState> : null}
      {s.study.state === 'live' ? <p className="hint">Fieldwork is running: these results refresh by themselves as respondents complete.</p> : null}
      {shown ? (
        <>
          <ResultsSummary report={shown.report} counts={shown.counts} rules={s.study.exclusionRules} locale={locale} currency={currency} weberPlan={ready ? s.weberPlan : undefined} actions={actions} />
          {banner && poorFitBases(shown.report).length ? (
            <p className="card border-brick p-3 text-sm text-brick" role="note" data-testid="poor-fit-banner">⚠ Poor fit: {banner}</p>
          ) : null}
          <nav aria-label="Details" className="text-sm">
            <span className="text-muted">In detail: </span>
            <a href="#curves-h">each base price</a> · {shown.report.shopperSpread || shown.report.unit === 'trial' ? <><a href="#spread-h">how shoppers differ</a> · </> : null}
            <a href="#weber-h">the Weber view</a> · <a href="#cautions-h">cautions</a> · <a href="#rules">data quality</a>
          </nav>
          <BaseCurves report={shown.report} cells={shown.cells} locale={locale} currency={currency} />
          <SpreadSection report={shown.report} locale={locale} currency={currency} domain={sharedDiscountDomain(shown.report.bases, shown.cells)} />
          <WeberSection report={shown.report} currency={currency} />
          <FitCautions report={shown.report} poorFit={s.fit.status === 'ready' ? s.fit.poorFit : poorFitBases(shown.report).length > 0} />
        </>
      ) : null}
      <div id="rules" className="scroll-mt-4">
        <DataQualityPanel slug={slug} studyId={studyId} canEdit={canEdit} task={s.study.task} />
      </div>
      {shown && segmentQuestions.length ? <SegmentsPanel slug={slug} studyId={studyId} questions={segmentQuestions} money={money} /> : null}
      {ready ? <PlannerPanel slug={slug} studyId={studyId} /> : null}
      {!shown ? exports : null}
    </div>
  );
}
