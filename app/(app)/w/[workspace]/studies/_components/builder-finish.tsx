'use client';
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
      </div>
      <Field label="Completion redirect URL (optional)" name="redirectUrl" error={e('redirectUrl')} hint="For panel vendors: respondents go here when done, with their panel id added as ?pid=. Leave empty to show a thank-you page.">
        <input id={fieldId('redirectUrl')} type="url" className="input" placeholder="https://panel.example/complete" {...register('redirectUrl')} />
      </Field>
    </Section>
  );
}
