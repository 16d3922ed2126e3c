'use client';
import { useWatch } from 'react-hook-form';
import type { Task } from '@/lib/psychometrics/types';
import { TASKS, TASK_LABELS } from '@/lib/schemas/study.schema';
import { errorAt, Field, fieldId, Section, type BuilderForm } from './form-bits';

// One plain sentence per task, in the product's words (DESIGN.md → Tasks).
export const TASK_EXPLAINED: Record<Task, string> = {
  spot: 'Respondents first remember a short shelf of items at their regular prices; later each item returns at a test price and they say whether it is lower than usual or the same.',
  pick: 'Two price tags for the same item show for a moment, one at the base price and one discounted, then hide; the respondent picks the lower one.',
  trip: 'The item at its base price here, or discounted somewhere that takes extra minutes to reach; the respondent decides whether the saving is worth the trip.',
};

export function BuilderTask({ form }: { form: BuilderForm }) {
  const { register, formState } = form;
  const task = useWatch({ control: form.control, name: 'task' }) as Task;
  const e = (p: string) => errorAt(formState.errors, p);
  return (
    <Section title="Task" intro="What each trial asks. Each keeps the comparison perceptual, as a shopper meets prices in a store.">
      <div role="radiogroup" aria-label="Task" className="grid gap-2 sm:grid-cols-3">
        {TASKS.map((t) => (
          <label key={t} className={`card flex cursor-pointer gap-2 p-3 ${task === t ? 'border-teal ring-1 ring-teal' : ''}`}>
            <input type="radio" value={t} {...register('task')} className="mt-1" />
            <span>
              <span className="block font-semibold">{TASK_LABELS[t]}</span>
              <span className="block text-sm text-muted">{TASK_EXPLAINED[t]}</span>
            </span>
          </label>
        ))}
      </div>
      {task === 'spot' ? (
        <Field label="Items on the remembered shelf" name="shelfSize" error={e('shelfSize')} hint="3 to 12 items; more items make remembering harder.">
          <input id={fieldId('shelfSize')} type="number" className="input !w-32" {...register('shelfSize')} />
        </Field>
      ) : null}
      {task === 'pick' ? (
        <Field label="Viewing time (ms)" name="viewMs" error={e('viewMs')} hint="How long both tags stay visible, e.g. 1,200 ms.">
          <input id={fieldId('viewMs')} type="number" step={100} className="input !w-32" {...register('viewMs')} />
        </Field>
      ) : null}
      {task === 'trip' ? (
        <Field label="Minutes of extra effort" name="tripMinutes" error={e('tripMinutes')} hint="How far away the discounted offer is, in minutes.">
          <input id={fieldId('tripMinutes')} type="number" className="input !w-32" {...register('tripMinutes')} />
        </Field>
      ) : null}
    </Section>
  );
}
