'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { promoPlanCreateSchema, TARGET_CHOICES, TARGET_CHOICE_LABELS, type PromoPlanCreate, type PromoPlanCreateInput } from '@/lib/schemas/promo-plan.schema';
import { PRICE_ENDINGS, PRICE_ENDING_LABELS } from '@/lib/schemas/study.schema';
import { FLOOR_MODELS, FLOOR_MODEL_LABELS } from '@/lib/promo/model-choice';
import { TextField } from '@/components/ui/text-field';
import { FLOOR_BASES, FLOOR_BASIS_LABELS, type BasisOption } from '@/lib/promo/floor-basis';

interface StudyOption { id: string; name: string; category: string; task: string; currency: string; basePrices: number[]; segmentQuestions: { id: string; text: string; options: string[] }[]; basis: BasisOption }
interface ListOption { id: string; name: string; currency: string; itemCount: number }

const SEP = '\u241F';

function Select({ id, label, error, hint, children, ...rest }: { id: string; label: string; error?: string; hint?: string; children: React.ReactNode } & React.SelectHTMLAttributes<HTMLSelectElement>) {
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <select id={id} className="input" aria-invalid={error ? 'true' : 'false'} {...rest}>{children}</select>
      {error ? <span className="field-error" role="alert">{error}</span> : hint ? <span className="hint">{hint}</span> : null}
    </div>
  );
}

