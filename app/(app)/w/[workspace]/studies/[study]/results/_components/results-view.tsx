'use client';
import { useQuery } from '@tanstack/react-query';
import { resultsQuery } from '@/lib/queries/results';
import { EmptyState } from '@/components/ui/empty-state';
import { BaseCurves } from './base-curves';
import { WeberSection } from './weber-section';
import { DataQualityPanel } from './data-quality-panel';
import { SegmentsPanel } from './segments-panel';
import { PlannerPanel } from './planner-panel';
import { ExportLinks } from './export-links';
import { FitProgress } from './fit-progress';

type Question = { id: string; text: string; options: string[] };

export function ResultsView({ slug, studyId, canEdit, segmentQuestions }: { slug: string; studyId: string; canEdit: boolean; segmentQuestions: Question[] }) {
  const q = useQuery(resultsQuery(slug, studyId));
  if (q.isPending) return <FitProgress message="Loading the results…" />;
  if (q.isError) return <p role="alert" className="field-error">{q.error.message}</p>;
  const s = q.data;
  const ready = s.fit.status === 'ready' ? { report: s.fit.report, cells: s.cells!.cells, counts: s.counts! } : null;
  const shown = ready ?? (s.previous ? { report: s.previous.report, cells: s.previous.cells, counts: s.previous.counts } : null);
  const money = new Intl.NumberFormat(s.study.locale, { style: 'currency', currency: s.study.currency });
  return (
    <div className="space-y-10">
      {s.fit.status === 'pending' ? <FitProgress message={s.fit.message} stale={!!s.previous} /> : null}
      {s.fit.status === 'empty' ? <EmptyState title="No fit yet">{s.fit.message}</EmptyState> : null}
      {s.study.state === 'live' ? <p className="hint">Fieldwork is running: these results refresh by themselves as respondents complete.</p> : null}
      {shown ? (
        <>
          {ready && s.fit.status === 'ready' && s.fit.poorFit ? (
            <p className="card border-brick p-3 text-sm text-brick" role="note">⚠ Poor fit: {s.poorFitWhy}. Read the intervals with care before planning on these thresholds.</p>
          ) : null}
          <BaseCurves report={shown.report} cells={shown.cells} money={money} />
          <WeberSection report={shown.report} currency={s.study.currency} money={money} />
        </>
      ) : null}
      <DataQualityPanel slug={slug} studyId={studyId} canEdit={canEdit} task={s.study.task} />
      {shown && segmentQuestions.length ? <SegmentsPanel slug={slug} studyId={studyId} questions={segmentQuestions} money={money} /> : null}
      {ready ? <PlannerPanel slug={slug} studyId={studyId} /> : null}
      <ExportLinks slug={slug} studyId={studyId} questions={segmentQuestions} ready={s.fit.status === 'ready'} />
    </div>
  );
}
