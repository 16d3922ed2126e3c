'use client';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { plannerInputSchema, type PlannerInput } from '@/lib/schemas/results.schema';
import { plannerQuery } from '@/lib/queries/results';
import { FitProgress } from './fit-progress';
import { ScrollFrame } from '@/components/ui/scroll-frame';

export function PlannerPanel({ slug, studyId }: { slug: string; studyId: string }) {
  const [width, setWidth] = useState<number | null>(null);
  const { register, handleSubmit, formState: { errors } } = useForm({ resolver: zodResolver(plannerInputSchema), defaultValues: { widthPoints: 2 } as PlannerInput });
  const q = useQuery(plannerQuery(slug, studyId, width));
  const d = q.data;
  return (
    <section aria-labelledby="plan-h">
      <h2 id="plan-h" className="mb-1 text-2xl">Sample-size planner</h2>
      <p className="mb-3 max-w-prose text-sm text-muted">Simulates this design (its base prices, ladder and repetitions) under the current fit&apos;s thresholds, slope, lapse and guess rate, and finds how many completes bring each threshold&apos;s 95 % interval under the width you choose.</p>
      <form className="mb-3 flex flex-wrap items-end gap-3" noValidate onSubmit={handleSubmit((v) => setWidth(v.widthPoints))}>
        <label className="field">
          <span className="label">Interval width (percentage points of the base price)</span>
          <input className="input !w-32 num" type="number" step="0.1" {...register('widthPoints')} aria-invalid={!!errors.widthPoints} />
          {errors.widthPoints ? <span className="field-error">{errors.widthPoints.message}</span> : null}
        </label>
        <button className="btn" type="submit">Plan</button>
      </form>
      {q.isError ? <p role="alert" className="field-error">{q.error.message}</p> : null}
      {d?.status === 'pending' ? <FitProgress message={d.message} /> : null}
      {d?.status === 'empty' ? <p className="text-sm text-muted">{d.message}</p> : null}
      {d?.status === 'ready' ? (
        <ScrollFrame label="Respondents needed per base price" className="card max-w-3xl"><table className="table">
          <thead><tr><th>Base price</th><th className="n">Threshold</th><th className="n">Width now (points)</th><th className="n">Completes needed</th><th className="n">More than now</th></tr></thead>
          <tbody>
            {d.result.bases.map((b) => (
              <tr key={b.basePrice}>
                <td className="num">{b.basePrice}</td>
                <td className="n">{b.thresholdPercent.toFixed(2)} %</td>
                <td className="n">{b.currentWidthPoints?.toFixed(2) ?? '—'}</td>
                <td className="n">{b.respondents?.toLocaleString('en-GB') ?? 'over 5,000'}</td>
                <td className="n">{b.more === null ? '—' : b.more.toLocaleString('en-GB')}</td>
              </tr>
            ))}
          </tbody>
          <caption className="hint caption-bottom pt-2 text-left">Now: {d.result.currentCompletes} completes after exclusions. Assumed slope {d.result.assumed.beta.toFixed(2)}, lapse {(d.result.assumed.lapse * 100).toFixed(1)} %, guess {(d.result.assumed.guess * 100).toFixed(1)} %; widths from simulated studies, so the current bootstrap width and the planned one differ a little.</caption>
        </table></ScrollFrame>
      ) : null}
    </section>
  );
}
