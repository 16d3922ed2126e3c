'use client';
import { Controller, useFieldArray } from 'react-hook-form';
import { MAX_SEGMENT_QUESTIONS } from '@/lib/schemas/study.schema';
import { errorAt, Field, fieldId, type BuilderForm } from './form-bits';
import { StringList } from './string-list';

/** Ids are export column names; pick the first free q1, q2, … */
function freeId(taken: string[]) {
  for (let i = 1; ; i++) if (!taken.includes(`q${i}`)) return `q${i}`;
}

export function SegmentQuestions({ form }: { form: BuilderForm }) {
  const { fields, append, remove } = useFieldArray({ control: form.control, name: 'segmentQuestions' });
  const errors = form.formState.errors;
  const e = (p: string) => errorAt(errors, p);
  return (
    <div className="space-y-3">
      <div>
        <h3 className="text-base">Segment questions</h3>
        <p className="hint">Up to {MAX_SEGMENT_QUESTIONS} single-choice questions, e.g. household size or how often they buy the category. Results can be compared by answer.</p>
      </div>
      {fields.map((f, i) => (
        <div key={f.id} className="rounded-sm border border-rule p-3 space-y-3" data-testid="segment-question">
          <div className="grid gap-3 sm:grid-cols-[1fr_10rem]">
            <Field label={`Question ${i + 1}`} name={`segmentQuestions.${i}.text`} error={e(`segmentQuestions.${i}.text`)}>
              <input id={fieldId(`segmentQuestions.${i}.text`)} className="input" {...form.register(`segmentQuestions.${i}.text`)} />
            </Field>
            <Field label="Column name" name={`segmentQuestions.${i}.id`} error={e(`segmentQuestions.${i}.id`)} hint="Used in exports.">
              <input id={fieldId(`segmentQuestions.${i}.id`)} className="input num" {...form.register(`segmentQuestions.${i}.id`)} />
            </Field>
          </div>
          <Controller
            control={form.control}
            name={`segmentQuestions.${i}.options`}
            render={({ field }) => (
              <StringList name={`sq-${i}-options`} label="Answer" values={(field.value as string[]) ?? []} onChange={field.onChange} addLabel="Add an answer" max={8}
                errorFor={(k) => e(`segmentQuestions.${i}.options.${k}`)} listError={e(`segmentQuestions.${i}.options`)} />
            )}
          />
          <button type="button" className="btn btn-danger !min-h-0 !py-1" onClick={() => remove(i)}>Remove question {i + 1}</button>
        </div>
      ))}
      {e('segmentQuestions') ? <p className="field-error" role="alert">{e('segmentQuestions')}</p> : null}
      <button
        type="button"
        className="btn"
        disabled={fields.length >= MAX_SEGMENT_QUESTIONS}
        onClick={() => append({ id: freeId((form.getValues('segmentQuestions') ?? []).map((q) => q.id)), text: '', options: ['', ''] })}
      >
        Add a segment question
      </button>
      {fields.length >= MAX_SEGMENT_QUESTIONS ? <span className="hint ml-2">That is the most a study may ask.</span> : null}
    </div>
  );
}