export function PlanForm({ slug, studies, lists }: { slug: string; studies: StudyOption[]; lists: ListOption[] }) {
  const router = useRouter();
  const [status, setStatus] = useState<{ kind: 'pending' | 'error'; text: string } | null>(null);
  const first = studies[0];
  const { register, handleSubmit, setError, setValue, control, formState } = useForm<PromoPlanCreateInput, unknown, PromoPlanCreate>({
    resolver: zodResolver(promoPlanCreateSchema),
    defaultValues: { name: '', studyId: first.id, pooledStudyIds: [], priceListId: (lists.find((l) => l.currency === first.currency) ?? lists[0]).id, segment: null, model: 'preferred', target: 'mid-point', ending: 'ends-99', basis: 'point', share: null, tolerancePoints: 2 },
  });
  const studyId = useWatch({ control, name: 'studyId' });
  const segment = useWatch({ control, name: 'segment' });
  const basis = useWatch({ control, name: 'basis' });
  const ending = useWatch({ control, name: 'ending' });
  const pooled = useWatch({ control, name: 'pooledStudyIds' }) ?? [];
  const study = studies.find((s) => s.id === studyId) ?? first;
  // Studies whose shoppers may be fitted together with the chosen one: same task (guess rate) and currency.
  const poolable = studies.filter((s) => s.id !== study.id && s.task === study.task && s.currency === study.currency);
  const togglePooled = (id: string, on: boolean) => {
    const next = on ? [...pooled.filter((x) => x !== id), id] : pooled.filter((x) => x !== id);
    setValue('pooledStudyIds', next);
    if (next.length) setValue('segment', null);
  };
  const shareOff = study.basis.shareUnavailable;
  const err = formState.errors;

  const submit = handleSubmit(async (values) => {
    setStatus(null);
    const res = await fetch(`/api/w/${slug}/promo-plans`, { method: 'POST', headers: { 'content-type': 'application/json', accept: 'application/json' }, body: JSON.stringify(values) });
    const body = await res.json().catch(() => null);
    if (res.status === 201) {
      router.push(`/w/${slug}/promotions/plans/${body.plan.id}`);
      return;
    }
    if (res.status === 202) return setStatus({ kind: 'pending', text: body.message });
    const issues: { path: string; message: string }[] = body?.error?.issues ?? [];
    for (const i of issues) setError(i.path as keyof PromoPlanCreateInput, { message: i.message });
    setStatus({ kind: 'error', text: body?.error?.message ?? `Could not create the plan (${res.status}).` });
  });

  return (
    <form onSubmit={submit} noValidate className="card grid max-w-3xl gap-4 p-5 sm:grid-cols-2">
      <div className="sm:col-span-2"><TextField label="Plan name" registration={register('name')} error={err.name?.message} /></div>
      <Select id="f-studyId" label="Fitted study" error={err.studyId?.message} {...register('studyId', { onChange: () => { setValue('segment', null); setValue('basis', 'point'); setValue('share', null); setValue('pooledStudyIds', []); } })}
        hint="An item in a category the study did not measure gets a borrowed floor; the plan, its exports and its cautions say so.">
        {studies.map((s) => <option key={s.id} value={s.id}>{s.name} ({s.category}, {s.currency})</option>)}
      </Select>
      <Select id="f-segment" label="Respondents" disabled={pooled.length > 0} hint={`Tested base prices: ${study.basePrices.join(' · ')} ${study.currency}`}
        value={segment ? `${segment.questionId}${SEP}${segment.answer}` : ''}
        onChange={(e) => { const [questionId, answer] = e.target.value.split(SEP); setValue('segment', e.target.value ? { questionId, answer } : null); }}>
        <option value="">All respondents</option>
        {study.segmentQuestions.map((q) => (
          <optgroup key={q.id} label={q.text}>
            {q.options.map((o) => <option key={o} value={`${q.id}${SEP}${o}`}>{o}</option>)}
          </optgroup>
        ))}
      </Select>
      {poolable.length ? (
        <fieldset className="field sm:col-span-2" data-testid="pooled-studies">
          <legend className="label">Pool with other studies (optional)</legend>
          <span className="hint">Fits the shoppers of the chosen studies together, for a category none of them measured alone. Same task and currency only; the whole plan is then marked as a pooled fit.</span>
          {poolable.map((s) => (
            <label key={s.id} className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={pooled.includes(s.id)} onChange={(e) => togglePooled(s.id, e.target.checked)} />
              <span>{s.name} <span className="text-muted">({s.category})</span></span>
            </label>
          ))}
          {err.pooledStudyIds?.message ? <span className="field-error" role="alert">{err.pooledStudyIds.message}</span> : null}
        </fieldset>
      ) : null}
      <Select id="f-priceListId" label="Price list" error={err.priceListId?.message} {...register('priceListId')}>
        {lists.map((l) => <option key={l.id} value={l.id}>{l.name} ({l.itemCount.toLocaleString('en-GB')} items, {l.currency})</option>)}
      </Select>
      <Select id="f-model" label="Model" error={err.model?.message} {...register('model')}>
        <option value="preferred">The study’s preferred model (from its model comparison)</option>
        {FLOOR_MODELS.map((m) => <option key={m} value={m}>{FLOOR_MODEL_LABELS[m]}</option>)}
      </Select>
      <div className="field sm:col-span-2" role="radiogroup" aria-labelledby="basis-label" data-testid="floor-basis">
        <span id="basis-label" className="label">Where the floor sits</span>
        {FLOOR_BASES.map((b) => {
          const off = b === 'share' && !!shareOff;
          return (
            <label key={b} className={`flex items-start gap-2 text-sm ${off ? 'text-muted' : ''}`}>
              <input type="radio" value={b} disabled={off} className="mt-1" {...register('basis', { onChange: (e) => { if (e.target.value === 'share') setValue('share', study.basis.shares.includes(0.75) ? 0.75 : study.basis.shares[0] ?? null); } })} />
              <span>
                <span className="font-semibold">{FLOOR_BASIS_LABELS[b]}</span>
                <span className="block text-muted">
                  {b === 'point' ? 'The fitted threshold at the notice rate chosen below.' : b === 'cautious' ? 'The deeper end of the threshold’s 95 % interval: the floor still works if the true threshold is at the unfavourable end.' : off ? `Not available: ${shareOff}` : 'Each shopper at their own threshold; the floor is the discount that this share of shoppers notices (from the study’s shopper-level model).'}
                </span>
              </span>
            </label>
          );
        })}
        {err.basis?.message ? <span className="field-error" role="alert">{err.basis.message}</span> : null}
      </div>
      {basis === 'share' ? (
        <Select id="f-share" label="Share of shoppers who notice" error={err.share?.message} {...register('share')}>
          {study.basis.shares.map((x) => <option key={x} value={x}>{Math.round(x * 100)} % of shoppers</option>)}
        </Select>
      ) : (
        <Select id="f-target" label="Target notice rate" error={err.target?.message} hint="The notice rate of the fitted curve the floor should reach." {...register('target')}>
          {TARGET_CHOICES.map((t) => <option key={t} value={t}>{TARGET_CHOICE_LABELS[t]}</option>)}
        </Select>
      )}
      <Select id="f-ending" label="Price ending" error={err.ending?.message} hint="The promo price is rounded down to it, so the discount only gets deeper." {...register('ending')}>
        {PRICE_ENDINGS.map((e) => <option key={e} value={e}>{PRICE_ENDING_LABELS[e]}</option>)}
      </Select>
      {ending !== 'exact' ? (
        <div className="field">
          <label htmlFor="f-tolerancePoints">Ending may deepen the discount by at most (points)</label>
          <input id="f-tolerancePoints" type="number" step="0.5" min={0} max={50} className="input !w-32" aria-invalid={err.tolerancePoints ? 'true' : 'false'} {...register('tolerancePoints')} />
          {err.tolerancePoints?.message ? <span className="field-error" role="alert">{err.tolerancePoints.message}</span> : <span className="hint">Beyond this, the exact floor price (to the cent) is kept and the item is flagged. Default 2 points.</span>}
        </div>
      ) : null}
      <div className="flex flex-wrap items-center gap-3 sm:col-span-2">
        <button type="submit" className="btn btn-primary" disabled={formState.isSubmitting}>{formState.isSubmitting ? 'Working…' : 'Create plan'}</button>
        {status ? <span role={status.kind === 'error' ? 'alert' : 'status'} className={status.kind === 'error' ? 'field-error' : 'text-sm text-muted'} data-testid="plan-status">{status.text}</span> : null}
      </div>
    </form>
  );
}
