'use client';
import { Controller, useWatch } from 'react-hook-form';
import type { Language } from '@/lib/schemas/study.schema';
import { DEFAULT_CONSENTS } from '@/lib/schemas/language-defaults';
import { errorAt, Field, fieldId, Section, type BuilderForm } from './form-bits';
import { SegmentQuestions } from './segment-questions';
import { StringList } from './string-list';
import { DataProtectionCaution } from '@/components/studies/data-protection-caution';

export function BuilderRespondent({ form }: { form: BuilderForm }) {
  const { register, formState } = form;
  const e = (p: string) => errorAt(formState.errors, p);
  const attention = useWatch({ control: form.control, name: 'attentionCheck' }) as { enabled?: boolean; options?: string[] } | undefined;
  return (
    <Section title="What respondents see besides trials">
      <Field label="Consent text" name="consentText" error={e('consentText')} hint="Shown first; the respondent must agree before anything is stored. The retention period from Settings is added below it (and frozen at launch).">
        <textarea id={fieldId('consentText')} rows={6} className="input" {...register('consentText')} />
      </Field>
      <button type="button" className="btn !min-h-0 !py-1" onClick={() => form.setValue('consentText', DEFAULT_CONSENTS[(form.getValues('language') ?? 'en') as Language], { shouldDirty: true })}>Restore the standard text</button>
      {/* Respondents' data (issue 13, point 5): who runs the study, and the caution beside the consent text. */}
      <Field label="Who runs this study (contact)" name="contact" error={e('contact')} hint="Shown with the consent text, e.g. “Pricing research, Example Foods Ltd — privacy@example.com”. Required to launch; respondents quote their reference code here to have their answers deleted.">
        <input id={fieldId('contact')} className="input" {...register('contact')} />
      </Field>
      <DataProtectionCaution about="consent" />
      <div className="border-t border-rule pt-3"><SegmentQuestions form={form} /></div>
      <div className="space-y-3 border-t border-rule pt-3">
        <label className="flex items-center gap-2 font-semibold">
          <input type="checkbox" {...register('attentionCheck.enabled')} /> Attention check
        </label>
        <p className="hint">One question with a stated right answer, placed among the trials; respondents who miss it can be excluded in the results.</p>
        {attention?.enabled ? (
          <div className="space-y-3">
            <Field label="Attention question" name="attentionCheck.question" error={e('attentionCheck.question')}>
              <input id={fieldId('attentionCheck.question')} className="input" {...register('attentionCheck.question')} />
            </Field>
            <Controller
              control={form.control}
              name="attentionCheck.options"
              render={({ field }) => (
                <StringList name="attention-options" label="Attention answer" values={(field.value as string[]) ?? []} onChange={field.onChange} addLabel="Add an answer" max={6}
                  errorFor={(k) => e(`attentionCheck.options.${k}`)} listError={e('attentionCheck.options')} />
              )}
            />
            <Field label="Right answer" name="attentionCheck.correct" error={e('attentionCheck.correct')}>
              <select id={fieldId('attentionCheck.correct')} className="input !w-56" {...register('attentionCheck.correct')}>
                {(attention.options ?? []).filter(Boolean).map((o) => <option key={o}>{o}</option>)}
              </select>
            </Field>
          </div>
        ) : null}
      </div>
    </Section>
  );
}
