'use client';
import { CURRENCIES, LOCALES } from '@/lib/schemas/study.schema';
import { errorAt, Field, fieldId, Section, type BuilderForm } from './form-bits';
import { PictureUpload } from './picture-upload';
import { LanguageField } from './builder-language';

export function BuilderItem({ form, slug }: { form: BuilderForm; slug: string }) {
  const { register, formState } = form;
  const e = (p: string) => errorAt(formState.errors, p);
  const input = (name: 'name' | 'itemName' | 'category') => (
    <input id={fieldId(name)} className="input" aria-invalid={e(name) ? 'true' : 'false'} {...register(name)} />
  );
  return (
    <Section title="Study and item">
      <Field label="Study name" name="name" error={e('name')} hint="Only analysts and viewers see this name.">{input('name')}</Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Item name" name="itemName" error={e('itemName')} hint="Shown to respondents on every trial, e.g. “Ground coffee, 500 g”.">{input('itemName')}</Field>
        <Field label="Item category" name="category" error={e('category')}>{input('category')}</Field>
      </div>
      <PictureUpload form={form} slug={slug} />
      <div className="grid gap-4 sm:grid-cols-3">
        <LanguageField form={form} />
        <Field label="Currency" name="currency" error={e('currency')}>
          <select id={fieldId('currency')} className="input" {...register('currency')}>
            {CURRENCIES.map((c) => <option key={c}>{c}</option>)}
          </select>
        </Field>
        <Field label="Price format (locale)" name="locale" error={e('locale')} hint="Decimal mark and symbol position follow this locale.">
          <select id={fieldId('locale')} className="input" {...register('locale')}>
            {LOCALES.map((c) => <option key={c}>{c}</option>)}
          </select>
        </Field>
      </div>
    </Section>
  );
}
