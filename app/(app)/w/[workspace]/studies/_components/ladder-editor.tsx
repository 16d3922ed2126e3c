'use client';
import { useState } from 'react';
import { useWatch } from 'react-hook-form';
import { geometricLadder } from '@/lib/schemas/study.schema';
import { errorAt, fieldId, pct, type BuilderForm } from './form-bits';

/** "1, 2, 3.5" (percent) → fractions; a token that is not a number stays NaN so the schema names it. */
export function parseLadder(text: string): number[] {
  return text
    .split(/[,;\s]+/)
    .filter(Boolean)
    .map((t) => Math.round((Number(t.replace('%', '')) / 100) * 1e6) / 1e6);
}

export function LadderEditor({ form }: { form: BuilderForm }) {
  const ladder = (useWatch({ control: form.control, name: 'ladder' }) as unknown[]) ?? [];
  const [text, setText] = useState(() => ladder.map((d) => pct(Number(d))).join(', '));
  const [gen, setGen] = useState({ min: '1', max: '25', rungs: '8' });
  // A rung removed elsewhere (the ladder grid's fixes) shows in the text box too; typing that
  // parses to the same rungs is left as typed. (State adjusted while rendering, as React advises.)
  const key = (xs: unknown[]) => xs.map((d) => Number(d).toFixed(6)).join(',');
  const ladderKey = key(ladder);
  const [seenKey, setSeenKey] = useState(ladderKey);
  if (seenKey !== ladderKey) {
    setSeenKey(ladderKey);
    if (key(parseLadder(text)) !== ladderKey) setText(ladder.map((d) => pct(Number(d))).join(', '));
  }
  const generated = geometricLadder(Number(gen.min) / 100, Number(gen.max) / 100, Math.round(Number(gen.rungs)));
  const errors = form.formState.errors;
  const rungErrors = ladder.map((_, i) => errorAt(errors, `ladder.${i}`)).filter(Boolean);
  const listError = errorAt(errors, 'ladder') ?? rungErrors[0];

  const apply = (values: number[], asText?: string) => {
    form.setValue('ladder', values, { shouldDirty: true, shouldValidate: form.formState.isSubmitted });
    if (asText !== undefined) setText(asText);
  };
  return (
    <div className="space-y-3">
      <div className="field">
        <label htmlFor={fieldId('ladder')}>Discount ladder (%)</label>
        <input id={fieldId('ladder')} className="input num" value={text} aria-invalid={listError ? 'true' : 'false'} onChange={(e) => { setText(e.target.value); apply(parseLadder(e.target.value)); }} />
        {listError ? <span className="field-error" role="alert">{listError}</span> : <span className="hint">Depths in percent of the base price, separated by commas, e.g. 1, 2, 3, 5, 8, 12, 18, 25.</span>}
      </div>
      <div className="rounded-sm border border-rule bg-paper p-3">
        <p className="label mb-2">Or generate: geometric spacing between a minimum and maximum depth</p>
        <div className="flex flex-wrap items-end gap-3">
          {(['min', 'max', 'rungs'] as const).map((k) => (
            <div key={k} className="field w-28">
              <label htmlFor={`gen-${k}`}>{k === 'min' ? 'Minimum %' : k === 'max' ? 'Maximum %' : 'Rungs'}</label>
              <input id={`gen-${k}`} type="number" step="any" className="input" value={gen[k]} onChange={(e) => setGen({ ...gen, [k]: e.target.value })} />
            </div>
          ))}
          <button type="button" className="btn" disabled={generated.length < 2} onClick={() => apply(generated, generated.map(pct).join(', '))}>Use these rungs</button>
        </div>
        <p className="hint mt-2 num" data-testid="generated-rungs">
          {generated.length >= 2 ? generated.map((d) => `${pct(d)} %`).join(' · ') : 'Give 0 < minimum < maximum < 100 and at least 2 rungs.'}
        </p>
      </div>
    </div>
  );
}
