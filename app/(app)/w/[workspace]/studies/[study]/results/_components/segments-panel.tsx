'use client';
import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { segmentsQuery } from '@/lib/queries/results';
import { thresholdText } from '@/lib/results-text';
import { FitProgress } from './fit-progress';
import { ScrollFrame } from '@/components/ui/scroll-frame';

type Question = { id: string; text: string; options: string[] };
const pv = (p: number | null) => (p === null ? '—' : p < 0.001 ? '< 0.001' : p.toFixed(3));

export function SegmentsPanel({ slug, studyId, questions, money }: { slug: string; studyId: string; questions: Question[]; money: Intl.NumberFormat }) {
  const [question, setQuestion] = useState('');
  const q = useQuery(segmentsQuery(slug, studyId, question));
  const d = q.data;
  return (
    <section aria-labelledby="seg-h" data-testid="segments">
      <h2 id="seg-h" className="mb-1 text-2xl">Segments</h2>
      <label className="field mb-3 max-w-md">
        <span className="label">Compare the answer groups of</span>
        <select className="input" value={question} onChange={(e) => setQuestion(e.target.value)}>
          <option value="">Choose a segment question…</option>
          {questions.map((x) => <option key={x.id} value={x.id}>{x.text}</option>)}
        </select>
      </label>
      {question && q.isPending ? <FitProgress message="Loading…" /> : null}
      {q.isError ? <p role="alert" className="field-error">{q.error.message}</p> : null}
      {d?.status === 'pending' ? <FitProgress message={d.message} /> : null}
      {d?.status === 'empty' ? <p className="text-sm text-muted">{d.message}</p> : null}
      {d?.status === 'ready' ? (
        <ScrollFrame label="Thresholds by segment" className="card p-4">
          <table className="table">
            <thead>
              <tr><th>Base price</th>{d.result.groups.map((g) => <th key={g.label} className="n">{g.label}<br /><span className="hint">{d.result.respondents[g.label]} respondents</span></th>)}</tr>
            </thead>
            <tbody>
              {d.result.groups[0].thresholds.map((t, i) => (
                <tr key={t.basePrice}>
                  <td className="num">{money.format(t.basePrice)}</td>
                  {d.result.groups.map((g) => <td key={g.label} className="n">{thresholdText(g.thresholds[i], (f) => `${(f * 100).toFixed(2)} %`)}{g.thresholds[i].amount === null ? '' : ` · ${money.format(g.thresholds[i].amount!)}`}</td>)}
                </tr>
              ))}
              <tr className="font-semibold">
                <td>Weber slope (95 % interval)</td>
                {d.result.groups.map((g) => <td key={g.label} className="n">{g.weberSlope?.toFixed(2) ?? '—'}{g.weberSlopeCi ? ` (${g.weberSlopeCi[0].toFixed(2)} – ${g.weberSlopeCi[1].toFixed(2)})` : ''}</td>)}
              </tr>
            </tbody>
          </table>
          <p className="mt-3 text-sm" data-testid="segment-test">
            Likelihood-ratio test of one shared power model against one per group: χ² = <span className="num">{d.result.test.chi2.toFixed(2)}</span> on {d.result.test.df} df, p = <span className="num">{pv(d.result.test.p)}</span>{d.result.test.method ? ` (${d.result.test.method})` : ''}.{' '}
            {d.result.test.p !== null && d.result.test.p < 0.05 ? 'The answer groups notice discounts differently: consider separate promo floors.' : 'No clear evidence that the answer groups differ; one set of thresholds serves them all.'}
          </p>
          <p className="hint">Thresholds from each group&apos;s power model; intervals from {200} bootstrap samples per group.{d.result.skipped.length ? ` Without data: ${d.result.skipped.join(', ')}.` : ''}</p>
        </ScrollFrame>
      ) : null}
    </section>
  );
}
