'use client';
import { PRICE_ENDINGS, PRICE_ENDING_LABELS } from '@/lib/schemas/study.schema';
import { errorAt, Field, fieldId, Section, type BuilderForm } from './form-bits';

export function BuilderFinish({ form }: { form: BuilderForm }) {
  const { register, formState } = form;
  const e = (p: string) => errorAt(formState.errors, p);
  return (
    <Section title="Fieldwork">
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Target completes" name="targetCompletes" error={e('targetCompletes')} hint="Each complete uses one seat.">
          <input id={fieldId('targetCompletes')} type="number" className="input" {...register('targetCompletes')} />
        </Field>
        <Field label="Displayed-price ending" name="priceEnding" error={e('priceEnding')} hint="How test prices are rounded on screen, and how promo floors are rounded later.">
          <select id={fieldId('priceEnding')} className="input" {...register('priceEnding')}>
            {PRICE_ENDINGS.map((p) => <option key={p} value={p}>{PRICE_ENDING_LABELS[p]}</option>)}
          </select>
        </Field>
      </div>
      <Field label="Completion redirect URL (optional)" name="redirectUrl" error={e('redirectUrl')} hint="For panel vendors: respondents go here when done, with their panel id added as ?pid=. Leave empty to show a thank-you page.">
        <input id={fieldId('redirectUrl')} type="url" className="input" placeholder="https://panel.example/complete" {...register('redirectUrl')} />
      </Field>
    </Section>
  );
}
