'use client';
import { Controller, useWatch } from 'react-hook-form';
import { STAIRCASE_RULES, STAIRCASE_RULE_LABELS, taskHasCatchTrials } from '@/lib/schemas/study.schema';
import { randomSeed } from '@/lib/study-defaults';
import { errorAt, Field, fieldId, Section, type BuilderForm } from './form-bits';

export function BuilderTrials({ form }: { form: BuilderForm }) {
  const { register, formState } = form;
  const e = (p: string) => errorAt(formState.errors, p);
  const adaptive = useWatch({ control: form.control, name: 'adaptive.enabled' }) as boolean;
  const task = useWatch({ control: form.control, name: 'task' }) as string;
  return (
    <Section title="Trials">
      <div className="grid gap-4 sm:grid-cols-3">
        <Field label="Repetitions per cell" name="repetitions" error={e('repetitions')} hint="Times each base price × rung is shown to one respondent.">
          <input id={fieldId('repetitions')} type="number" className="input" {...register('repetitions')} />
        </Field>
        {taskHasCatchTrials(task) ? (
          <Field label="Catch trials (% of all trials)" name="catchShare" error={e('catchShare')}
            hint={task === 'spot' ? 'The regular price, no discount; “lower” there is a false alarm, which sets the guess rate (0 to 50 %).' : 'The same price at both places; the fit does not use them, so 0 % is fine (0 to 50 %).'}>
            <Controller
              control={form.control}
              name="catchShare"
              render={({ field }) => (
                <input id={fieldId('catchShare')} type="number" step="any" className="input" value={field.value === '' || field.value == null ? '' : Math.round(Number(field.value) * 1000) / 10}
                  onChange={(ev) => field.onChange(ev.target.value === '' ? '' : Number(ev.target.value) / 100)} onBlur={field.onBlur} />
              )}
            />
          </Field>
        ) : (
          <div className="field" data-testid="no-catch-trials">
            <span className="label">Catch trials</span>
            <p className="text-sm">None for this task.</p>
            <span className="hint">Both tags would show the same price, so a tap carries no information; the guess rate is 1/2 by design.</span>
          </div>
        )}
        <Field label="Practice trials" name="practiceTrials" error={e('practiceTrials')} hint="Shown first and never analysed.">
          <input id={fieldId('practiceTrials')} type="number" className="input" {...register('practiceTrials')} />
        </Field>
      </div>
      <Field label="Trial order seed" name="orderSeed" error={e('orderSeed')} hint="Each respondent's order is shuffled from this seed and their own, so the order can be reproduced.">
        <div className="flex gap-2">
          <input id={fieldId('orderSeed')} type="number" className="input num !w-48" {...register('orderSeed')} />
          <button type="button" className="btn" onClick={() => form.setValue('orderSeed', randomSeed(), { shouldDirty: true })}>New seed</button>
        </div>
      </Field>
      <div className="space-y-3 border-t border-rule pt-3">
        <label className="flex items-center gap-2 font-semibold">
          <input type="checkbox" {...register('adaptive.enabled')} /> Adaptive placement
        </label>
        <p className="hint">Interleaved up-down staircases per base price place trials near each threshold (Levitt 1971); the reported threshold still comes from the pooled fit. Off: every rung is shown the set number of times.</p>
        {adaptive ? (
          <div className="grid gap-4 sm:grid-cols-3">
            <Field label="Staircase rule" name="adaptive.rule" error={e('adaptive.rule')}>
              <select id={fieldId('adaptive.rule')} className="input" {...register('adaptive.rule')}>
                {STAIRCASE_RULES.map((r) => <option key={r} value={r}>{STAIRCASE_RULE_LABELS[r]}</option>)}
              </select>
            </Field>
            <Field label="Trials per base price" name="adaptive.trialsPerBase" error={e('adaptive.trialsPerBase')}>
              <input id={fieldId('adaptive.trialsPerBase')} type="number" className="input" {...register('adaptive.trialsPerBase')} />
            </Field>
            <Field label="Stop after reversals" name="adaptive.reversals" error={e('adaptive.reversals')}>
              <input id={fieldId('adaptive.reversals')} type="number" className="input" {...register('adaptive.reversals')} />
            </Field>
          </div>
        ) : null}
      </div>
    </Section>
  );
}
