'use client';
import { LANGUAGE_LABELS, LANGUAGE_LOCALES, LANGUAGES, type Language } from '@/lib/schemas/study.schema';
import { DEFAULT_ATTENTION, DEFAULT_CONSENTS, isDefaultAttention, isDefaultConsent } from '@/lib/schemas/language-defaults';
import { errorAt, Field, fieldId, type BuilderForm } from './form-bits';

/**
 * The respondents' language (issue 15). Picking one also moves what still holds a standard
 * value to that language's: the price format of the previous language, the standard consent
 * text and the standard attention check. Anything the analyst wrote stays as written.
 */
export function LanguageField({ form }: { form: BuilderForm }) {
  const { register, formState, getValues, setValue } = form;
  const field = register('language');
  const change = (to: Language) => {
    const from = (getValues('language') ?? 'en') as Language;
    if (getValues('locale') === LANGUAGE_LOCALES[from]) setValue('locale', LANGUAGE_LOCALES[to], { shouldDirty: true });
    if (isDefaultConsent(String(getValues('consentText') ?? ''))) setValue('consentText', DEFAULT_CONSENTS[to], { shouldDirty: true });
    const a = getValues('attentionCheck');
    if (a && isDefaultAttention(a)) {
      const d = DEFAULT_ATTENTION[to];
      setValue('attentionCheck', { ...a, question: d.question, options: [...d.options], correct: d.correct }, { shouldDirty: true });
    }
  };
  return (
    <Field label="Respondents’ language" name="language" error={errorAt(formState.errors, 'language')}
      hint="Every screen a respondent sees is in this language; the standard consent text and attention check follow it.">
      <select id={fieldId('language')} className="input" {...field} onChange={(e) => { change(e.target.value as Language); void field.onChange(e); }}>
        {LANGUAGES.map((l) => <option key={l} value={l}>{LANGUAGE_LABELS[l]}</option>)}
      </select>
    </Field>
  );
}
