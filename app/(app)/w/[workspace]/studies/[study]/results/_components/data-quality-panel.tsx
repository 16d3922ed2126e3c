'use client';
import { useEffect, useState } from 'react';
import { useForm, type UseFormRegister } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { EXCLUSION_RULE_LABELS, exclusionRulesSchema, type ExclusionRules } from '@/lib/schemas/exclusions.schema';
import { exclusionsQuery, type ExclusionsResponse } from '@/lib/queries/results';
import { ApiRequestError, fetchJson } from '@/lib/fetch-json';

const fmt = (n: number) => n.toLocaleString('en-GB');

export function DataQualityPanel({ slug, studyId, canEdit, task }: { slug: string; studyId: string; canEdit: boolean; task: string }) {
  const qc = useQueryClient();
  const q = useQuery(exclusionsQuery(slug, studyId));
  const [status, setStatus] = useState<string | null>(null);
  const form = useForm<z.input<typeof exclusionRulesSchema>, unknown, ExclusionRules>({ resolver: zodResolver(exclusionRulesSchema) });
  const { register, handleSubmit, reset, setError, formState: { errors, isSubmitting, isDirty } } = form;
  useEffect(() => { if (q.data) reset(q.data.rules); }, [q.data, reset]);

  const onSubmit = handleSubmit(async (rules) => {
    setStatus(null);
    try {
      const saved = await fetchJson<ExclusionsResponse>(`/api/w/${slug}/studies/${studyId}/exclusions`, { method: 'PUT', body: JSON.stringify(rules) });
      qc.setQueryData(exclusionsQuery(slug, studyId).queryKey, saved);
      await qc.invalidateQueries({ queryKey: ['results', slug, studyId] });
      await qc.invalidateQueries({ queryKey: ['segments', slug, studyId] });
      await qc.invalidateQueries({ queryKey: ['planner', slug, studyId] });
      setStatus('Rules saved; the fit is updating.');
    } catch (err) {
      if (err instanceof ApiRequestError && err.issues) for (const i of err.issues) setError(i.path as never, { message: i.message });
      else setStatus(err instanceof Error ? err.message : 'Could not save the rules.');
    }
  });

  const c = q.data?.counts;
  return (
    <section aria-labelledby="dq-h" data-testid="data-quality">
      <h2 id="dq-h" className="mb-1 text-2xl">Data quality</h2>
      <p className="mb-3 text-sm text-muted">Respondents who break a rule in force are left out of the fit and marked in the raw trials export. Only finished respondents count.</p>
      <div className="grid gap-6 md:grid-cols-2">
        <form onSubmit={onSubmit} noValidate className="card space-y-3 p-4" aria-label="Exclusion rules">
          <fieldset disabled={!canEdit || !q.data} className="space-y-3">
            <Rule id="falseAlarms" register={register}>
              <label className="flex items-center gap-2 text-sm">limit
                <input className="input !w-24 num" type="number" step="0.05" min="0.05" max="1" aria-label="False-alarm limit (share of catch trials)" {...register('falseAlarms.maxRate')} aria-invalid={!!errors.falseAlarms?.maxRate} />
                <span className="hint">share of catch trials (0.5 = 50 %){task !== 'spot' ? '; this task has no catch trials' : ''}</span>
              </label>
              {errors.falseAlarms?.maxRate ? <span className="field-error">{errors.falseAlarms.maxRate.message}</span> : null}
            </Rule>
            <Rule id="attention" register={register} />
            <Rule id="speeders" register={register}>
              <label className="flex items-center gap-2 text-sm">limit
                <input className="input !w-24 num" type="number" step="50" min="100" max="10000" aria-label="Median response time limit (ms)" {...register('speeders.minMedianMs')} aria-invalid={!!errors.speeders?.minMedianMs} />
                <span className="hint">ms (median over test and catch trials)</span>
              </label>
              {errors.speeders?.minMedianMs ? <span className="field-error">{errors.speeders.minMedianMs.message}</span> : null}
            </Rule>
            <Rule id="straightLining" register={register} />
          </fieldset>
          {canEdit ? (
            <div className="flex items-center gap-3">
              <button className="btn btn-primary" type="submit" disabled={isSubmitting || !isDirty}>Save rules</button>
              {status ? <span role="status" className="text-sm text-muted">{status}</span> : null}
            </div>
          ) : <p className="hint">Viewers see the rules in force; analysts and owners change them.</p>}
        </form>
        <div className="card p-4">
          <table className="table" data-testid="exclusion-counts">
            <thead><tr><th /><th className="n">Before rules</th><th className="n">After rules</th></tr></thead>
            <tbody>
              <tr><td>Respondents</td><td className="n" data-testid="respondents-before">{c ? fmt(c.respondents.before) : '…'}</td><td className="n" data-testid="respondents-after">{c ? fmt(c.respondents.after) : '…'}</td></tr>
              <tr><td>Trials</td><td className="n">{c ? fmt(c.trials.before) : '…'}</td><td className="n" data-testid="trials-after">{c ? fmt(c.trials.after) : '…'}</td></tr>
            </tbody>
          </table>
          <h3 className="mb-1 mt-4 text-base">Respondents breaking each rule</h3>
          <table className="table">
            <tbody>
              {c ? (Object.keys(EXCLUSION_RULE_LABELS) as (keyof ExclusionRules)[]).map((id) => (
                <tr key={id}><td>{EXCLUSION_RULE_LABELS[id]}{q.data?.rules[id].enabled ? '' : ' (off)'}</td><td className="n">{fmt(c.byRule[id])}</td></tr>
              )) : null}
            </tbody>
          </table>
          <p className="hint mt-2">A respondent can break several rules; counts for rules that are off show who they would catch.</p>
        </div>
      </div>
    </section>
  );
}

function Rule({ id, register, children }: { id: keyof ExclusionRules; register: UseFormRegister<z.input<typeof exclusionRulesSchema>>; children?: React.ReactNode }) {
  return (
    <div className="space-y-1 border-b border-rule pb-2 last:border-0">
      <label className="flex items-center gap-2 font-semibold">
        <input type="checkbox" role="switch" {...register(`${id}.enabled` as const)} data-testid={`rule-${id}`} />
        {EXCLUSION_RULE_LABELS[id]}
      </label>
      {children}
    </div>
  );
}
