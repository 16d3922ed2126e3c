import type { Metadata } from 'next';
import { connection } from 'next/server';
import { requireRole } from '@/lib/server/http/page-guard';
import { orNotFound } from '@/lib/server/http/not-found';
import { getFitState, isPoorFit } from '@/lib/server/analysis/study-fit';
import { describeRules } from '@/lib/schemas/exclusions.schema';
import { getWeberPlan } from '@/lib/server/analysis/weber-plan';
import { TASK_LABELS } from '@/lib/schemas/study.schema';
import { sharedDiscountDomain } from '@/components/charts/chart-domain';
import { BaseCurves } from '../_components/base-curves';
import { WeberSection } from '../_components/weber-section';
import { ResultsSummary } from '../_components/results-summary';
import { SpreadSection } from '../_components/spread-section';
import { FitCautions } from '../_components/fit-cautions';
import { PrintButton } from './print-button';

// The printable report. Its first page is the results summary (the answer a category manager
// reads first), then the details, the rules and the cautions. Charts have fixed widths for
// paper and scale down (viewBox) on a narrow screen; wide tables scroll inside their frame.

export const metadata: Metadata = { title: 'Results report' };

// Print stylesheet for this page only: no app chrome, no buttons, charts kept whole on a page.
const PRINT_CSS = `
@media print {
  @page { size: A4; margin: 14mm; }
  body > div > header, .print-hide { display: none !important; }
  main { max-width: none !important; padding: 0 !important; }
  .card { border-color: #bbb !important; }
  .print-avoid-break, figure, table { break-inside: avoid; }
  .print-page-end { break-after: page; }
  h2 { break-after: avoid; }
  a { color: inherit; text-decoration: none; }
}`;

export default async function PrintPage({ params }: { params: Promise<{ workspace: string; study: string }> }) {
  await connection();
  const { workspace, study } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const state = await orNotFound(getFitState(ctx, study));
  const s = state.study;
  const weberPlan = await getWeberPlan(state);
  const generated = new Date().toLocaleString('en-GB', { dateStyle: 'long', timeStyle: 'short' });
  return (
    <article className="space-y-8">
      <style>{PRINT_CSS}</style>
      <header className="border-b border-rule pb-3">
        <p className="text-sm text-muted">Notchwise results report · {ctx.workspace.name}</p>
        <h1 className="text-3xl">{s.name}</h1>
        <p className="text-sm">{s.itemName} · {s.category} · {TASK_LABELS[s.task]} · prices in {s.currency} · data version {s.dataVersion} · generated {generated}</p>
        <div className="print-hide mt-2"><PrintButton /></div>
      </header>
      {state.fit.status !== 'ready' ? (
        <>
          <meta httpEquiv="refresh" content="3" />
          <p role="status" className="card p-4">{state.fit.message} This page reloads by itself.</p>
        </>
      ) : (
        <>
          <div className="print-page-end" data-testid="print-summary">
            <ResultsSummary report={state.fit.report} counts={state.counts} rules={s.exclusionRules} locale={s.locale} currency={s.currency} weberPlan={weberPlan} />
          </div>
          <section>
            <h2 className="text-xl">Data and rules</h2>
            <p className="text-sm">Respondents {state.counts!.respondents.before} before rules, {state.counts!.respondents.after} after; trials {state.counts!.trials.before} before, {state.counts!.trials.after} after.</p>
            <ul className="list-disc pl-5 text-sm">{describeRules(s.exclusionRules, s.task).map((r) => <li key={r}>{r}</li>)}</ul>
            <p className="text-sm">Intervals: {state.fit.report.intervalMethod}.</p>
          </section>
          <BaseCurves report={state.fit.report} cells={state.cells!.cells} locale={s.locale} currency={s.currency} width={330} />
          <SpreadSection report={state.fit.report} locale={s.locale} currency={s.currency} domain={sharedDiscountDomain(state.fit.report.bases, state.cells!.cells)} width={330} />
          <WeberSection report={state.fit.report} currency={s.currency} width={420} />
          <FitCautions report={state.fit.report} poorFit={isPoorFit(state.fit.report)} />
        </>
      )}
    </article>
  );
}
