'use client';
import type { ReactNode } from 'react';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import type { ExclusionCounts } from '@/lib/exclusions';
import type { ExclusionRules } from '@/lib/schemas/exclusions.schema';
import { exclusionSummary, summaryRows, weberVerdict, type VerdictEvidence } from '@/lib/results-text';
import type { FigureId } from '@/lib/results-glossary';
import type { ResultsResponse } from '@/lib/queries/results';
import { FigureNotes, Term } from './figure-notes';
import { ScrollFrame } from '@/components/ui/scroll-frame';

// The answer first: what a category manager reads in 30 seconds. One table (base price,
// threshold in % and money, 95 % interval, respondents kept; a bound in words, never a number),
// the Weber verdict in one sentence that matches the evidence, the promotion rule it implies,
// what the exclusion rules left out, and the actions (plan a promotion, exports) beside it.
// Shared by the results page and the first page of the printed report.

const NOTES: FigureId[] = ['threshold', 'interval', 'respondentsKept'];

export type WeberPlanState = ResultsResponse['weberPlan'];

export function completesFromPlan(plan: WeberPlanState | undefined): VerdictEvidence['completesToTell'] {
  if (!plan || plan.status === 'none') return null;
  if (plan.status === 'pending') return 'pending';
  return plan.completes === null ? Infinity : plan.completes;
}

export function ResultsSummary({ report, counts, rules, locale, currency, weberPlan, actions }: {
  report: AnalysisReport; counts: ExclusionCounts | null; rules: ExclusionRules; locale: string; currency: string;
  weberPlan?: WeberPlanState; actions?: ReactNode;
}) {
  const money = new Intl.NumberFormat(locale, { style: 'currency', currency });
  const fmt = (x: number) => money.format(x);
  const kept = report.shopperSpread?.shoppers ?? counts?.respondents.after ?? null;
  const verdict = weberVerdict(report, { shoppers: kept, completesToTell: completesFromPlan(weberPlan) }, fmt);
  const rows = summaryRows(report, fmt);
  return (
    <section aria-labelledby="summary-h" data-testid="summary" className="card p-3 sm:p-5">
      <h2 id="summary-h" className="mb-3 text-2xl">The answer</h2>
      <ScrollFrame label="Thresholds by base price" testId="summary-scroll">
        <table className="table [&_td]:whitespace-nowrap" data-testid="summary-table">
          <thead>
            <tr>
              <th>Base price</th>
              <th className="n"><Term id="threshold" notes={NOTES} /> (%)</th>
              <th className="n">Threshold ({currency})</th>
              <th className="n"><Term id="interval" notes={NOTES} /></th>
              <th className="n"><Term id="respondentsKept" notes={NOTES} /></th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.basePrice} data-testid="summary-row">
                <td className="num">{fmt(r.basePrice)}</td>
                {r.bound ? <td className="n" colSpan={2} data-testid="summary-bound">{r.bound}</td> : <><td className="n">{r.percent}</td><td className="n">{r.amount}</td></>}
                <td className="n">{r.interval}</td>
                <td className="n">{kept === null ? '—' : kept.toLocaleString('en-GB')}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollFrame>
      <p className="mt-4 max-w-prose text-lg" data-testid="weber-verdict" data-kind={verdict.kind}>{verdict.sentence}</p>
      <p className="mt-2 max-w-prose" data-testid="promotion-rule"><span className="font-semibold">Promotion rule: </span>{verdict.rule}</p>
      {counts ? <p className="mt-2 max-w-prose text-sm text-muted" data-testid="excluded-summary"><span className="font-semibold">Excluded: </span>{exclusionSummary(counts, rules)}</p> : null}
      {report.unit === 'trial' ? <p className="mt-2 text-sm text-muted">These data carry no respondent ids: intervals assume independent trials.</p> : null}
      {actions ? <div className="print-hide mt-4 border-t border-rule pt-4">{actions}</div> : null}
      <FigureNotes notes={NOTES} />
    </section>
  );
}
