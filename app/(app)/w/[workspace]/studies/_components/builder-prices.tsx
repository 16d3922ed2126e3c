'use client';
import { Controller } from 'react-hook-form';
import { errorAt, Section, type BuilderForm } from './form-bits';
import { StringList } from './string-list';
import { LadderEditor } from './ladder-editor';
import { LadderGrid } from './ladder-grid';

export function BuilderPrices({ form }: { form: BuilderForm }) {
  const errors = form.formState.errors;
  return (
    <>
      <Section title="Base prices" intro="The regular prices the item is shown at; each is tested on the whole ladder.">
        <Controller
          control={form.control}
          name="basePrices"
          render={({ field }) => (
            <StringList
              name="basePrices"
              label="Base price"
              values={((field.value as unknown[]) ?? []).map((v) => String(v ?? ''))}
              onChange={field.onChange}
              errorFor={(i) => errorAt(errors, `basePrices.${i}`)}
              listError={errorAt(errors, 'basePrices')}
              addLabel="Add a base price"
              max={12}
              inputMode="decimal"
              hint="Up to 12, each above zero and only once; use a point for decimals."
            />
          )}
        />
      </Section>
      <Section title="Discount ladder" intro="The discount depths (rungs) tested at each base price.">
        <LadderEditor form={form} />
      </Section>
      <Section title="Prices shoppers will see" intro="Each rung at each base price as the respondent’s screen shows it, after rounding to cents and the price ending.">
        <LadderGrid form={form} />
      </Section>
    </>
  );
}
